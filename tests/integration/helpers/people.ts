// Test people: each test makes its own users with unique e-mails, so tests do not depend on each
// other's order or on the seeded demo users (which exist in the test database too).
import { randomBytes } from "node:crypto";
import { generateId } from "better-auth";
import { hashPassword } from "better-auth/crypto";
import { count, eq, sql } from "drizzle-orm";
import { db } from "@/db";
import * as schema from "@/db/schema";
import type { Actor } from "@/lib/domain/actor";
import type { Role } from "@/lib/domain/roles";
import { auth } from "@/lib/auth/server";
import { inviteUser } from "@/lib/use-cases/people";
import { runUseCase } from "@/lib/use-cases/run";
import { firstLink, waitForMessage } from "../../support/mailbox";

export const TEST_PASSWORD = "correct-horse-battery-staple";

export function uniqueEmail(label: string): string {
  return `${label}-${randomBytes(5).toString("hex")}@test.gusset.example`;
}

/** A random address from the documentation range, so each test has its own rate-limit bucket. */
export function uniqueIp(): string {
  const [a, b] = randomBytes(2);
  return `198.51.${a}.${b === 0 ? 1 : b}`;
}

// scrypt is slow on purpose; one hash per distinct password is enough for test users.
const hashes = new Map<string, Promise<string>>();
function hashOnce(password: string): Promise<string> {
  if (!hashes.has(password)) hashes.set(password, hashPassword(password));
  return hashes.get(password)!;
}

export async function createTestUser({
  role,
  label = role,
  password = TEST_PASSWORD,
  deactivated = false,
}: {
  role: Role;
  label?: string;
  password?: string;
  deactivated?: boolean;
}): Promise<{ actor: Actor; password: string }> {
  const id = generateId();
  const email = uniqueEmail(label);
  const name = `Test ${label} ${id.slice(0, 4)}`;
  await db
    .insert(schema.user)
    .values({ id, name, email, role, emailVerified: true, deactivatedAt: deactivated ? new Date() : null });
  await db.insert(schema.account).values({
    id: generateId(),
    accountId: id,
    providerId: "credential",
    userId: id,
    password: await hashOnce(password),
  });
  return { actor: { id, name, email, role }, password };
}

/** Signs in through better-auth and returns request headers that carry the session cookie. */
export async function signInHeaders(email: string, password: string): Promise<Headers> {
  const { headers } = await auth.api.signInEmail({ body: { email, password }, returnHeaders: true });
  const cookie = headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
  return new Headers({ cookie });
}

/** An open invitation sent by a new admin, and the token its e-mail carries (only its hash is stored). */
export async function inviteWithToken(role: Role = "engineer") {
  const { actor: admin } = await createTestUser({ role: "admin" });
  const email = uniqueEmail("invitee");
  const invitation = await runUseCase(inviteUser, { actor: admin, input: { email, name: "Dana Example", role } });
  const mail = await waitForMessage({ to: email, subjectIncludes: "invited" });
  const link = firstLink(mail);
  return { admin, email, invitation, link, token: link.split("/invite/")[1], mail };
}

export async function auditEventsFor({ action, subject, actorEmail }: { action: string; subject?: string; actorEmail?: string }) {
  return db
    .select()
    .from(schema.auditEvents)
    .where(
      sql`${schema.auditEvents.action} = ${action}
        ${subject ? sql`and ${schema.auditEvents.subject} = ${subject}` : sql``}
        ${actorEmail ? sql`and ${schema.auditEvents.actorEmail} = ${actorEmail}` : sql``}`,
    );
}

export async function sessionCount(userId: string): Promise<number> {
  const [{ n }] = await db.select({ n: count() }).from(schema.session).where(eq(schema.session.userId, userId));
  return n;
}
