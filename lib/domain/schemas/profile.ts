// The profile page's forms: a password change and a time zone. Shared by the forms and the server.
import { z } from "../zod";
import { newPasswordField } from "../password-policy";
import { plainText } from "./text";

export const WRONG_CURRENT_PASSWORD_MESSAGE = "That is not your current password. Check what you typed and try again.";

export const changePasswordSchema = z
  .object({
    currentPassword: plainText("Passwords cannot hold control characters. Check what you typed.").pipe(
      z.string().min(1, "Enter your current password.").max(256, "That is not your current password. Check what you typed."),
    ),
    password: newPasswordField,
    confirmPassword: z.string(),
  })
  .refine((v) => v.password === v.confirmPassword, { path: ["confirmPassword"], message: "The two passwords differ." })
  .refine((v) => v.password !== v.currentPassword, {
    path: ["password"],
    message: "Choose a password different from your current one.",
  });
export type ChangePasswordInput = z.infer<typeof changePasswordSchema>;

/** "UTC" and every IANA zone this runtime knows (Intl.supportedValuesOf leaves "UTC" itself out). */
export function supportedTimeZones(): string[] {
  return ["UTC", ...Intl.supportedValuesOf("timeZone").filter((zone) => zone !== "UTC")];
}

/** "" (or nothing) means the browser's own time zone, stored as null. */
export const setTimeZoneSchema = z.object({
  timeZone: z
    .string()
    .trim()
    .max(64, "Choose a time zone from the list.")
    .optional()
    .transform((value) => (value ? value : null))
    .refine((value) => value === null || supportedTimeZones().includes(value), "Choose a time zone from the list."),
});
export type SetTimeZoneInput = z.input<typeof setTimeZoneSchema>;

/** How the person reads results: SI, or US customary (converted for display; records stay in SI). */
export const setDisplayUnitsSchema = z.object({
  displayUnits: z.enum(["si", "us"], "Choose SI or US customary units."),
});
