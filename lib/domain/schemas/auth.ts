// Shared by the sign-in and password forms (react-hook-form's zodResolver) and the server.
// Not server-only on purpose: the browser validates with the very same rules.
import { z } from "zod";
import { newPasswordField } from "../password-policy";

export const emailField = z
  .string()
  .trim()
  .toLowerCase()
  .min(1, "Enter your e-mail address.")
  .pipe(z.email("Enter an e-mail address like name@firm.example."));

export const signInSchema = z.object({
  email: emailField,
  password: z.string().min(1, "Enter your password."),
});
export type SignInInput = z.infer<typeof signInSchema>;

export const requestPasswordResetSchema = z.object({ email: emailField });
export type RequestPasswordResetInput = z.infer<typeof requestPasswordResetSchema>;

/** A token from an e-mailed link plus a new password typed twice: the reset and invitation forms. */
export function tokenWithNewPasswordSchema(incompleteLinkMessage: string) {
  return z
    .object({
      token: z.string().min(1, incompleteLinkMessage),
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
