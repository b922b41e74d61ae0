import "server-only";
// Invitations: rows, their status, the token's hash and link, and the admin's list of open ones. Only
// the SHA-256 of a token is stored; the link carries the token. The use cases that create, accept and
// revoke them are in lib/use-cases/invitations.ts.
import { createHash, randomBytes } from "node:crypto";
import { and, desc, eq, gt, isNull, sql } from "drizzle-orm";
import { invitations } from "@/db/schema";
import type { Role } from "@/lib/domain/roles";
import type { InvitationStatus } from "@/lib/domain/schemas/invitations";
import { appBaseUrl } from "@/lib/server-env";
import { currentDb } from "./transaction";

export const INVITATION_LIFETIME_DAYS = 7;

export type InvitationDto = {
  id: string;
  email: string;
  name: string;
  role: Role;
  expiresAt: string;
  createdAt: string;
};

export type InvitationLookup = { email: string; name: string; role: Role; status: InvitationStatus; expiresAt: string };

export type InvitationRow = typeof invitations.$inferSelect;

export function toInvitationDto(row: InvitationRow): InvitationDto {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    role: row.role,
    expiresAt: row.expiresAt.toISOString(),
    createdAt: row.createdAt.toISOString(),
  };
}

export function invitationStatus(
  row: Pick<InvitationRow, "acceptedAt" | "revokedAt" | "expiresAt">,
  now = new Date(),
): InvitationStatus {
  if (row.acceptedAt) return "used";
  if (row.revokedAt) return "revoked";
  if (row.expiresAt <= now) return "expired";
  return "valid";
}

/** Invitations still open at `now`: not accepted, not withdrawn, not expired. */
export function pendingInvitationCondition(now = new Date()) {
  return and(isNull(invitations.acceptedAt), isNull(invitations.revokedAt), gt(invitations.expiresAt, now));
}

export function hashInvitationToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

export function newInvitationToken(): string {
  return randomBytes(32).toString("base64url");
}

export function getInvitationUrl(token: string): string {
  return `${appBaseUrl()}/invite/${token}`;
}

/** Anyone holding the link may see who it invites. Unknown tokens give null. */
export async function findInvitationByToken(token: string): Promise<InvitationLookup | null> {
  const [row] = await currentDb()
    .select()
    .from(invitations)
    .where(eq(invitations.tokenHash, hashInvitationToken(token)));
  if (!row) return null;
  return {
    email: row.email,
    name: row.name,
    role: row.role,
    status: invitationStatus(row),
    expiresAt: row.expiresAt.toISOString(),
  };
}

/** The row for a token, locked for the rest of the transaction. */
export async function lockInvitationByToken(token: string): Promise<InvitationRow | null> {
  const [row] = await currentDb()
    .select()
    .from(invitations)
    .where(eq(invitations.tokenHash, hashInvitationToken(token)))
    .for("update");
  return row ?? null;
}

export async function lockInvitationById(invitationId: string): Promise<InvitationRow | null> {
  const [row] = await currentDb().select().from(invitations).where(eq(invitations.id, invitationId)).for("update");
  return row ?? null;
}

/** Open invitations (not used, withdrawn or expired), newest first. */
export async function listPendingInvitations(): Promise<InvitationDto[]> {
  const rows = await currentDb()
    .select()
    .from(invitations)
    .where(pendingInvitationCondition())
    .orderBy(desc(invitations.createdAt));
  return rows.map(toInvitationDto);
}

export async function countPendingInvitations(): Promise<number> {
  const [row] = await currentDb()
    .select({ n: sql<number>`count(*)`.mapWith(Number) })
    .from(invitations)
    .where(pendingInvitationCondition());
  return row.n;
}

/** Withdraws the open invitations to an address (a newer one replaces them); returns their ids. */
export async function revokeOpenInvitationsTo(email: string, now: Date): Promise<string[]> {
  const replaced = await currentDb()
    .update(invitations)
    .set({ revokedAt: now })
    .where(and(eq(invitations.email, email), pendingInvitationCondition(now)))
    .returning({ id: invitations.id });
  return replaced.map((r) => r.id);
}

export async function insertInvitation(values: typeof invitations.$inferInsert): Promise<InvitationRow> {
  const [created] = await currentDb().insert(invitations).values(values).returning();
  return created;
}

export async function markInvitation(invitationId: string, set: { acceptedAt?: Date; revokedAt?: Date }): Promise<void> {
  await currentDb().update(invitations).set(set).where(eq(invitations.id, invitationId));
}
