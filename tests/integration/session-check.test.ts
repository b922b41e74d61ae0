// The session check of every signed-in request (lib/auth/session.ts): its own exact reading of the common case (the
// cookie's signature, then the session and its person in one query) must answer as better-auth's getSession does, and
// hand every case that changes a cookie or a row (expired, due for refresh, tampered) to better-auth itself.
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db";
import * as schema from "@/db/schema";
import { auth } from "@/lib/auth/server";
import { getActorFromHeaders } from "@/lib/auth/session";
import { setUserRole } from "@/lib/use-cases/people";
import { runUseCase } from "@/lib/use-cases/run";
import { createTestUser, sessionCount, signInHeaders } from "./helpers/people";

const HOUR = 60 * 60 * 1000;

async function sessionOf(userId: string) {
  const [row] = await db.select().from(schema.session).where(eq(schema.session.userId, userId));
  return row;
}

describe("the session check of a signed-in request", () => {
  it("reads the person and their role from the database on every request: a new role counts at once", async () => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    const { actor, password } = await createTestUser({ role: "engineer" });
    const headers = await signInHeaders(actor.email, password);
    const session = await sessionOf(actor.id);
    expect(await getActorFromHeaders(headers)).toEqual({ ...actor, sessionId: session.id });

    await runUseCase(setUserRole, { actor: admin, input: { userId: actor.id, role: "auditor" } });
    expect(await getActorFromHeaders(headers)).toEqual({ ...actor, role: "auditor", sessionId: session.id });
  });

  it("a deleted session row signs nobody in", async () => {
    const { actor, password } = await createTestUser({ role: "lead" });
    const headers = await signInHeaders(actor.email, password);
    await db.delete(schema.session).where(eq(schema.session.userId, actor.id));
    expect(await getActorFromHeaders(headers)).toBeNull();
  });

  it("a cookie whose token or signature was changed signs nobody in, as better-auth would answer", async () => {
    const { actor, password } = await createTestUser({ role: "engineer" });
    const headers = await signInHeaders(actor.email, password);
    const cookie = headers.get("cookie")!;
    const [name, value] = [cookie.slice(0, cookie.indexOf("=")), decodeURIComponent(cookie.slice(cookie.indexOf("=") + 1))];
    const dot = value.lastIndexOf(".");
    const token = value.slice(0, dot);
    const signature = value.slice(dot + 1);
    const flip = (text: string, at: number) => `${text.slice(0, at)}${text[at] === "A" ? "B" : "A"}${text.slice(at + 1)}`;
    for (const forged of [`${flip(token, 0)}.${signature}`, `${token}.${flip(signature, 0)}`, token, `${token}.`]) {
      const forgedHeaders = new Headers({ cookie: `${name}=${encodeURIComponent(forged)}` });
      expect(await getActorFromHeaders(forgedHeaders)).toBeNull();
      expect(await auth.api.getSession({ headers: forgedHeaders })).toBeNull();
    }
    expect(await sessionCount(actor.id)).toBe(1);
  });

  it("an expired session signs nobody in and is cleared by better-auth", async () => {
    const { actor, password } = await createTestUser({ role: "engineer" });
    const headers = await signInHeaders(actor.email, password);
    await db
      .update(schema.session)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(schema.session.userId, actor.id));
    expect(await getActorFromHeaders(headers)).toBeNull();
    expect(await sessionCount(actor.id)).toBe(0);
  });

  it("a session due for its sliding refresh is refreshed by better-auth, and still signs its person in", async () => {
    const { actor, password } = await createTestUser({ role: "engineer" });
    const headers = await signInHeaders(actor.email, password);
    // Six days of the seven gone: past better-auth's one-day update age.
    const nearEnd = new Date(Date.now() + 24 * HOUR - HOUR);
    await db.update(schema.session).set({ expiresAt: nearEnd }).where(eq(schema.session.userId, actor.id));
    expect(await getActorFromHeaders(headers)).toMatchObject({ id: actor.id, role: "engineer" });
    expect((await sessionOf(actor.id)).expiresAt.getTime()).toBeGreaterThan(nearEnd.getTime() + 5 * 24 * HOUR);
  });

  it("no cookie, or another site's cookie alone, is nobody", async () => {
    expect(await getActorFromHeaders(new Headers())).toBeNull();
    expect(await getActorFromHeaders(new Headers({ cookie: "theme=dark" }))).toBeNull();
  });
});
