// Shared by the sign-in and password forms (react-hook-form's zodResolver) and the server.
// Not server-only on purpose: the browser validates with the very same rules.
import { z } from "../zod";
import { newPasswordField } from "../password-policy";
import { plainText } from "./text";

export { ACCOUNT_LOCKED_MESSAGE } from "../auth-messages";

/** The longest e-mail address SMTP can carry (RFC 5321's path limit less the angle brackets). */
export const EMAIL_MAX_LENGTH = 254;

/** An e-mail address; `emptyMessage` says whose it is ("your" on the sign-in forms, "an" for someone else's). */
export function emailFieldSaying(emptyMessage: string) {
  return plainText()
    .trim()
    .toLowerCase()
    .min(1, emptyMessage)
    .max(EMAIL_MAX_LENGTH, `An e-mail address has at most ${EMAIL_MAX_LENGTH} characters. Check what you typed.`)
    .pipe(z.email("Enter an e-mail address like name@firm.example."));
}

export const emailField = emailFieldSaying("Enter your e-mail address.");

/** The token of an e-mailed link: letters, digits, "-" and "_" only. */
export function linkTokenField(incompleteLinkMessage: string) {
  return z
    .string()
    .min(1, incompleteLinkMessage)
    .max(200, incompleteLinkMessage)
    .regex(/^[A-Za-z0-9_-]+$/, incompleteLinkMessage);
}

export const signInSchema = z.object({
  email: emailField,
  password: plainText("Passwords cannot hold control characters. Check what you typed.").pipe(
    z.string().min(1, "Enter your password."),
  ),
});
export type SignInInput = z.infer<typeof signInSchema>;

export const requestPasswordResetSchema = z.object({ email: emailField });
export type RequestPasswordResetInput = z.infer<typeof requestPasswordResetSchema>;

/** A token from an e-mailed link plus a new password typed twice: the reset and invitation forms. */
export function tokenWithNewPasswordSchema(incompleteLinkMessage: string) {
  return z
    .object({
      token: linkTokenField(incompleteLinkMessage),
      password: newPasswordField,
      confirmPassword: z.string(),
    })
    .refine((v) => v.password === v.confirmPassword, {
      path: ["confirmPassword"],
      message: "The two passwords differ.",
    });
}

export const resetPasswordSchema = tokenWithNewPasswordSchema("This reset link is incomplete. Ask for a new one.");
export type ResetPasswordInput = z.infer<typeof resetPasswordSchema>;
