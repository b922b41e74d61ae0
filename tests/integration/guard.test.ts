// The one wrapper, against the real database: who may call, what bad input gets, and that the audit
// event commits with the change and only then.
import { eq } from "drizzle-orm";
import { afterEach, describe, expect, it, vi } from "vitest";
import { z } from "zod";
import { db } from "@/db";
import * as schema from "@/db/schema";
import { guardedAction, guardedRoute } from "@/lib/auth/guard";
import { inviteUserSchema } from "@/lib/data/user-schemas";
import { inviteUser } from "@/lib/data/users";
import { recordAuditEvent } from "@/lib/data/audit";
import { AppError, DEFAULT_MESSAGES } from "@/lib/errors";
import { waitForMessage } from "../support/mailbox";
import { expectRowsUnchanged, snapshotRows } from "../support/snapshot";
import { auditEventsFor, createTestUser, signInHeaders, uniqueEmail } from "./helpers/people";

// Server actions read the request through next/headers; here the "request" is whatever a test sets.
const request = vi.hoisted(() => ({ headers: new Headers() }));
vi.mock("next/headers", () => ({
  headers: async () => request.headers,
  cookies: async () => ({ get: () => undefined, getAll: () => [], set: () => undefined }),
}));

afterEach(() => {
  request.headers = new Headers();
});

const invite = guardedAction({ schema: inviteUserSchema, permission: "users.invite" }, (input, { actor }) =>
  inviteUser({ actor, ...input }),
);

function formData(values: Record<string, string>): FormData {
  const data = new FormData();
  for (const [key, value] of Object.entries(values)) data.append(key, value);
  data.append("$ACTION_ID_abc", ""); // Next adds fields like this; the guard must ignore them
  return data;
}

async function actAs(role: "admin" | "lead" | "engineer" | "auditor") {
  const { actor, password } = await createTestUser({ role });
  request.headers = await signInHeaders(actor.email, password);
  return actor;
}

