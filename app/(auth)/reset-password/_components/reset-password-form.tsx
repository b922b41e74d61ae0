"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { authClient, describeAuthError } from "@/lib/auth/client";
import { resetPasswordSchema, type ResetPasswordInput } from "@/lib/domain/schemas/auth";
import { Button } from "@/components/ui/button";
import { FormError } from "@/components/ui/notice";
import { NewPasswordFields } from "@/components/new-password-fields";

export function ResetPasswordForm({ token }: { token: string }) {
  const router = useRouter();
  const [serverError, setServerError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    formState: { errors, isSubmitting },
  } = useForm<ResetPasswordInput>({
    resolver: zodResolver(resetPasswordSchema),
    defaultValues: { token, password: "", confirmPassword: "" },
  });

  const onSubmit = handleSubmit(async ({ token: value, password }) => {
    setServerError(null);
    const { error } = await authClient.resetPassword({ token: value, newPassword: password });
    if (error) {
      setServerError(describeAuthError(error));
      return;
    }
    router.replace("/sign-in?notice=password-reset");
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-5" data-testid="reset-password-form">
      <FormError message={serverError ?? errors.token?.message} />
      <input type="hidden" {...register("token")} />
      <NewPasswordFields
        register={register}
        errors={{ password: errors.password?.message, confirmPassword: errors.confirmPassword?.message }}
      />
      <Button type="submit" className="w-full" pending={isSubmitting} pendingLabel="Saving…" data-testid="reset-password-submit">
        Set new password
      </Button>
    </form>
  );
}
