// The one runner (lib/use-cases/run.ts) and its two Next adapters (lib/use-cases/next.ts), against the
// real database: who may run a use case, what bad input gets, and that the work, its audit event and
// any job it queues commit together or not at all. The use cases here are throwaway ones declared with
// defineUseCase; the audit events they write are real kinds with their real details.
import { eq, sql } from "drizzle-orm";
import { redirect } from "next/navigation";
import { afterEach, describe, expect, it, vi } from "vitest";
import { z } from "zod";
import { db, pool } from "@/db";
import * as schema from "@/db/schema";
import type { Actor } from "@/lib/domain/actor";
import type { AuditEventInput } from "@/lib/domain/audit-actions";
import { AppError, DEFAULT_MESSAGES } from "@/lib/domain/errors";
import type { Role } from "@/lib/domain/roles";
import { recordAuditEvent } from "@/lib/data/audit";
import { currentDb } from "@/lib/data/transaction";
import { enqueueJob } from "@/lib/jobs/enqueue";
import { serverAction, routeHandler } from "@/lib/use-cases/next";
import { inviteUser } from "@/lib/use-cases/people";
import { runUseCase } from "@/lib/use-cases/run";
import { defineUseCase } from "@/lib/use-cases/use-case";
import { waitForMessage } from "../support/mailbox";
import {
  JOBS_TABLE,
  expectNoChangeFrom,
  expectRowsUnchanged,
  refusalAudited,
  refusalWrites,
  snapshotRows,
} from "../support/snapshot";
import { auditEventsFor, createTestUser, signInHeaders, uniqueEmail } from "./helpers/people";

// Server actions read the request through next/headers; here the "request" is whatever a test sets.
const request = vi.hoisted(() => ({ headers: new Headers() }));
vi.mock("next/headers", () => ({
  headers: async () => request.headers,
  cookies: async () => ({ get: () => undefined, getAll: () => [], set: () => undefined }),
}));

afterEach(() => {
  request.headers = new Headers();
  vi.restoreAllMocks();
});

const REFUSING_ROLES = ["lead", "engineer", "auditor"] as const;
const ALL_ROLES: Role[] = ["admin", "lead", "engineer", "auditor"];

function formData(values: Record<string, string>): FormData {
  const data = new FormData();
  for (const [key, value] of Object.entries(values)) data.append(key, value);
  data.append("$ACTION_ID_abc", ""); // Next adds fields like this; the adapter must ignore them
  return data;
}

/** Signs a new person with `role` in and makes their session the one the server action sees. */
async function actAs(role: Role): Promise<Actor> {
  const { actor, password } = await createTestUser({ role });
  request.headers = await signInHeaders(actor.email, password);
  return actor;
}

async function userRow(id: string) {
  const [row] = await db.select().from(schema.user).where(eq(schema.user.id, id));
  return row;
}

/** How many jobs with this id pg-boss holds (queued, running, done or archived). */
async function jobCount(id: string): Promise<number> {
  const { rows } = await pool.query<{ n: string }>(
    `select count(*) as n from (select id from pgboss.job where id = $1 union all select id from pgboss.archive where id = $1) j`,
    [id],
  );
  return Number(rows[0].n);
}

type Breaks = "nowhere" | "after-writing" | "in-audit" | "at-the-audit-insert";

/**
 * Reactivates a person the long way round, so that every part of a change is there: a row changed,
 * an e-mail queued, the real "users.reactivate" audit event. `breaks` says where it fails:
 * after-writing — the work throws once it has changed the row, queued the mail and even written an
 * audit event of its own; in-audit — the audit callback throws; at-the-audit-insert — the database
 * refuses the audit row (a NOT NULL column left null).
 */