describe("guardedAction", () => {
  // The guard writes nothing when it refuses (no audit event for a refusal either): no exceptions.
  it("refuses an anonymous visitor with 'unauthenticated' and writes nothing", async () => {
    const before = await snapshotRows();
    const state = await invite(null, formData({ email: uniqueEmail("anon"), name: "Ann Example", role: "engineer" }));
    expect(state).toEqual({ ok: false, error: { code: "unauthenticated", message: "Please sign in to continue." } });
    await expectRowsUnchanged(before);
  });

  it("refuses a role without the permission with 'forbidden' and writes nothing", async () => {
    for (const role of ["lead", "engineer", "auditor"] as const) {
      await actAs(role);
      const before = await snapshotRows();
      const state = await invite(null, formData({ email: uniqueEmail("nope"), name: "Ann Example", role: "engineer" }));
      expect(state).toEqual({ ok: false, error: { code: "forbidden", message: "Your role does not allow this." } });
      await expectRowsUnchanged(before);
    }
  });

  it("answers bad input with field messages, and writes no row and no audit event", async () => {
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

  it("runs the handler for the right role and writes its audit event", async () => {
    const admin = await actAs("admin");
    const email = uniqueEmail("invitee");
    const state = await invite(null, formData({ email: email.toUpperCase(), name: "  Ines Example ", role: "auditor" }));
    expect(state).toMatchObject({ ok: true, data: { email, name: "Ines Example", role: "auditor" } });
    if (!state?.ok) throw new Error("expected success");
    const events = await auditEventsFor({ action: "users.invite", subject: `invitation:${state.data.id}` });
    expect(events).toHaveLength(1);
    expect(events[0]).toMatchObject({ actorId: admin.id, actorEmail: admin.email, details: { email, role: "auditor" } });
    const mail = await waitForMessage({ to: email, subjectIncludes: "invited" });
    expect(mail.text).toContain("/invite/");
  });

  it("accepts a plain object as well as FormData", async () => {
    await actAs("admin");
    const email = uniqueEmail("plain");
    const state = await invite(null, { email, name: "Plain Object", role: "engineer" });
    expect(state).toMatchObject({ ok: true, data: { email } });
  });

  it("rolls back the handler's writes and its audit event when the handler fails", async () => {
    const admin = await actAs("admin");
    const marker = uniqueEmail("rollback");
    const failing = guardedAction(
      { schema: z.object({}), permission: "users.invite", audit: () => ({ action: "test.should-not-exist", subject: marker }) },
      async () => {
        await recordAuditEvent({ actorId: admin.id, action: "test.half-written", subject: marker });
        throw new AppError("conflict", "Someone changed this first.");
      },
    );
    const before = await snapshotRows();
    const state = await failing(null, {});
    expect(state).toEqual({ ok: false, error: { code: "conflict", message: "Someone changed this first." } });
    expect(await db.select().from(schema.auditEvents).where(eq(schema.auditEvents.subject, marker))).toEqual([]);
    await expectRowsUnchanged(before);
  });

  it("hides an unexpected error behind a generic message", async () => {
    await actAs("admin");
    const spy = vi.spyOn(console, "error").mockImplementation(() => undefined);
    const broken = guardedAction({ schema: z.object({}), permission: "users.read" }, async () => {
      throw new Error('relation "secret_table" does not exist');
    });
    const state = await broken(null, {});
    expect(state).toEqual({ ok: false, error: { code: "internal", message: DEFAULT_MESSAGES.internal } });
    expect(JSON.stringify(state)).not.toContain("secret_table");
    spy.mockRestore();
  });

  it("writes the audit event named by the options, in the same transaction", async () => {
    const admin = await actAs("admin");
    const marker = uniqueEmail("audited");
    const audited = guardedAction(
      {
        schema: z.object({ note: z.string() }),
        permission: "users.read",
        audit: ({ input, result }) => ({ action: "test.audited", subject: marker, details: { note: input.note, result } }),
      },
      async () => 42,
    );
    expect(await audited(null, { note: "hello" })).toEqual({ ok: true, data: 42 });
    const events = await auditEventsFor({ action: "test.audited", subject: marker });
    expect(events).toHaveLength(1);
    expect(events[0]).toMatchObject({ actorId: admin.id, details: { note: "hello", result: 42 } });
  });
});

describe("guardedRoute", () => {
  const route = guardedRoute(
    { schema: z.object({ limit: z.coerce.number().int().max(10) }), permission: "audit.read" },
    async (input, { actor }) => ({ limit: input.limit, role: actor?.role }),
  );
  const call = (headers: Headers, query = "limit=5") =>
    route(new Request(`http://127.0.0.1/api/test?${query}`, { headers }), { params: Promise.resolve({}) });

  it("answers 401 JSON to an anonymous caller and writes nothing", async () => {
    const before = await snapshotRows();
    const response = await call(new Headers());
    expect(response.status).toBe(401);
    expect(await response.json()).toEqual({ error: { code: "unauthenticated", message: "Please sign in to continue." } });
    await expectRowsUnchanged(before);
  });

  it("answers 403 JSON to a role without the permission and writes nothing", async () => {
    const { actor, password } = await createTestUser({ role: "engineer" });
    const headers = await signInHeaders(actor.email, password);
    const before = await snapshotRows();
    const response = await call(headers);
    expect(response.status).toBe(403);
    expect(await response.json()).toEqual({ error: { code: "forbidden", message: "Your role does not allow this." } });
    await expectRowsUnchanged(before);
  });

  it("answers 422 with field messages to bad input", async () => {
    const { actor, password } = await createTestUser({ role: "auditor" });
    const headers = await signInHeaders(actor.email, password);
    const before = await snapshotRows();
    const response = await call(headers, "limit=500");
    expect(response.status).toBe(422);
    const body = await response.json();
    expect(body.error.code).toBe("invalid-input");
    expect(Object.keys(body.error.fieldErrors)).toEqual(["limit"]);
    await expectRowsUnchanged(before);
  });

  it("answers 400 to a body that is not JSON", async () => {
    const post = guardedRoute({ schema: z.object({ a: z.string() }), permission: "public" }, async () => "never");
    const response = await post(
      new Request("http://127.0.0.1/api/test", { method: "POST", body: "{not json", headers: { "content-type": "application/json" } }),
      { params: Promise.resolve({}) },
    );
    expect(response.status).toBe(400);
    expect((await response.json()).error.code).toBe("bad-request");
  });

  it("answers 200 { data } to the right role", async () => {
    const { actor, password } = await createTestUser({ role: "auditor" });
    const response = await call(await signInHeaders(actor.email, password));
    expect(response.status).toBe(200);
    expect(await response.json()).toEqual({ data: { limit: 5, role: "auditor" } });
  });
});
