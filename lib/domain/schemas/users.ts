// One schema per people-management use case, shared by the admin forms and the server actions.
import { z } from "../zod";
import { ROLES } from "../roles";
import { emailFieldSaying } from "./auth";
import { plainText } from "./text";

const roleField = z.enum(ROLES, { error: "Choose a role." });
// Ids are better-auth's: letters and digits. Anything else is not a person on this page.
const userIdField = z
  .string()
  .trim()
  .min(1, "Choose a person.")
  .max(64, "Choose a person.")
  .regex(/^[A-Za-z0-9_-]+$/, "Choose a person.");

export const inviteUserSchema = z.object({
  email: emailFieldSaying("Enter an e-mail address."),
  name: plainText().trim().min(1, "Enter the person's name.").max(120, "Use at most 120 characters."),
  role: roleField,
});
export type InviteUserInput = z.infer<typeof inviteUserSchema>;

export const setUserRoleSchema = z.object({ userId: userIdField, role: roleField });
export type SetUserRoleInput = z.infer<typeof setUserRoleSchema>;

export const deactivateUserSchema = z.object({ userId: userIdField });
export type DeactivateUserInput = z.infer<typeof deactivateUserSchema>;

export const reactivateUserSchema = z.object({ userId: userIdField });
export type ReactivateUserInput = z.infer<typeof reactivateUserSchema>;