function reactivation(breaks: Breaks, mailTo: string) {
  return defineUseCase({
    name: `test.reactivate.${breaks}`,
    permission: "users.deactivate",
    input: z.object({ userId: z.string().min(1, "Choose a person.") }),
    run: async ({ userId }, { tx }) => {
      const [row] = await tx.update(schema.user).set({ deactivatedAt: null }).where(eq(schema.user.id, userId)).returning();
      const jobId = await enqueueJob("mail.send", {
        to: mailTo,
        subject: "Welcome back",
        text: "Welcome back.\n",
        html: "<p>Welcome back.</p>",
      });
      if (breaks === "after-writing") {
        await recordAuditEvent({ action: "users.reactivate", subject: `user:${userId}`, details: { email: row.email } });
        throw new AppError("conflict", "Someone changed this first.");
      }
      return { userId, email: row.email, jobId };
    },
    audit: ({ result }) => {
      if (breaks === "in-audit") throw new Error("the audit step broke");
      const event: AuditEventInput = {
        action: "users.reactivate",
        subject: `user:${result.userId}`,
        details: { email: result.email },
      };
      return breaks === "at-the-audit-insert" ? { ...event, action: null as unknown as "users.reactivate" } : event;
    },
  });
}

describe("runUseCase: who may run it", () => {
  const guarded = (work: () => Promise<unknown>) =>
    defineUseCase({
      name: "test.guarded",
      permission: "users.deactivate",
      input: z.object({ userId: z.string().min(1) }),
      run: work,
      audit: null,
    });

  it("refuses an anonymous caller with 'unauthenticated' before it parses the input, runs nothing and writes nothing", async () => {
    const work = vi.fn(async () => "ran");
    for (const input of [{ userId: "someone" }, { userId: "" }, "not even an object"]) {
      await expectNoChangeFrom(() =>
        expect(runUseCase(guarded(work), { actor: null, input })).rejects.toMatchObject({
          code: "unauthenticated",
          message: DEFAULT_MESSAGES.unauthenticated,
        }),
      );
    }
    expect(work).not.toHaveBeenCalled();
  });

  it("refuses a role without the permission with 'forbidden', before it parses the input, and writes nothing", async () => {
    const work = vi.fn(async () => "ran");
    for (const role of REFUSING_ROLES) {
      const { actor } = await createTestUser({ role });
      for (const input of [{ userId: "someone" }, { userId: "" }]) {
        await expectNoChangeFrom(
          () =>
            expect(runUseCase(guarded(work), { actor, input })).rejects.toMatchObject({
              code: "forbidden",
              message: DEFAULT_MESSAGES.forbidden,
            }),
          { except: refusalWrites("forbidden", actor) },
        );
      }
    }
    expect(work).not.toHaveBeenCalled();
    const { actor: admin } = await createTestUser({ role: "admin" });
    await expect(runUseCase(guarded(work), { actor: admin, input: { userId: "someone" } })).resolves.toBe("ran");
    expect(work).toHaveBeenCalledTimes(1);
  });

  it("lets every signed-in role run a 'signed-in' use case, and nobody else", async () => {
    const whoAmI = defineUseCase({
      name: "test.signed-in",
      permission: "signed-in",
      input: z.object({}),
      run: async (_input, { actor }) => actor,
      audit: null,
    });
    for (const role of ALL_ROLES) {
      const { actor } = await createTestUser({ role });
      expect(await runUseCase(whoAmI, { actor, input: {} })).toEqual(actor);
    }
    await expectNoChangeFrom(() =>
      expect(runUseCase(whoAmI, { actor: null, input: {} })).rejects.toMatchObject({ code: "unauthenticated" }),
    );
  });

  it("hands a public use case a null actor when nobody is signed in, and the actor when someone is", async () => {
    const seen: (Actor | null)[] = [];
    const open = defineUseCase({
      name: "test.public",
      permission: "public",
      input: z.object({}),
      run: async (_input, { actor }) => {
        seen.push(actor);
        return actor?.role ?? "anonymous";
      },
      audit: null,
    });
    expect(await expectNoChangeFrom(() => runUseCase(open, { actor: null, input: {} }))).toBe("anonymous");
    const { actor } = await createTestUser({ role: "engineer" });
    expect(await runUseCase(open, { actor, input: {} })).toBe("engineer");
    expect(seen).toEqual([null, actor]);
  });
});

