import "server-only";
// Ending a person's sessions on purpose, and remembering why. Deactivation and a password change end
// sessions; the browser that still holds an ended session's cookie is then told why on the sign-in page
// (lib/auth/session.ts) instead of meeting a plain sign-in form. Only a hash of each token is kept.
import { createHash } from "node:crypto";
import { and, eq, gt, lt, ne, sql } from "drizzle-orm";
import { endedSession, session, user } from "@/db/schema";
import { prepared } from "./prepared";
import { currentDb } from "./transaction";

export type SessionEndReason = (typeof endedSession.$inferInsert)["reason"];

export function hashSessionToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

/**
 * Ends every open session of `userId` except `keepSessionId` (the one asking, when it is their own
 * change) and records `reason` for each; returns how many were ended.
 */
export async function endSessions({
  userId,
  reason,
  keepSessionId,
}: {
  userId: string;
  reason: SessionEndReason;
  keepSessionId?: string;
}): Promise<number> {
  const now = new Date();
  const ended = await currentDb()
    .delete(session)
    .where(and(eq(session.userId, userId), keepSessionId ? ne(session.id, keepSessionId) : undefined))
    .returning({ token: session.token, expiresAt: session.expiresAt });
  // Housekeeping: reasons for sessions that would have expired by now tell nobody anything.
  await currentDb().delete(endedSession).where(lt(endedSession.expiresAt, now));
  const live = ended.filter((row) => row.expiresAt > now);
  if (live.length > 0) {
    await currentDb()
      .insert(endedSession)
      .values(
        live.map((row) => ({ tokenHash: hashSessionToken(row.token), userId, reason, endedAt: now, expiresAt: row.expiresAt })),
      )
      .onConflictDoNothing();
  }
  return ended.length;
}

/**
 * Why the session with this token was ended, if it was ended on purpose and would still be open.
 * "deactivated" only while the account still is: after a reactivation the old cookie is just signed out.
 */
export async function findSessionEndReason(token: string): Promise<SessionEndReason | null> {
  const [row] = await currentDb()
    .select({ reason: endedSession.reason, deactivatedAt: user.deactivatedAt })
    .from(endedSession)
    .innerJoin(user, eq(user.id, endedSession.userId))
    .where(and(eq(endedSession.tokenHash, hashSessionToken(token)), gt(endedSession.expiresAt, new Date())));
  if (!row) return null;
  if (row.reason === "deactivated" && row.deactivatedAt === null) return null;
  return row.reason;
}

/** A session row by its token, with its person's role and state: the one query a signed-in request's check needs. */
// Prepared: every signed-in request reads it.
const sessionWithUser = prepared("gusset_session_with_user", (executor) =>
  executor
    .select({
      sessionId: session.id,
      expiresAt: session.expiresAt,
      userId: user.id,
      name: user.name,
      email: user.email,
      role: user.role,
      deactivatedAt: user.deactivatedAt,
    })
    .from(session)
    .innerJoin(user, eq(user.id, session.userId))
    .where(eq(session.token, sql.placeholder("token"))),
);

export async function findSessionWithUser(token: string) {
  const [row] = await sessionWithUser({ token });
  return row ?? null;
}
