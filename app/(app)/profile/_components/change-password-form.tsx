"use client";

import { startTransition, useActionState, useEffect } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { changePasswordSchema, type ChangePasswordInput } from "@/lib/domain/schemas/profile";
import { Button } from "@/components/ui/button";
import { TextField } from "@/components/ui/field";
import { FormError, Notice } from "@/components/ui/notice";
import { NewPasswordFields } from "@/components/new-password-fields";
import { actionErrors } from "@/components/action-errors";
import { changePasswordAction } from "../actions";

const FIELDS = ["currentPassword", "password", "confirmPassword"] as const;

export function ChangePasswordForm() {
  const [state, change, pending] = useActionState(changePasswordAction, null);
  const {
    register,
    handleSubmit,
    reset,
    formState: { errors },
  } = useForm<ChangePasswordInput>({
    resolver: zodResolver(changePasswordSchema),
    defaultValues: { currentPassword: "", password: "", confirmPassword: "" },
  });
  // A changed password clears the fields; a refused one keeps what was typed so it can be corrected.
  useEffect(() => {
    if (state?.ok) reset();
  }, [state, reset]);
  const server = actionErrors(state, FIELDS);
  const ended = state?.ok ? state.data.sessionsEnded : 0;

  return (
    <form
      noValidate
      className="max-w-sm space-y-5"
      data-testid="change-password-form"
      onSubmit={handleSubmit((values) => startTransition(() => change(values)))}
    >
      <FormError message={server.form} />
      {state?.ok ? (
        <Notice tone="pass" testId="password-changed">
          Your password has been changed.{" "}
          {ended === 0
            ? "You were not signed in anywhere else."
            : `You were signed out of ${ended} other ${ended === 1 ? "session" : "sessions"}.`}
        </Notice>
      ) : null}
      <TextField
        label="Current password"
        type="password"
        autoComplete="current-password"
        data-testid="current-password"
        errorTestId="current-password-error"
        error={errors.currentPassword?.message ?? server.field.currentPassword}
        {...register("currentPassword")}
      />
      <NewPasswordFields
        register={register}
        errors={{
          password: errors.password?.message ?? server.field.password,
          confirmPassword: errors.confirmPassword?.message ?? server.field.confirmPassword,
        }}
      />
      <Button type="submit" pending={pending} pendingLabel="Changing password…" data-testid="change-password-submit">
        Change password
      </Button>
    </form>
  );
}
