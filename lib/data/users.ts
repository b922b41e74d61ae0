import "server-only";
// People: the admin's list, invitations, role changes, deactivation. Every change writes its audit
// event in the same transaction. The firm always keeps at least one active admin.
import { createHash, randomBytes } from "node:crypto";
import { and, asc, eq, gt, isNull, sql } from "drizzle-orm";
import { invitations, session, user } from "@/db/schema";
import { assertCanOrThrow, type Actor } from "@/lib/auth/actor";
import type { Role } from "@/lib/auth/roles";
import { AppError } from "@/lib/errors";
import { sendMail } from "@/lib/mail/send-mail";
import { renderInvitationMail } from "@/lib/mail/templates";
import { recordAuditEvent } from "./audit";
import { getFirmName } from "./firm";
import { currentDb, runInTransaction } from "./transaction";

export const INVITATION_LIFETIME_DAYS = 7;

export type UserDto = {
  id: string;
  name: string;
  email: string;
  role: Role;
  status: "active" | "deactivated";
  createdAt: string;
  deactivatedAt: string | null;
};

export type InvitationDto = {
  id: string;
  email: string;
  name: string;
  role: Role;
  expiresAt: string;
  createdAt: string;
};

const userColumns = {
  id: user.id,
  name: user.name,
  email: user.email,
  role: user.role,
  createdAt: user.createdAt,
  deactivatedAt: user.deactivatedAt,
};

function toUserDto(row: { id: string; name: string; email: string; role: Role; createdAt: Date; deactivatedAt: Date | null }): UserDto {
  return {
    id: row.id,
    name: row.name,
    email: row.email,
    role: row.role,
    status: row.deactivatedAt ? "deactivated" : "active",
    createdAt: row.createdAt.toISOString(),
    deactivatedAt: row.deactivatedAt?.toISOString() ?? null,
  };
}

export function toInvitationDto(row: {
  id: string;
  email: string;
  name: string;
  role: Role;
  expiresAt: Date;
  createdAt: Date;
}): InvitationDto {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    role: row.role,
    expiresAt: row.expiresAt.toISOString(),
    createdAt: row.createdAt.toISOString(),
  };
}

/** Invitations still open at `now`: not accepted, not withdrawn, not expired. */
export function pendingInvitationCondition(now = new Date()) {
  return and(isNull(invitations.acceptedAt), isNull(invitations.revokedAt), gt(invitations.expiresAt, now));
}

export function hashInvitationToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

export function getInvitationUrl(token: string): string {
  const base = (process.env.BETTER_AUTH_URL ?? "http://127.0.0.1:3000").replace(/\/+$/, "");
  return `${base}/invite/${token}`;
}

export async function listUsers({ actor }: { actor: Actor | null }): Promise<UserDto[]> {
  assertCanOrThrow(actor, "users.read");
  const rows = await currentDb().select(userColumns).from(user).orderBy(asc(user.name), asc(user.email));
  return rows.map(toUserDto);
}

async function getUserOrThrow(userId: string) {
  const [row] = await currentDb().select(userColumns).from(user).where(eq(user.id, userId));
  if (!row) throw new AppError("not-found", "That person no longer exists.");
  return row;
}

/**
 * Locks the active admins' rows for the rest of the transaction, so two admins demoting each other at
 * the same moment cannot leave the firm with none; then refuses if `userId` is the only one.
 */
async function assertNotLastActiveAdminOrThrow(userId: string, what: string): Promise<void> {
  const admins = await currentDb()
    .select({ id: user.id })
    .from(user)
    .where(and(eq(user.role, "admin"), isNull(user.deactivatedAt)))
    .for("update");
  if (admins.length === 1 && admins[0].id === userId) {
    throw new AppError(
      "conflict",
      `You cannot ${what} the last active admin. Make someone else an admin first, so the firm keeps one.`,
    );
  }
}

/** Changes one person's row and writes the audit event for it, inside the caller's transaction. */
async function updateUserWithAudit({
  actor,
  target,
  set,
  action,
  details,
}: {
  actor: Actor;
  target: { id: string; email: string };
  set: Partial<typeof user.$inferInsert>;
  action: string;
  details?: Record<string, unknown>;
}): Promise<UserDto> {
  const [updated] = await currentDb()
    .update(user)
    .set({ updatedAt: new Date(), ...set })
    .where(eq(user.id, target.id))
    .returning(userColumns);
  await recordAuditEvent({
    actorId: actor.id,
    actorEmail: actor.email,
    action,
    subject: `user:${target.id}`,
    details: { email: target.email, ...details },
  });
  return toUserDto(updated);
}

/**
 * Creates an invitation and e-mails its link. Earlier open invitations to the same address are revoked,
 * so only the newest link works. The e-mail is sent inside the transaction: if it cannot be sent, no
 * invitation is left behind that nobody received.
 */
