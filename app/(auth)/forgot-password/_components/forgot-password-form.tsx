"use client";

import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { authClient, describeAuthError } from "@/lib/auth/client";
import { requestPasswordResetSchema, type RequestPasswordResetInput } from "@/lib/domain/schemas/auth";
import { Button } from "@/components/ui/button";
import { EmailField } from "@/components/ui/field";
import { FormError, Notice } from "@/components/ui/notice";

export function ForgotPasswordForm() {
  const [sentTo, setSentTo] = useState<string | null>(null);
  const [serverError, setServerError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    formState: { errors, isSubmitting },
  } = useForm<RequestPasswordResetInput>({ resolver: zodResolver(requestPasswordResetSchema), defaultValues: { email: "" } });

  const onSubmit = handleSubmit(async ({ email }) => {
    setServerError(null);
    // The e-mailed link opens /reset-password?token=… (lib/auth/server.ts builds it); redirectTo is
    // kept for better-auth's own redirect endpoint, which lands on the same page.
    const { error } = await authClient.requestPasswordReset({ email, redirectTo: "/reset-password" });
    if (error) {
      setServerError(describeAuthError(error));
      return;
    }
    setSentTo(email);
  });

  if (sentTo) {
    // The same answer whether or not the address has an account, so the page cannot be used to
    // find out who works at the firm.
    return (
      <Notice tone="pass" title="Check your e-mail" testId="reset-requested">
        If <strong>{sentTo}</strong> belongs to a Gusset account, a link to choose a new password is on its way. The link works
        once and expires in one hour.
      </Notice>
    );
  }

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-5" data-testid="forgot-password-form">
      <FormError message={serverError} />
      <EmailField error={errors.email?.message} {...register("email")} />
      <Button
        type="submit"
        className="w-full"
        pending={isSubmitting}
        pendingLabel="Sending…"
        data-testid="forgot-password-submit"
      >
        Send me a reset link
      </Button>
    </form>
  );
}
