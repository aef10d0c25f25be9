import type { Metadata } from "next";
import Link from "next/link";
import { ResetPasswordForm } from "./reset-password-form";

export const metadata: Metadata = { title: "Choose a new password", robots: { index: false } };

export default async function ResetPasswordPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
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