describe("runUseCase: input", () => {
  const inviteLike = (work: (input: { email: string; name: string; role: Role }) => Promise<unknown>) =>
    defineUseCase({
      name: "test.input",
      permission: "users.invite",
      input: z.object({
        email: z.string().trim().toLowerCase().pipe(z.email("Enter an e-mail address.")),
        name: z.string().trim().min(1, "Enter a name."),
        role: z.enum(["admin", "lead", "engineer", "auditor"], { error: "Choose a role." }),
      }),
      run: work,
      audit: null,
    });

  it("answers bad input with 'invalid-input' and a message per field, runs nothing and writes nothing", async () => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    const work = vi.fn(async () => "ran");
    await expectNoChangeFrom(() =>
      expect(
        runUseCase(inviteLike(work), { actor: admin, input: { email: "not-an-address", name: " ", role: "superuser" } }),
      ).rejects.toMatchObject({
        code: "invalid-input",
        message: DEFAULT_MESSAGES["invalid-input"],
        fieldErrors: { email: ["Enter an e-mail address."], name: ["Enter a name."], role: ["Choose a role."] },
      }),
    );
    expect(work).not.toHaveBeenCalled();
  });

  it("gives a form-wide problem as the message, with no field", async () => {
    const { actor } = await createTestUser({ role: "engineer" });
    const matching = defineUseCase({
      name: "test.form-wide",
      permission: "signed-in",
      input: z.object({ a: z.string(), b: z.string() }).refine((v) => v.a === v.b, { message: "The two differ." }),
      run: async () => "ran",
      audit: null,
    });
    await expectNoChangeFrom(() =>
      expect(runUseCase(matching, { actor, input: { a: "x", b: "y" } })).rejects.toMatchObject({
        code: "invalid-input",
        message: "The two differ.",
        fieldErrors: {},
      }),
    );
  });

  it("hands the work the parsed input, not the raw one", async () => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    const work = vi.fn(async (input: unknown) => input);
    const result = await runUseCase(inviteLike(work), {
      actor: admin,
      input: { email: "  Ann@Example.COM ", name: " Ann ", role: "lead", extra: "dropped" },
    });
    expect(result).toEqual({ email: "ann@example.com", name: "Ann", role: "lead" });
  });
});

