import "server-only";
// People management: the admin's list, invitations, role changes, deactivation. Each use case states its
// permission, input and audit event here; the runner (./run.ts) enforces them. Invitation e-mails are
// queued in the same transaction and sent by the worker after the commit.
import { z } from "zod";
import { AppError } from "@/lib/domain/errors";
import type { Role } from "@/lib/domain/roles";
import { deactivateUserSchema, inviteUserSchema, reactivateUserSchema, setUserRoleSchema } from "@/lib/domain/schemas/users";
import { revokeInvitationSchema } from "@/lib/domain/schemas/invitations";
import { getFirmName } from "@/lib/data/firm";
import {
  INVITATION_LIFETIME_DAYS,
  getInvitationUrl,
  hashInvitationToken,
  insertInvitation,
  invitationStatus,
  listPendingInvitations,
  lockInvitationById,
  markInvitation,
  newInvitationToken,
  revokeOpenInvitationsTo,
  toInvitationDto,
  type InvitationDto,
} from "@/lib/data/invitations";
import {
  assertNotLastActiveAdminOrThrow,
  getUserOrThrow,
  listUsers,
  updateUser,
  userExistsWithEmail,
  type UserDto,
} from "@/lib/data/users";
import { endSessions } from "@/lib/data/sessions";
import { enqueueJob } from "@/lib/jobs/enqueue";
import { renderInvitationMail } from "@/lib/mail/templates";
import { defineUseCase } from "./use-case";

const noInput = z.object({}).default({});

export const listPeople = defineUseCase({
  name: "people.list",
  permission: "users.read",
  input: noInput,
  run: async (): Promise<{ people: UserDto[]; invitations: InvitationDto[] }> => {
    // One after another: the queries share the transaction's one connection.
    const people = await listUsers();
    return { people, invitations: await listPendingInvitations() };
  },
  audit: null,
});

/**
 * Creates an invitation and queues its e-mail. Earlier open invitations to the same address are revoked,
 * so only the newest link works; the result says how many were replaced.
 */
export const inviteUser = defineUseCase({
  name: "users.invite",
  permission: "users.invite",
  input: inviteUserSchema,
  run: async ({ email, name, role }, { actor }): Promise<InvitationDto & { replacedInvitations: string[] }> => {
    if (await userExistsWithEmail(email)) {
      throw new AppError("conflict", `${email} already has an account. Change that person's role instead.`, {
        fieldErrors: { email: ["This e-mail address already has an account."] },
      });
    }
    const now = new Date();
    const replacedInvitations = await revokeOpenInvitationsTo(email, now);
    const token = newInvitationToken();
    const expiresAt = new Date(now.getTime() + INVITATION_LIFETIME_DAYS * 24 * 60 * 60 * 1000);
    const created = await insertInvitation({
      email,
      name: name.trim(),
      role,
      tokenHash: hashInvitationToken(token),
      invitedById: actor.id,
      expiresAt,
    });
    await enqueueJob(
      "mail.send",
      renderInvitationMail({
        to: email,
        name: created.name,
        role,
        invitedByName: actor.name,
        firmName: (await getFirmName()) ?? "your firm",
        url: getInvitationUrl(token),
        expiresAt,
      }),
    );
    return { ...toInvitationDto(created), replacedInvitations };
  },
  audit: ({ result }) => ({
    action: "users.invite",
    subject: `invitation:${result.id}`,
    details: { email: result.email, role: result.role, replacedInvitations: result.replacedInvitations },
  }),
});

export const setUserRole = defineUseCase({
  name: "users.set-role",
  permission: "users.set-role",
  input: setUserRoleSchema,
  run: async ({ userId, role }): Promise<{ user: UserDto; previousRole: Role }> => {
    const target = await getUserOrThrow(userId);
    if (target.role === role) return { user: target, previousRole: target.role };
    if (target.role === "admin" && target.status === "active")
      await assertNotLastActiveAdminOrThrow(userId, "change the role of");
    return { user: await updateUser(userId, { role }), previousRole: target.role };
  },
  // Setting the role a person already has changes nothing and is not an event.
  audit: ({ result: { user, previousRole } }) =>
    user.role === previousRole
      ? null
      : {
          action: "users.set-role",
          subject: `user:${user.id}`,
          details: { email: user.email, from: previousRole, to: user.role },
        },
});

/**
 * Deactivation ends every open session of that person in the same transaction and blocks new sign-ins;
 * a browser still holding one of those sessions is told why on the sign-in page.
 */
export const deactivateUser = defineUseCase({
  name: "users.deactivate",
  permission: "users.deactivate",
  input: deactivateUserSchema,
  run: async ({ userId }): Promise<{ user: UserDto; sessionsEnded: number }> => {
    const target = await getUserOrThrow(userId);
    if (target.status === "deactivated") throw new AppError("conflict", `${target.name} is already deactivated.`);
    if (target.role === "admin") await assertNotLastActiveAdminOrThrow(userId, "deactivate");
    const sessionsEnded = await endSessions({ userId, reason: "deactivated" });
    return { user: await updateUser(userId, { deactivatedAt: new Date() }), sessionsEnded };
  },
  audit: ({ result: { user, sessionsEnded } }) => ({
    action: "users.deactivate",
    subject: `user:${user.id}`,
    details: { email: user.email, sessionsEnded },
  }),
});

export const reactivateUser = defineUseCase({
  name: "users.reactivate",
  permission: "users.deactivate",
  input: reactivateUserSchema,
  run: async ({ userId }): Promise<UserDto> => {
    const target = await getUserOrThrow(userId);
    if (target.status === "active") throw new AppError("conflict", `${target.name} is already active.`);
    return updateUser(userId, { deactivatedAt: null });
  },
  audit: ({ result }) => ({ action: "users.reactivate", subject: `user:${result.id}`, details: { email: result.email } }),
});

export const revokeInvitation = defineUseCase({
  name: "invitations.revoke",
  permission: "users.invite",
  input: revokeInvitationSchema,
  run: async ({ invitationId }): Promise<InvitationDto> => {
    const row = await lockInvitationById(invitationId);
    if (!row) throw new AppError("not-found", "That invitation no longer exists.");
    const status = invitationStatus(row);
    // Said in the page's words: an admin "cancels" an invitation (the data calls it revoked).
    const said = { revoked: "cancelled", used: "accepted", expired: "expired" } as const;
    if (status !== "valid") throw new AppError("conflict", `That invitation was already ${said[status]}.`);
    await markInvitation(invitationId, { revokedAt: new Date() });
    return toInvitationDto(row);
  },
  audit: ({ result }) => ({
    action: "invitations.revoke",
    subject: `invitation:${result.id}`,
    details: { email: result.email, role: result.role },
  }),
});
