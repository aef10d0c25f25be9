import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { getCurrentUser } from "@/lib/auth/session";
import { SignInForm } from "./sign-in-form";

export const metadata: Metadata = { title: "Sign in" };
export const dynamic = "force-dynamic";

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ next?: string }> }) {
  if (await getCurrentUser()) redirect("/stock");
  const { next } = await searchParams;
  return (
    <>
      <h1 className="text-3xl font-semibold">Sign in</h1>
      <p className="mb-8 mt-2 text-brine">Use the e-mail your admin invited.</p>
      <SignInForm next={next} />
    </>
  );
}
