import type { Metadata } from "next";
import Link from "next/link";
import { FormMessage } from "@/components/ui/field";
import { checkPasswordResetToken } from "@/lib/data/password-resets";
import { AppError } from "@/lib/http/errors";
import { ResetPasswordForm } from "./reset-password-form";

export const metadata: Metadata = { title: "Choose a new password", robots: { index: false } };
export const dynamic = "force-dynamic";

/** The link's problem in the person's words, or null when it still works. */
async function linkProblem(token: string): Promise<string | null> {
  try {
    await checkPasswordResetToken(token);
    return null;
  } catch (e) {
    if (!(e instanceof AppError) || (e.status !== 404 && e.status !== 409)) throw e;
    return e.status === 404 ? "We can't find this reset link. Check that the whole link was copied from the e-mail." : e.message;
  }
}

export default async function ResetPasswordPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const problem = await linkProblem(token);
  if (problem) {
    return (
      <>
        <h1 className="text-3xl font-semibold">This reset link doesn't work</h1>
        <div className="mb-8 mt-4"><FormMessage tone="error">{problem}</FormMessage></div>
        <Link href="/forgot-password" className="btn-primary w-full">Ask for a new link</Link>
      </>
    );
  }
  return (
    <>
      <h1 className="text-3xl font-semibold">Choose a new password</h1>
      <p className="mb-8 mt-2 text-brine">After saving, sign in with it. Other devices signed in to your account are signed out.</p>
      <ResetPasswordForm token={token} />
      <p className="mt-6 text-sm">
        <Link href="/sign-in" className="inline-flex min-h-touch items-center font-semibold text-paprika underline-offset-4 hover:underline">
          Back to sign in
        </Link>
      </p>
    </>
  );
}
