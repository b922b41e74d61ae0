"use client";

import type { UseFormRegister } from "react-hook-form";
import { PASSWORD_MIN_LENGTH } from "@/lib/domain/password-policy";
import { TextField } from "@/components/ui/field";

type PasswordPair = { password: string; confirmPassword: string };

// The "choose a password" pair used by the reset and invitation pages.
export function NewPasswordFields<T extends PasswordPair>({
  register,
  errors,
}: {
  register: UseFormRegister<T>;
  /** The message to show beneath each field, if any. */
  errors: { password?: string; confirmPassword?: string };
}) {
  // The generic register is narrowed to the two fields every caller's form has.
  const reg = register as unknown as UseFormRegister<PasswordPair>;
  return (
    <>
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        hint={`At least ${PASSWORD_MIN_LENGTH} characters. A short sentence is easy to remember and hard to guess.`}
        data-testid="new-password"
        errorTestId="new-password-error"
        error={errors.password}
        {...reg("password")}
      />
      <TextField
        label="Type it again"
        type="password"
        autoComplete="new-password"
        data-testid="confirm-password"
        errorTestId="confirm-password-error"
        error={errors.confirmPassword}
        {...reg("confirmPassword")}
      />
    </>
  );
}
