import "server-only";
// The invitation link, which is its own credential (so these use cases are public): look it up, and
// accept it — set a password and become a user, in one transaction; an unknown, expired, used or
// withdrawn link changes nothing. Signing the new person in happens after the commit (the action's
// `then`), because better-auth reads the new rows over its own connection.
import { z } from "zod";
import { createCredentialUser } from "@/db/credentials";
import { AppError } from "@/lib/domain/errors";
import { INVITATION_MESSAGES, acceptInvitationSchema } from "@/lib/domain/schemas/invitations";
import {
  findInvitationByToken,
  invitationStatus,
  lockInvitationByToken,
  markInvitation,
  type InvitationLookup,
} from "@/lib/data/invitations";
import { userExistsWithEmail } from "@/lib/data/users";
import { defineUseCase } from "./use-case";

export const lookupInvitation = defineUseCase({
  name: "invitations.lookup",
  permission: "public",
  input: z.object({ token: z.string() }),
  run: async ({ token }): Promise<InvitationLookup | null> => findInvitationByToken(token),
  audit: null,
});

export const acceptInvitation = defineUseCase({
  name: "invitations.accept",
  permission: "public",
  input: acceptInvitationSchema,
  run: async ({ token, password }, { tx }) => {
    const invitation = await lockInvitationByToken(token);
    if (!invitation) throw new AppError("not-found", INVITATION_MESSAGES.unknown);
    const status = invitationStatus(invitation);
    if (status !== "valid") throw new AppError("conflict", INVITATION_MESSAGES[status]);
    if (await userExistsWithEmail(invitation.email)) throw new AppError("conflict", INVITATION_MESSAGES.used);
    const { id: userId } = await createCredentialUser(tx, {
      name: invitation.name,
      email: invitation.email,
      role: invitation.role,
      password,
      emailVerified: true, // the link arrived at this address
    });
    await markInvitation(invitation.id, { acceptedAt: new Date() });
    return {
      userId,
      email: invitation.email,
      invitationId: invitation.id,
      role: invitation.role,
      invitedById: invitation.invitedById,
    };
  },
  // A link that is unknown, expired, used or withdrawn, or a password the rules refuse: the attempt is
  // kept, without the token (it is a credential).
  auditFailure: ({ error }) => ({
    action: "invitations.accept.failed",
    subject: null,
    details: { reason: error.code, message: error.message },
  }),
  // The new person is the actor: nobody was signed in when the link was used.
  audit: ({ result }) => ({
    action: "invitations.accept",
    actorId: result.userId,
    actorEmail: result.email,
    subject: `invitation:${result.invitationId}`,
    details: { role: result.role, invitedById: result.invitedById },
  }),
});