describe("runUseCase: one transaction", () => {
  it("commits the work, its audit event and its queued job together", async () => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    const { actor: target } = await createTestUser({ role: "engineer", deactivated: true });
    const mailTo = uniqueEmail("welcome-back");
    const result = await runUseCase(reactivation("nowhere", mailTo), { actor: admin, input: { userId: target.id } });
    expect(result).toEqual({ userId: target.id, email: target.email, jobId: expect.stringMatching(/^[0-9a-f-]{36}$/) });
    expect((await userRow(target.id)).deactivatedAt).toBeNull();
    // The event's actor is the one who ran it, unless the event names another.
    const events = await auditEventsFor({ action: "users.reactivate", subject: `user:${target.id}` });
    expect(events.map((e) => [e.actorId, e.actorEmail, e.details])).toEqual([[admin.id, admin.email, { email: target.email }]]);
    expect(await jobCount(result.jobId)).toBe(1);
    expect((await waitForMessage({ to: mailTo })).subject).toBe("Welcome back");
  });

  it("runs the work on the transaction it hands over, which every query under it joins", async () => {
    const { actor } = await createTestUser({ role: "engineer" });
    const probe = defineUseCase({
      name: "test.tx",
      permission: "signed-in",
      input: z.object({}),
      run: async (_input, { tx }) => currentDb() === tx && tx !== (db as unknown),
      audit: null,
    });
    expect(await runUseCase(probe, { actor, input: {} })).toBe(true);
  });

  it("opens no transaction for a use case that declares it touches no data", async () => {
    const contexts: object[] = [];
    const liveness = defineUseCase({
      name: "test.database-free",
      permission: "public",
      input: z.object({}),
      run: async (_input, context) => {
        contexts.push(context);
        return currentDb() === db;
      },
      audit: null,
      database: false,
    });
    expect(await runUseCase(liveness, { actor: null, input: {} })).toBe(true);
    expect(contexts).toEqual([{ actor: null }]);
  });

  it("opens no transaction for work that is one statement, hands it its audit event, and refuses work that did not ask for it", async () => {
    const { actor } = await createTestUser({ role: "engineer" });
    const seen: { pool: boolean; prepared: unknown; event: AuditEventInput | null }[] = [];
    const statement = (askForEvent: boolean) =>
      defineUseCase({
        name: "test.one-statement",
        permission: "signed-in",
        input: z.object({ label: z.string() }),
        database: "one-statement",
        prepare: async ({ label }) => `${label} prepared`,
        run: async ({ label }, { prepared, auditEventOf }): Promise<{ label: string }> => {
          const result = { label };
          seen.push({ pool: currentDb() === db, prepared, event: askForEvent ? auditEventOf(result) : null });
          return result;
        },
        audit: ({ result }) => ({ action: "users.reactivate", subject: `user:${actor.id}`, details: { email: result.label } }),
      });
    expect(await runUseCase(statement(true), { actor, input: { label: "name" }, ipAddress: "192.0.2.7" })).toEqual({
      label: "name",
    });
    expect(seen).toEqual([
      {
        pool: true,
        prepared: "name prepared",
        event: {
          actorId: actor.id,
          actorEmail: actor.email,
          ipAddress: "192.0.2.7",
          action: "users.reactivate",
          subject: `user:${actor.id}`,
          details: { email: "name" },
        },
      },
    ]);
    await expect(runUseCase(statement(false), { actor, input: { label: "name" } })).rejects.toThrow(
      "test.one-statement: the work stored its change without asking for its audit event",
    );
  });

  it("rolls back the work's writes, its own audit row and its queued job when the work throws after writing", async () => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    const { actor: target } = await createTestUser({ role: "engineer", deactivated: true });
    await expectNoChangeFrom(() =>
      expect(
        runUseCase(reactivation("after-writing", uniqueEmail("never")), { actor: admin, input: { userId: target.id } }),
      ).rejects.toMatchObject({
        code: "conflict",
        message: "Someone changed this first.",
      }),
    );
    expect((await userRow(target.id)).deactivatedAt).toBeInstanceOf(Date);
    expect(await auditEventsFor({ action: "users.reactivate", subject: `user:${target.id}` })).toEqual([]);
  });

  it("rolls back the work and its queued job when the audit callback throws", async () => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    const { actor: target } = await createTestUser({ role: "engineer", deactivated: true });
    await expectNoChangeFrom(() =>
      expect(
        runUseCase(reactivation("in-audit", uniqueEmail("never")), { actor: admin, input: { userId: target.id } }),
      ).rejects.toThrow("the audit step broke"),
    );
    expect((await userRow(target.id)).deactivatedAt).toBeInstanceOf(Date);
  });

  it("rolls back the work and its queued job when the database refuses the audit row", async () => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    const { actor: target } = await createTestUser({ role: "engineer", deactivated: true });
    const failure = await expectNoChangeFrom(() =>
      runUseCase(reactivation("at-the-audit-insert", uniqueEmail("never")), { actor: admin, input: { userId: target.id } }).then(
        () => null,
        (error: unknown) => error,
      ),
    );
    expect(failure).toBeInstanceOf(Error);
    expect(failure).not.toBeInstanceOf(AppError);
    expect(String((failure as Error & { cause?: unknown }).cause ?? failure)).toMatch(/null value in column "action"/);
    expect((await userRow(target.id)).deactivatedAt).toBeInstanceOf(Date);
  });

  it("writes no event when the audit callback answers null, and none for reads", async () => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    const { actor: target } = await createTestUser({ role: "engineer", deactivated: true });
    const quiet = defineUseCase({
      name: "test.quiet",
      permission: "users.deactivate",
      input: z.object({ userId: z.string() }),
      run: async ({ userId }, { tx }) => {
        await tx.update(schema.user).set({ deactivatedAt: null }).where(eq(schema.user.id, userId));
        return userId;
      },
      audit: () => null,
    });
    const before = await snapshotRows();
    await runUseCase(quiet, { actor: admin, input: { userId: target.id } });
    await expectRowsUnchanged(before, {
      except: [
        {
          table: "user",
          change: "changed",
          why: "the work reactivated this person",
          where: (row) => row.id === target.id && row.deactivated_at === null,
        },
      ],
    });
  });

  it("hands the audit callback the parsed input, the result and the actor, and lets the event name its own actor", async () => {
    const marker = uniqueEmail("named-actor");
    const seen: unknown[] = [];
    const { actor: target } = await createTestUser({ role: "auditor", deactivated: true });
    const named = defineUseCase({
      name: "test.named-actor",
      permission: "public",
      input: z.object({ userId: z.string().trim() }),
      run: async ({ userId }) => ({ userId }),
      audit: (args) => {
        seen.push(args);
        return {
          action: "users.reactivate",
          actorId: target.id,
          actorEmail: marker,
          subject: `user:${args.result.userId}`,
          details: { email: marker },
        };
      },
    });
    await runUseCase(named, { actor: null, input: { userId: `  ${target.id} ` } });
    expect(seen).toEqual([{ input: { userId: target.id }, result: { userId: target.id }, actor: null }]);
    const [event] = await auditEventsFor({ action: "users.reactivate", subject: `user:${target.id}` });
    expect(event).toMatchObject({ actorId: target.id, actorEmail: marker, details: { email: marker } });
  });
});

