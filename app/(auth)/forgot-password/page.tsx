import type { Metadata } from "next";
import Link from "next/link";
import { ForgotPasswordForm } from "./forgot-password-form";

export const metadata: Metadata = { title: "Forgot password" };

export default function ForgotPasswordPage() {
  return (
    <>
      <h1 className="text-3xl font-semibold">Forgot your password?</h1>
      <p className="mb-8 mt-2 text-brine">Enter the e-mail you sign in with. We&apos;ll send a link to choose a new password.</p>
      <ForgotPasswordForm />
      <p className="mt-6 text-sm">
        <Link href="/sign-in" className="inline-flex min-h-touch items-center font-semibold text-paprika underline-offset-4 hover:underline">
          Back to sign in
        </Link>
      </p>
    </>
  );
}
