// Schemas for the invitation link page and the admin's invitation list.
import { z } from "zod";
import { tokenWithNewPasswordSchema } from "./auth-schemas";

export const acceptInvitationSchema = tokenWithNewPasswordSchema(
  "This invitation link is incomplete. Ask your admin for a new one.",
);
export type AcceptInvitationInput = z.infer<typeof acceptInvitationSchema>;

export const revokeInvitationSchema = z.object({
  invitationId: z.uuid("Choose an invitation."),
});
export type RevokeInvitationInput = z.infer<typeof revokeInvitationSchema>;
