import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { CheckCircle2 } from "lucide-react";
import { homePath } from "@/lib/auth/home";
import { getCurrentUser } from "@/lib/auth/session";
import { SignInForm } from "./sign-in-form";

export const metadata: Metadata = { title: "Sign in" };
export const dynamic = "force-dynamic";

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ next?: string; reset?: string; joined?: string }> }) {
  const user = await getCurrentUser();
  if (user) redirect(homePath(user.role));
  const { next, reset, joined } = await searchParams;
  const note = reset === "1" ? "Your new password is saved. Sign in with it." : joined === "1" ? "Your account is ready. Sign in to start." : null;
  return (
    <>
      <h1 className="text-3xl font-semibold">Sign in</h1>
      <p className="mb-8 mt-2 text-brine">Use the e-mail your admin invited.</p>
      {note ? (
        <p role="status" className="mb-6 flex items-start gap-2 rounded-md border border-herb/30 bg-herb-soft px-3 py-2 text-sm font-medium text-herb">
          <CheckCircle2 aria-hidden className="mt-0.5 h-4 w-4 shrink-0" />
          <span>{note}</span>
        </p>
      ) : null}
      <SignInForm next={next} />
    </>
  );
}
