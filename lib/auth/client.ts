"use client";
// better-auth's browser client for the sign-in, sign-out and password pages. Method names in 1.7.25
// (they follow the endpoint paths):
//   authClient.signIn.email({ email, password, callbackURL? })      POST /api/auth/sign-in/email
//   authClient.signOut()                                            POST /api/auth/sign-out
//   authClient.requestPasswordReset({ email, redirectTo? })         POST /api/auth/request-password-reset
//     (not `forgetPassword`; the e-mail links to /reset-password?token=… on our own page)
//   authClient.resetPassword({ newPassword, token })                POST /api/auth/reset-password
//   authClient.useSession()                                         GET  /api/auth/get-session
// Each returns { data, error }; error is { status, code?, message? }. Pass it to describeAuthError()
// for the sentence to show. Invitations are not here: they go through our own server actions.
import { createAuthClient } from "better-auth/react";
import { inferAdditionalFields } from "better-auth/client/plugins";
import { ACCOUNT_LOCKED_MESSAGE } from "@/lib/domain/auth-messages";
import type { Auth } from "./server";

export const authClient = createAuthClient({
  plugins: [inferAdditionalFields<Auth>()],
});

export type AuthClientError = { status?: number; code?: string; message?: string } | null | undefined;

const MESSAGES: Record<string, string> = {
  INVALID_EMAIL_OR_PASSWORD: "That e-mail and password do not match an account. Check both and try again.",
  INVALID_EMAIL: "Enter an e-mail address like name@firm.example.",
  PASSWORD_TOO_SHORT: "Use at least 10 characters.",
  PASSWORD_TOO_LONG: "Use at most 128 characters.",
  ACCOUNT_DEACTIVATED: "This account has been deactivated. Ask your admin to reactivate it.",
  INVALID_TOKEN: "This reset link is invalid, used or expired. Ask for a new one.",
  USER_NOT_FOUND: "This reset link is invalid, used or expired. Ask for a new one.",
  INVALID_ORIGIN: "This page's address does not match Gusset's. Reload and try again.",
  MISSING_OR_NULL_ORIGIN: "This page's address does not match Gusset's. Reload and try again.",
  ACCOUNT_LOCKED: ACCOUNT_LOCKED_MESSAGE,
};

/** A sentence for the person, whatever better-auth answered. */
export function describeAuthError(error: AuthClientError): string {
  if (!error) return "";
  if (error.code === "ACCOUNT_LOCKED") return MESSAGES.ACCOUNT_LOCKED;
  if (error.status === 429) return "Too many attempts. Wait a minute and try again.";
  if (error.status === 403 && !error.code) return "This page's address does not match Gusset's. Reload and try again.";
  if (error.code && MESSAGES[error.code]) return MESSAGES[error.code];
  return "Something went wrong. Try again; if it keeps happening, tell your admin.";
}
