// The profile page's use cases: a person changes their own password (checked against the current one,
// audited, every other session of theirs ended and the one asking kept; wrong guesses refused, counted and
// finally locked) and sets their time zone (an IANA name from the runtime's list, or none for the
// browser's). A refusal writes nothing but what it names: its audit event and its counter.
import { and, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db";
import * as schema from "@/db/schema";
import type { Actor } from "@/lib/domain/actor";
import { auth } from "@/lib/auth/server";
import { getActorFromHeaders, getSessionEndReason } from "@/lib/auth/session";
import { WRONG_CURRENT_PASSWORD_MESSAGE } from "@/lib/domain/schemas/profile";
import { PASSWORD_CHANGE_LIMIT, changePassword, readProfile, setOwnTimeZone } from "@/lib/use-cases/profile";
import { runUseCase } from "@/lib/use-cases/run";
import { expectNoChangeFrom, type ExpectedChange } from "../support/snapshot";
import { auditEventsFor, createTestUser, sessionCount, signInHeaders } from "./helpers/people";

const NEW_PASSWORD = "a-brand-new-password";

/** A person signed in twice (two browsers): the actor of the first session, and both sessions' headers. */
async function personWithTwoSessions() {
  const { actor, password } = await createTestUser({ role: "engineer", label: "profile" });
  const here = await signInHeaders(actor.email, password);
  const elsewhere = await signInHeaders(actor.email, password);
  const current = (await getActorFromHeaders(here)) as Actor;
  expect(current.sessionId).toEqual(expect.any(String));
  return { actor: current, password, here, elsewhere };
}

function change(actor: Actor, currentPassword: string, password = NEW_PASSWORD) {
  return runUseCase(changePassword, { actor, input: { currentPassword, password, confirmPassword: password } });
}

/** The two writes a wrong current password makes on purpose: its audit event and its counter. */
function wrongGuessWrites(actor: Actor, reason = "wrong-current-password"): ExpectedChange[] {
  return [
    {
      table: "audit_events",
      change: "added",
      why: "a refused password change is audited",
      where: (row) =>
        row.action === "profile.change-password.failed" &&
        row.actor_id === actor.id &&
        row.subject === `user:${actor.id}` &&
        (row.details as { reason?: string }).reason === reason,
    },
    {
      table: "rate_limit",
      change: "added or changed",
      why: "wrong current passwords are counted",
      where: (row) => row.key === `gusset:password-change|${actor.id}`,
    },
  ];
}

async function signsIn(email: string, password: string): Promise<boolean> {
  return auth.api.signInEmail({ body: { email, password } }).then(
    () => true,
    () => false,
  );
}

describe("changing one's password", () => {
  it("stores the new password, audits it, ends the other sessions and keeps the one asking", async () => {
    const { actor, password, here, elsewhere } = await personWithTwoSessions();
    expect(await sessionCount(actor.id)).toBe(2);

    expect(await change(actor, password)).toEqual({ sessionsEnded: 1 });

    expect(await getActorFromHeaders(here)).toMatchObject({ id: actor.id, sessionId: actor.sessionId });
    expect(await getActorFromHeaders(elsewhere)).toBeNull();
    expect(await sessionCount(actor.id)).toBe(1);
    // The browser left signed out is told why on the sign-in page.
    expect(await getSessionEndReason(elsewhere)).toBe("password-changed");
    expect(await getSessionEndReason(here)).toBeNull();

    const [event] = await auditEventsFor({ action: "profile.change-password", subject: `user:${actor.id}` });
    expect(event).toMatchObject({ actorId: actor.id, actorEmail: actor.email, details: { sessionsEnded: 1 } });
    expect(await signsIn(actor.email, NEW_PASSWORD)).toBe(true);
    expect(await signsIn(actor.email, password)).toBe(false);
  });

  it("refuses a wrong current password, writing only its audit event and its count", async () => {
    const { actor, here, elsewhere } = await personWithTwoSessions();
    await expectNoChangeFrom(
      () =>
        expect(change(actor, "not-my-password-at-all")).rejects.toMatchObject({
          code: "invalid-input",
          fieldErrors: { currentPassword: [WRONG_CURRENT_PASSWORD_MESSAGE] },
        }),
      { except: wrongGuessWrites(actor) },
    );
    expect(await getActorFromHeaders(here)).not.toBeNull();
    expect(await getActorFromHeaders(elsewhere)).not.toBeNull();
    const [counter] = await db
      .select()
      .from(schema.rateLimit)
      .where(eq(schema.rateLimit.key, `gusset:password-change|${actor.id}`));
    expect(counter.count).toBe(1);
  });

  it(`locks after ${PASSWORD_CHANGE_LIMIT.max} attempts, even for the right password, and says what to do`, async () => {
    const { actor, password } = await personWithTwoSessions();
    for (let attempt = 0; attempt < PASSWORD_CHANGE_LIMIT.max; attempt++) {
      await expect(change(actor, `wrong-guess-number-${attempt}`)).rejects.toMatchObject({ code: "invalid-input" });
    }
    await expectNoChangeFrom(
      () =>
        expect(change(actor, password)).rejects.toMatchObject({
          code: "rate-limited",
          message: expect.stringMatching(/Wait 15 minutes and try again, or sign out and use “Forgot your password\?”/),
        }),
      { except: wrongGuessWrites(actor, "rate-limited") },
    );
    expect(await signsIn(actor.email, password)).toBe(true);
  });

  it("refuses a new password the rules refuse, or the current one again, writing nothing", async () => {
    const { actor, password } = await personWithTwoSessions();
    const refusals: [string, string, Record<string, string[]>][] = [
      [password, "short", { password: ["Use at least 10 characters."] }],
      [password, password, { password: ["Choose a password different from your current one."] }],
      ["", NEW_PASSWORD, { currentPassword: ["Enter your current password."] }],
    ];
    for (const [currentPassword, newPassword, fieldErrors] of refusals) {
      await expectNoChangeFrom(() =>
        expect(change(actor, currentPassword, newPassword)).rejects.toMatchObject({ code: "invalid-input", fieldErrors }),
      );
    }
    await expectNoChangeFrom(() =>
      expect(
        runUseCase(changePassword, {
          actor,
          input: { currentPassword: password, password: NEW_PASSWORD, confirmPassword: "something-else-entirely" },
        }),
      ).rejects.toMatchObject({ code: "invalid-input", fieldErrors: { confirmPassword: ["The two passwords differ."] } }),
    );
  });

  it("asks anyone not signed in to sign in, writing nothing", async () => {
    await expectNoChangeFrom(() =>
      expect(
        runUseCase(changePassword, {
          actor: null,
          input: { currentPassword: "whatever-it-is", password: NEW_PASSWORD, confirmPassword: NEW_PASSWORD },
        }),
      ).rejects.toMatchObject({ code: "unauthenticated" }),
    );
  });
});

describe("the time zone", () => {
  it("keeps an IANA time zone, audited, and clears it back to the browser's", async () => {
    const { actor } = await createTestUser({ role: "auditor", label: "zone" });
    expect(await runUseCase(readProfile, { actor, input: {} })).toMatchObject({ id: actor.id, role: "auditor", timeZone: null });

    await runUseCase(setOwnTimeZone, { actor, input: { timeZone: "Pacific/Auckland" } });
    expect((await runUseCase(readProfile, { actor, input: {} })).timeZone).toBe("Pacific/Auckland");
    await runUseCase(setOwnTimeZone, { actor, input: { timeZone: "UTC" } });
    // The same again changes nothing and is not an event.
    await expectNoChangeFrom(() => runUseCase(setOwnTimeZone, { actor, input: { timeZone: "UTC" } }));
    await runUseCase(setOwnTimeZone, { actor, input: { timeZone: "" } });
    expect((await runUseCase(readProfile, { actor, input: {} })).timeZone).toBeNull();

    const events = await auditEventsFor({ action: "profile.set-time-zone", subject: `user:${actor.id}` });
    expect(events.sort((a, b) => a.id - b.id).map((event) => event.details)).toEqual([
      { from: null, to: "Pacific/Auckland" },
      { from: "Pacific/Auckland", to: "UTC" },
      { from: "UTC", to: null },
    ]);
  });

  it("refuses a name that is not a time zone, in words a person can act on, writing nothing", async () => {
    const { actor } = await createTestUser({ role: "lead", label: "zone" });
    for (const timeZone of ["Mars/Olympus_Mons", "Europe/London; drop table", "x".repeat(65), "+02:00"]) {
      await expectNoChangeFrom(() =>
        expect(runUseCase(setOwnTimeZone, { actor, input: { timeZone } })).rejects.toMatchObject({
          code: "invalid-input",
          fieldErrors: { timeZone: ["Choose a time zone from the list."] },
        }),
      );
    }
    const [row] = await db
      .select({ timeZone: schema.user.timeZone })
      .from(schema.user)
      .where(and(eq(schema.user.id, actor.id)));
    expect(row.timeZone).toBeNull();
  });
});