describe("serverAction", () => {
  const invite = serverAction(inviteUser);

  it("refuses an anonymous visitor with 'unauthenticated' and writes nothing", async () => {
    const before = await snapshotRows();
    const state = await invite(null, formData({ email: uniqueEmail("anon"), name: "Ann Example", role: "engineer" }));
    expect(state).toEqual({ ok: false, error: { code: "unauthenticated", message: "Please sign in to continue." } });
    await expectRowsUnchanged(before);
  });

  it("refuses a role without the permission with 'forbidden' and writes nothing", async () => {
    for (const role of REFUSING_ROLES) {
      const actor = await actAs(role);
      const before = await snapshotRows();
      const state = await invite(null, formData({ email: uniqueEmail("nope"), name: "Ann Example", role: "engineer" }));
      expect(state).toEqual({ ok: false, error: { code: "forbidden", message: "Your role does not allow this." } });
      await expectRowsUnchanged(before, { except: [refusalAudited(actor.id, "users.invite")] });
    }
  });

  it("answers bad input with field messages, and writes no row, no audit event and no job", async () => {
    await actAs("admin");
    const before = await snapshotRows();
    const state = await invite(null, formData({ email: "not-an-address", name: "", role: "superuser" }));
    expect(state).toEqual({
      ok: false,
      error: {
        code: "invalid-input",
        message: "Some fields need attention.",
        fieldErrors: {
          email: ["Enter an e-mail address like name@firm.example."],
          name: ["Enter the person's name."],
          role: ["Choose a role."],
        },
      },
    });
    await expectRowsUnchanged(before);
  });

  it("runs the use case for the right role, writes its audit event and queues its e-mail in the same commit", async () => {
    const admin = await actAs("admin");
    const email = uniqueEmail("invitee");
    const before = await snapshotRows();
    const state = await invite(null, formData({ email: email.toUpperCase(), name: "  Ines Example ", role: "auditor" }));
    expect(state).toMatchObject({ ok: true, data: { email, name: "Ines Example", role: "auditor", replacedInvitations: [] } });
    if (!state?.ok) throw new Error("expected success");
    await expectRowsUnchanged(before, {
      except: [
        { table: "invitations", change: "added", why: "the invitation", where: (row) => row.id === state.data.id },
        {
          table: "audit_events",
          change: "added",
          why: "its audit event",
          where: (row) => row.subject === `invitation:${state.data.id}`,
        },
        {
          table: JOBS_TABLE,
          change: "added",
          why: "its e-mail",
          where: (row) => row.name === "mail.send" && (row.data as { to?: string }).to === email,
        },
      ],
    });
    const events = await auditEventsFor({ action: "users.invite", subject: `invitation:${state.data.id}` });
    expect(events).toHaveLength(1);
    expect(events[0]).toMatchObject({
      actorId: admin.id,
      actorEmail: admin.email,
      details: { email, role: "auditor", replacedInvitations: [] },
    });
    const mail = await waitForMessage({ to: email, subjectIncludes: "invited" });
    expect(mail.text).toContain("/invite/");
  });

  it("accepts a plain object as well as FormData", async () => {
    await actAs("admin");
    const email = uniqueEmail("plain");
    const state = await invite(null, { email, name: "Plain Object", role: "engineer" });
    expect(state).toMatchObject({ ok: true, data: { email } });
  });

  it("rolls back the work's writes and its audit event when the work fails, and shows the AppError's message", async () => {
    await actAs("admin");
    const { actor: target } = await createTestUser({ role: "engineer", deactivated: true });
    const failing = serverAction(reactivation("after-writing", uniqueEmail("never")));
    const before = await snapshotRows();
    const state = await failing(null, { userId: target.id });
    expect(state).toEqual({ ok: false, error: { code: "conflict", message: "Someone changed this first." } });
    expect(await auditEventsFor({ action: "users.reactivate", subject: `user:${target.id}` })).toEqual([]);
    await expectRowsUnchanged(before);
  });

  it("hides an unexpected error behind a generic message", async () => {
    await actAs("admin");
    const spy = vi.spyOn(console, "error").mockImplementation(() => undefined);
    const broken = serverAction(
      defineUseCase({
        name: "test.broken",
        permission: "users.read",
        input: z.object({}),
        run: async () => {
          throw new Error('relation "secret_table" does not exist');
        },
        audit: null,
      }),
    );
    const state = await broken(null, {});
    expect(state).toEqual({ ok: false, error: { code: "internal", message: DEFAULT_MESSAGES.internal } });
    expect(JSON.stringify(state)).not.toContain("secret_table");
    expect(spy).toHaveBeenCalled();
  });

  it("hides a database refusal of the audit row too, and keeps nothing of the change", async () => {
    await actAs("admin");
    const { actor: target } = await createTestUser({ role: "engineer", deactivated: true });
    vi.spyOn(console, "error").mockImplementation(() => undefined);
    const action = serverAction(reactivation("at-the-audit-insert", uniqueEmail("never")));
    const state = await expectNoChangeFrom(() => action(null, { userId: target.id }));
    expect(state).toEqual({ ok: false, error: { code: "internal", message: DEFAULT_MESSAGES.internal } });
  });

  it("runs `then` once the change has committed, with the result and the parsed input", async () => {
    await actAs("admin");
    const { actor: target } = await createTestUser({ role: "engineer", deactivated: true });
    const seen: unknown[] = [];
    const action = serverAction(reactivation("nowhere", uniqueEmail("then")), {
      then: async (result, input) => {
        // Another connection sees the change: it has committed. No transaction is open any more.
        const { rows } = await pool.query(`select deactivated_at from "user" where id = $1`, [input.userId]);
        seen.push({ result, input, deactivatedAt: rows[0].deactivated_at, inTransaction: currentDb() !== db });
      },
    });
    const state = await action(null, formData({ userId: target.id }));
    expect(state).toMatchObject({ ok: true, data: { userId: target.id, email: target.email } });
    expect(seen).toEqual([
      {
        result: { userId: target.id, email: target.email, jobId: expect.any(String) },
        input: { userId: target.id },
        deactivatedAt: null,
        inTransaction: false,
      },
    ]);
  });

  it("does not run `then` for a refused, invalid or failed call", async () => {
    const then = vi.fn();
    const { actor: target } = await createTestUser({ role: "engineer", deactivated: true });
    const action = serverAction(reactivation("nowhere", uniqueEmail("then-never")), { then });
    const failing = serverAction(reactivation("after-writing", uniqueEmail("then-never")), { then });
    expect(await action(null, { userId: target.id })).toMatchObject({ ok: false, error: { code: "unauthenticated" } });
    await actAs("engineer");
    expect(await action(null, { userId: target.id })).toMatchObject({ ok: false, error: { code: "forbidden" } });
    await actAs("admin");
    expect(await action(null, { userId: "" })).toMatchObject({
      ok: false,
      error: { code: "invalid-input", fieldErrors: { userId: ["Choose a person."] } },
    });
    expect(await failing(null, { userId: target.id })).toMatchObject({ ok: false, error: { code: "conflict" } });
    expect(then).not.toHaveBeenCalled();
    expect((await userRow(target.id)).deactivatedAt).toBeInstanceOf(Date);
  });

  it("lets a redirect() in `then` through to Next, after the commit", async () => {
    await actAs("admin");
    const { actor: target } = await createTestUser({ role: "engineer", deactivated: true });
    const action = serverAction(reactivation("nowhere", uniqueEmail("redirected")), { then: () => redirect("/admin/users") });
    await expect(action(null, { userId: target.id })).rejects.toMatchObject({
      digest: expect.stringMatching(/^NEXT_REDIRECT;[a-z]+;\/admin\/users;/),
    });
    expect((await userRow(target.id)).deactivatedAt).toBeNull();
    expect(await auditEventsFor({ action: "users.reactivate", subject: `user:${target.id}` })).toHaveLength(1);
  });
});

