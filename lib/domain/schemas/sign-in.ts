// Why someone was sent to the sign-in page, carried as ?reason= (lib/auth/session.ts sets it). Only these
// keys are read, each with a fixed message, so the page never shows text from its address.
import { z } from "../zod";

export const SIGN_IN_REASONS = {
  deactivated: {
    title: "This account has been deactivated",
    message:
      "An administrator of your firm deactivated this account, so you were signed out. If you still need Gusset, ask one of your firm's admins to reactivate it.",
  },
  "password-changed": {
    title: "Your password was changed",
    message:
      "The password of this account was changed in another session, so you were signed out here. Sign in with the new password.",
  },
} as const;

export type SignInReason = keyof typeof SIGN_IN_REASONS;

export const signInReasonSchema = z.enum(Object.keys(SIGN_IN_REASONS) as [SignInReason, ...SignInReason[]]);

/** The reason named by a ?reason= value, or null for anything else (absent, unknown, repeated). */
export function readSignInReason(value: unknown): SignInReason | null {
  const parsed = signInReasonSchema.safeParse(value);
  return parsed.success ? parsed.data : null;
}
