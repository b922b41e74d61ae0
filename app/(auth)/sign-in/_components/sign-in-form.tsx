"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { authClient, describeAuthError } from "@/lib/auth/client";
import { PASSWORD_MIN_LENGTH } from "@/lib/domain/password-policy";
import { signInSchema, type SignInInput } from "@/lib/domain/schemas/auth";
import { Button } from "@/components/ui/button";
import { EmailField, TextField } from "@/components/ui/field";
import { FormError, Notice } from "@/components/ui/notice";
import { TextLink } from "@/components/ui/text-link";

// No Gusset account can have a password shorter than PASSWORD_MIN_LENGTH, so a shorter one is a
// typing slip: say so here rather than spend one of the rate-limited sign-in attempts on it.
const signInFormSchema = signInSchema.extend({
  password: signInSchema.shape.password.pipe(
    z
      .string()
      .min(PASSWORD_MIN_LENGTH, `Gusset passwords have at least ${PASSWORD_MIN_LENGTH} characters. Check what you typed.`),
  ),
});

export function SignInForm({ next, notice }: { next: string; notice?: string }) {
  const router = useRouter();
  const [serverError, setServerError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    formState: { errors, isSubmitting },
  } = useForm<SignInInput>({ resolver: zodResolver(signInFormSchema), defaultValues: { email: "", password: "" } });

  // The schema stops a malformed e-mail or a too-short password before anything is sent; the server
  // answers the rest (wrong password, unknown e-mail, deactivated account, too many attempts).
  const onSubmit = handleSubmit(async ({ email, password }) => {
    setServerError(null);
    const { error } = await authClient.signIn.email({ email, password });
    if (error) {
      setServerError(describeAuthError(error));
      return;
    }
    router.replace(next);
    router.refresh();
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-5" data-testid="sign-in-form">
      {notice && !serverError ? (
        <Notice tone="info" testId="form-notice">
          {notice}
        </Notice>
      ) : null}
      <FormError message={serverError} />
      {/* The one thing to do on this page: start typing (the e-mail field is the page's first field). */}
      <EmailField autoFocus error={errors.email?.message} {...register("email")} />
      <div>
        <TextField
          label="Password"
          type="password"
          autoComplete="current-password"
          data-testid="password"
          errorTestId="password-error"
          error={errors.password?.message}
          {...register("password")}
        />
        <p className="mt-2 text-right text-sm">
          <TextLink href="/forgot-password" testId="forgot-password-link">
            Forgot your password?
          </TextLink>
        </p>
      </div>
      <Button type="submit" className="w-full" pending={isSubmitting} pendingLabel="Signing in…" data-testid="sign-in-submit">
        Sign in
      </Button>
    </form>
  );
}