describe("routeHandler", () => {
  const listing = defineUseCase({
    name: "test.route",
    permission: "audit.read",
    input: z.object({ limit: z.coerce.number().int().max(10) }),
    run: async (input, { actor }) => ({ limit: input.limit, role: actor.role }),
    audit: null,
  });
  const route = routeHandler(listing);
  const call = (headers: Headers, query = "limit=5") =>
    route(new Request(`http://127.0.0.1/api/test?${query}`, { headers }), { params: Promise.resolve({}) });
  const post = (
    handler: ReturnType<typeof routeHandler>,
    body: string,
    contentType = "application/json",
    headers = new Headers(),
  ) => {
    const withType = new Headers(headers);
    withType.set("content-type", contentType);
    return handler(new Request("http://127.0.0.1/api/test", { method: "POST", body, headers: withType }), {
      params: Promise.resolve({}),
    });
  };

  async function headersOf(role: Role): Promise<Headers> {
    return (await signedInAs(role)).headers;
  }

  async function signedInAs(role: Role): Promise<{ actor: Actor; headers: Headers }> {
    const { actor, password } = await createTestUser({ role });
    return { actor, headers: await signInHeaders(actor.email, password) };
  }

  it("answers 401 JSON to an anonymous caller and writes nothing", async () => {
    const before = await snapshotRows();
    const response = await call(new Headers());
    expect(response.status).toBe(401);
    expect(await response.json()).toEqual({ error: { code: "unauthenticated", message: "Please sign in to continue." } });
    await expectRowsUnchanged(before);
  });

  it("answers 403 JSON to a role without the permission and writes nothing", async () => {
    for (const role of ["lead", "engineer"] as const) {
      const { actor, headers } = await signedInAs(role);
      const before = await snapshotRows();
      const response = await call(headers);
      expect(response.status).toBe(403);
      expect(await response.json()).toEqual({ error: { code: "forbidden", message: "Your role does not allow this." } });
      await expectRowsUnchanged(before, { except: [refusalAudited(actor.id)] });
    }
  });

  it("answers 422 with field messages to bad input and writes nothing", async () => {
    const headers = await headersOf("auditor");
    const before = await snapshotRows();
    const response = await call(headers, "limit=500");
    expect(response.status).toBe(422);
    const body = await response.json();
    expect(body.error.code).toBe("invalid-input");
    expect(Object.keys(body.error.fieldErrors)).toEqual(["limit"]);
    await expectRowsUnchanged(before);
  });

  it("answers 400 to a body that is not JSON, or not a JSON object", async () => {
    const open = routeHandler(
      defineUseCase({
        name: "test.open",
        permission: "public",
        input: z.object({ a: z.string() }),
        run: async () => "never",
        audit: null,
      }),
    );
    for (const [body, message] of [
      ["{not json", "The request body is not valid JSON."],
      ["[1, 2]", "The request body must be a JSON object."],
      ["null", "The request body must be a JSON object."],
    ] as const) {
      const response = await post(open, body);
      expect(response.status, body).toBe(400);
      expect(await response.json(), body).toEqual({ error: { code: "bad-request", message } });
    }
  });

  it("answers 200 { data } to the right role", async () => {
    for (const role of ["auditor", "admin"] as const) {
      const response = await call(await headersOf(role));
      expect(response.status).toBe(200);
      expect(await response.json()).toEqual({ data: { limit: 5, role } });
    }
  });

  it("answers `respond(result)` when the route has a shape of its own", async () => {
    const flat = routeHandler(listing, {
      respond: (result) => Response.json(result, { status: 200, headers: { "Cache-Control": "no-store" } }),
    });
    const response = await flat(new Request("http://127.0.0.1/api/test?limit=3", { headers: await headersOf("auditor") }), {
      params: Promise.resolve({}),
    });
    expect(response.status).toBe(200);
    expect(response.headers.get("cache-control")).toBe("no-store");
    expect(await response.json()).toEqual({ limit: 3, role: "auditor" });
  });

  it("reads a JSON or form body for POST, and the route's params over it", async () => {
    const echo = routeHandler(
      defineUseCase({
        name: "test.echo",
        permission: "public",
        input: z.object({ id: z.string(), note: z.string() }),
        run: async (input) => input,
        audit: null,
      }),
    );
    const json = await post(echo, JSON.stringify({ note: "from JSON", id: "from-body" }));
    expect(await json.json()).toEqual({ data: { note: "from JSON", id: "from-body" } });
    const form = await post(
      echo,
      new URLSearchParams({ note: "from a form", id: "x" }).toString(),
      "application/x-www-form-urlencoded",
    );
    expect(await form.json()).toEqual({ data: { note: "from a form", id: "x" } });
    const withParams = await echo(new Request("http://127.0.0.1/api/test/from-path?note=q&id=from-query", { method: "GET" }), {
      params: Promise.resolve({ id: "from-path" }),
    });
    expect(await withParams.json()).toEqual({ data: { note: "q", id: "from-path" } });
  });

  it("answers an AppError with its status, and anything else with a generic 500", async () => {
    vi.spyOn(console, "error").mockImplementation(() => undefined);
    const missing = routeHandler(
      defineUseCase({
        name: "test.missing",
        permission: "public",
        input: z.object({}),
        run: async () => {
          throw new AppError("not-found", "No such sheet.");
        },
        audit: null,
      }),
    );
    const broken = routeHandler(
      defineUseCase({
        name: "test.broken-route",
        permission: "public",
        input: z.object({}),
        run: async (_input, { tx }) => tx.execute(sql`select * from secret_table`),
        audit: null,
      }),
    );
    const notFound = await missing(new Request("http://127.0.0.1/api/test"), { params: Promise.resolve({}) });
    expect([notFound.status, await notFound.json()]).toEqual([404, { error: { code: "not-found", message: "No such sheet." } }]);
    const failed = await broken(new Request("http://127.0.0.1/api/test"), { params: Promise.resolve({}) });
    const text = await failed.text();
    expect([failed.status, JSON.parse(text)]).toEqual([500, { error: { code: "internal", message: DEFAULT_MESSAGES.internal } }]);
    expect(text).not.toContain("secret_table");
  });

  it("commits a change made through a route with its audit event", async () => {
    const { actor: admin, password } = await createTestUser({ role: "admin" });
    const headers = await signInHeaders(admin.email, password);
    const { actor: target } = await createTestUser({ role: "lead", deactivated: true });
    const change = routeHandler(reactivation("nowhere", uniqueEmail("route")));
    const response = await post(change, JSON.stringify({ userId: target.id }), "application/json", headers);
    expect(response.status).toBe(200);
    expect(await response.json()).toEqual({ data: { userId: target.id, email: target.email, jobId: expect.any(String) } });
    expect((await userRow(target.id)).deactivatedAt).toBeNull();
    const [event] = await auditEventsFor({ action: "users.reactivate", subject: `user:${target.id}` });
    expect(event).toMatchObject({ actorId: admin.id, details: { email: target.email } });
  });
});
