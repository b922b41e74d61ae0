import type { Metadata } from "next";
import { TextLink } from "@/components/ui/text-link";
import { ForgotPasswordForm } from "./_components/forgot-password-form";

export const metadata: Metadata = { title: "Forgot password" };

export default function ForgotPasswordPage() {
  return (
    <>
      <h1 className="text-2xl font-semibold tracking-tight text-ink-950">Forgot your password?</h1>
      <p className="mt-2 mb-8 text-sm text-ink-500">
        Enter the e-mail you sign in with. We will send you a link to choose a new password.
      </p>
      <ForgotPasswordForm />
      <p className="mt-6 text-sm">
        <TextLink href="/sign-in">Back to sign in</TextLink>
      </p>
    </>
  );
}
