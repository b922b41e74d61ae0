// The invitation link page and the admin's invitation list: schemas, and what each state of a link
// tells the person holding it.
import { z } from "../zod";
import { tokenWithNewPasswordSchema } from "./auth";

export const acceptInvitationSchema = tokenWithNewPasswordSchema(
  "This invitation link is incomplete. Ask your admin for a new one.",
);
export type AcceptInvitationInput = z.infer<typeof acceptInvitationSchema>;

export const revokeInvitationSchema = z.object({
  invitationId: z.uuid("Choose an invitation."),
});
export type RevokeInvitationInput = z.infer<typeof revokeInvitationSchema>;

export type InvitationStatus = "valid" | "expired" | "used" | "revoked";

export const INVITATION_MESSAGES: Record<Exclude<InvitationStatus, "valid"> | "unknown", string> = {
  unknown: "This invitation link is not valid. Check that you copied all of it, or ask your admin for a new one.",
  expired: "This invitation has expired. Ask your admin to send a new one.",
  used: "This invitation has already been used. Sign in with your e-mail and password, or reset your password.",
  revoked: "This invitation was cancelled. Ask your admin for a new one if you still need access.",
};