export async function inviteUser({
  actor,
  email,
  name,
  role,
}: {
  actor: Actor | null;
  email: string;
  name: string;
  role: Role;
}): Promise<InvitationDto> {
  assertCanOrThrow(actor, "users.invite");
  const normalizedEmail = email.trim().toLowerCase();
  return runInTransaction(async (tx) => {
    const [existing] = await tx.select({ id: user.id }).from(user).where(eq(user.email, normalizedEmail));
    if (existing) {
      throw new AppError("conflict", `${normalizedEmail} already has an account. Change that person's role instead.`, {
        fieldErrors: { email: ["This e-mail address already has an account."] },
      });
    }
    const now = new Date();
    const replaced = await tx
      .update(invitations)
      .set({ revokedAt: now })
      .where(and(eq(invitations.email, normalizedEmail), pendingInvitationCondition(now)))
      .returning({ id: invitations.id });
    const token = randomBytes(32).toString("base64url");
    const expiresAt = new Date(now.getTime() + INVITATION_LIFETIME_DAYS * 24 * 60 * 60 * 1000);
    const [created] = await tx
      .insert(invitations)
      .values({ email: normalizedEmail, name: name.trim(), role, tokenHash: hashInvitationToken(token), invitedById: actor.id, expiresAt })
      .returning();
    await recordAuditEvent({
      actorId: actor.id,
      actorEmail: actor.email,
      action: "users.invite",
      subject: `invitation:${created.id}`,
      details: { email: normalizedEmail, role, replacedInvitations: replaced.map((r) => r.id) },
    });
    const mail = renderInvitationMail({
      to: normalizedEmail,
      name: created.name,
      role,
      invitedByName: actor.name,
      firmName: (await getFirmName()) ?? "your firm",
      url: getInvitationUrl(token),
      expiresAt,
    });
    try {
      await sendMail(mail);
    } catch (error) {
      console.error("[gusset] invitation e-mail not sent:", error);
      throw new AppError("internal", "The invitation e-mail could not be sent, so no invitation was made. Try again later.");
    }
    return toInvitationDto(created);
  });
}

export async function setUserRole({
  actor,
  userId,
  role,
}: {
  actor: Actor | null;
  userId: string;
  role: Role;
}): Promise<UserDto> {
  assertCanOrThrow(actor, "users.set-role");
  return runInTransaction(async () => {
    const target = await getUserOrThrow(userId);
    if (target.role === role) return toUserDto(target);
    if (target.role === "admin" && !target.deactivatedAt) await assertNotLastActiveAdminOrThrow(userId, "change the role of");
    return updateUserWithAudit({ actor, target, set: { role }, action: "users.set-role", details: { from: target.role, to: role } });
  });
}

/** Deactivation ends every open session of that person at once and blocks new sign-ins. */
export async function deactivateUser({ actor, userId }: { actor: Actor | null; userId: string }): Promise<UserDto> {
  assertCanOrThrow(actor, "users.deactivate");
  return runInTransaction(async (tx) => {
    const target = await getUserOrThrow(userId);
    if (target.deactivatedAt) throw new AppError("conflict", `${target.name} is already deactivated.`);
    if (target.role === "admin") await assertNotLastActiveAdminOrThrow(userId, "deactivate");
    // Same transaction as the row change, so the sessions end only if the deactivation commits.
    const ended = await tx.delete(session).where(eq(session.userId, userId)).returning({ id: session.id });
    const now = new Date();
    return updateUserWithAudit({
      actor,
      target,
      set: { deactivatedAt: now, updatedAt: now },
      action: "users.deactivate",
      details: { sessionsEnded: ended.length },
    });
  });
}

export async function reactivateUser({ actor, userId }: { actor: Actor | null; userId: string }): Promise<UserDto> {
  assertCanOrThrow(actor, "users.deactivate");
  return runInTransaction(async () => {
    const target = await getUserOrThrow(userId);
    if (!target.deactivatedAt) throw new AppError("conflict", `${target.name} is already active.`);
    return updateUserWithAudit({ actor, target, set: { deactivatedAt: null }, action: "users.reactivate" });
  });
}

/** Head counts for the home page and the people page. */
export async function countUsers({ actor }: { actor: Actor | null }): Promise<{ active: number; deactivated: number; admins: number }> {
  assertCanOrThrow(actor, "users.read");
  const [row] = await currentDb()
    .select({
      active: sql<number>`count(*) filter (where ${user.deactivatedAt} is null)`.mapWith(Number),
      deactivated: sql<number>`count(*) filter (where ${user.deactivatedAt} is not null)`.mapWith(Number),
      admins: sql<number>`count(*) filter (where ${user.deactivatedAt} is null and ${user.role} = 'admin')`.mapWith(Number),
    })
    .from(user);
  return row;
}
