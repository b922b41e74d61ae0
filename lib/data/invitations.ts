import "server-only";
// The invitation link: look it up, accept it (set a password, become a user, sign in), and the
// admin's list of open invitations. Only the SHA-256 of a token is stored; the link carries the token.
import { desc, eq, sql } from "drizzle-orm";
import { generateId } from "better-auth";
import { account, invitations, user } from "@/db/schema";
import { assertCanOrThrow, type Actor } from "@/lib/auth/actor";
import type { Role } from "@/lib/auth/roles";
import { auth } from "@/lib/auth/server";
import { AppError } from "@/lib/errors";
import { recordAuditEvent } from "./audit";
import { PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from "./auth-schemas";
import { currentDb, runAfterCommit, runInTransaction } from "./transaction";
import { hashInvitationToken, pendingInvitationCondition, toInvitationDto, type InvitationDto } from "./users";

export type InvitationStatus = "valid" | "expired" | "used" | "revoked";

export type InvitationLookup = { email: string; name: string; role: Role; status: InvitationStatus; expiresAt: string };

export const INVITATION_MESSAGES: Record<Exclude<InvitationStatus, "valid"> | "unknown", string> = {
  unknown: "This invitation link is not valid. Check that you copied all of it, or ask your admin for a new one.",
  expired: "This invitation has expired. Ask your admin to send a new one.",
  used: "This invitation has already been used. Sign in with your e-mail and password, or reset your password.",
  revoked: "This invitation was withdrawn. Ask your admin for a new one if you still need access.",
};

function statusOf(row: { acceptedAt: Date | null; revokedAt: Date | null; expiresAt: Date }, now = new Date()): InvitationStatus {
  if (row.acceptedAt) return "used";
  if (row.revokedAt) return "revoked";
  if (row.expiresAt <= now) return "expired";
  return "valid";
}

/** Public: anyone holding the link may see who it invites. Unknown tokens give null. */
export async function getInvitationByToken({ token }: { token: string }): Promise<InvitationLookup | null> {
  const [row] = await currentDb().select().from(invitations).where(eq(invitations.tokenHash, hashInvitationToken(token)));
  if (!row) return null;
  return { email: row.email, name: row.name, role: row.role, status: statusOf(row), expiresAt: row.expiresAt.toISOString() };
}

/**
 * Creates the user and their password login from a valid invitation and marks it used, all in one
 * transaction; an unknown, expired, used or withdrawn link changes nothing. With `signIn`, the new user
 * is signed in once the rows are committed (better-auth reads them over its own connection), and under
 * a Next request nextCookies() sets the session cookie.
 */
export async function acceptInvitation({
  token,
  password,
  signIn,
}: {
  token: string;
  password: string;
  signIn?: { headers: Headers };
}): Promise<{ userId: string; email: string }> {
  if (password.length < PASSWORD_MIN_LENGTH || password.length > PASSWORD_MAX_LENGTH) {
    throw new AppError("invalid-input", `Use between ${PASSWORD_MIN_LENGTH} and ${PASSWORD_MAX_LENGTH} characters.`, {
      fieldErrors: { password: [`Use at least ${PASSWORD_MIN_LENGTH} characters.`] },
    });
  }
  const accepted = await runInTransaction(async (tx) => {
    const [invitation] = await tx
      .select()
      .from(invitations)
      .where(eq(invitations.tokenHash, hashInvitationToken(token)))
      .for("update");
    if (!invitation) throw new AppError("not-found", INVITATION_MESSAGES.unknown);
    const status = statusOf(invitation);
    if (status !== "valid") throw new AppError("conflict", INVITATION_MESSAGES[status]);
    const [existing] = await tx.select({ id: user.id }).from(user).where(eq(user.email, invitation.email));
    if (existing) throw new AppError("conflict", INVITATION_MESSAGES.used);

    // better-auth's own hasher, so its sign-in can verify the password.
    const passwordHash = await (await auth.$context).password.hash(password);
    const userId = generateId();
    const now = new Date();
    await tx.insert(user).values({
      id: userId,
      name: invitation.name,
      email: invitation.email,
      emailVerified: true, // the link arrived at this address
      role: invitation.role,
      createdAt: now,
      updatedAt: now,
    });
    await tx.insert(account).values({
      id: generateId(),
      accountId: userId,
      providerId: "credential",
      userId,
      password: passwordHash,
      createdAt: now,
      updatedAt: now,
    });
    await tx.update(invitations).set({ acceptedAt: now }).where(eq(invitations.id, invitation.id));
    await recordAuditEvent({
      actorId: userId,
      actorEmail: invitation.email,
      action: "invitations.accept",
      subject: `invitation:${invitation.id}`,
      details: { role: invitation.role, invitedById: invitation.invitedById },
    });
    return { userId, email: invitation.email };
  });
  if (signIn) {
    await runAfterCommit(async () => {
      await auth.api.signInEmail({ body: { email: accepted.email, password }, headers: signIn.headers });
    });
  }
  return accepted;
}

/** Open invitations (not used, withdrawn or expired), newest first. */
export async function listPendingInvitations({ actor }: { actor: Actor | null }): Promise<InvitationDto[]> {
  assertCanOrThrow(actor, "users.read");
  const rows = await currentDb()
    .select()
    .from(invitations)
    .where(pendingInvitationCondition())
    .orderBy(desc(invitations.createdAt));
  return rows.map((row) => toInvitationDto(row));
}

export async function countPendingInvitations({ actor }: { actor: Actor | null }): Promise<number> {
  assertCanOrThrow(actor, "users.read");
  const [row] = await currentDb()
    .select({ n: sql<number>`count(*)`.mapWith(Number) })
    .from(invitations)
    .where(pendingInvitationCondition());
  return row.n;
}

export async function revokeInvitation({
  actor,
  invitationId,
}: {
  actor: Actor | null;
  invitationId: string;
}): Promise<{ id: string; email: string }> {
  assertCanOrThrow(actor, "users.invite");
  return runInTransaction(async (tx) => {
    const [row] = await tx.select().from(invitations).where(eq(invitations.id, invitationId)).for("update");
    if (!row) throw new AppError("not-found", "That invitation no longer exists.");
    const status = statusOf(row);
    if (status !== "valid") throw new AppError("conflict", `That invitation is already ${status}.`);
    await tx.update(invitations).set({ revokedAt: new Date() }).where(eq(invitations.id, invitationId));
    await recordAuditEvent({
      actorId: actor.id,
      actorEmail: actor.email,
      action: "invitations.revoke",
      subject: `invitation:${invitationId}`,
      details: { email: row.email, role: row.role },
    });
    return { id: row.id, email: row.email };
  });
}
