// What each role may read: the shell, the home summary, jobs, the audit trail and the demo mailbox.
// Each read is a use case (lib/use-cases/reads.ts) whose permission the runner checks; a refused read
// changes nothing. The queries under them (lib/data/) are checked directly for their content.
import { describe, expect, it } from "vitest";
import { db, pool } from "@/db";
import * as schema from "@/db/schema";
import { DEMO_FIRM_NAME, DEMO_JOBS, DEMO_USERS } from "@/db/demo-users";
import type { Actor } from "@/lib/domain/actor";
import { SIGN_IN_ACTIONS, type AuditAction } from "@/lib/domain/audit-actions";
import { forgetServerEnv } from "@/lib/server-env";
import { listAuditEvents, recordAuditEvent } from "@/lib/data/audit";
import { getFirmName } from "@/lib/data/firm";
import { isMailboxEnabled, listCapturedMail } from "@/lib/data/mailbox";
import { listJobs } from "@/lib/data/jobs";
import { sendMail } from "@/lib/mail/send-mail";
import { readAuditTrail, readDemoMailbox, readHome, readShell } from "@/lib/use-cases/reads";
import { readJobs } from "@/lib/use-cases/jobs";
import { runUseCase } from "@/lib/use-cases/run";
import type { UseCase } from "@/lib/use-cases/use-case";
import type { Permission } from "@/lib/domain/permissions";
import type { z } from "zod";
import { expectNoChangeFrom, refusalWrites } from "../support/snapshot";
import { createTestUser, uniqueEmail } from "./helpers/people";
import { waitForMessage } from "../support/mailbox";

/** One number counted straight from the tables, to compare with what the data layer reports. */
async function countInDatabase(query: string): Promise<number> {
  const { rows } = await pool.query<{ n: string }>(query);
  return Number(rows[0].n);
}

/** The read is refused with `code` and changes nothing. */
async function expectReadRefused<P extends Permission, S extends z.ZodType, T>(
  useCase: UseCase<P, S, T>,
  actor: Actor | null,
  code: "unauthenticated" | "forbidden",
  input: unknown = {},
) {
  await expectNoChangeFrom(() => expect(runUseCase(useCase, { actor, input })).rejects.toMatchObject({ code }), {
    except: refusalWrites(code, actor, useCase.name),
  });
}

const fakeMailInUse = Boolean(process.env.FAKE_MAIL_API_URL);

describe("shell", () => {
  it("gives every signed-in role the firm's name and whether the demo mailbox is on, and nobody else", async () => {
    for (const role of ["admin", "lead", "engineer", "auditor"] as const) {
      const { actor } = await createTestUser({ role });
      const shell = await expectNoChangeFrom(() => runUseCase(readShell, { actor, input: {} }));
      expect(shell, role).toEqual({ firmName: DEMO_FIRM_NAME, mailboxEnabled: fakeMailInUse });
    }
    await expectReadRefused(readShell, null, "unauthenticated");
  });
});

describe("home summary", () => {
  it("holds exactly the parts each role may read, with the numbers in the database", async () => {
    const expected = {
      admin: ["audit", "people"],
      lead: ["jobs"],
      engineer: ["jobs"],
      auditor: ["audit", "people", "jobs"],
    } as const;
    for (const role of ["admin", "lead", "engineer", "auditor"] as const) {
      const { actor } = await createTestUser({ role });
      const marker = uniqueEmail("home");
      // A change, then a sign-in after it: the card lists changes, so the sign-in is left off.
      await recordAuditEvent({ action: "users.reactivate", actorEmail: marker, details: { email: marker } });
      await recordAuditEvent({ action: "auth.sign-in", actorEmail: marker, details: {} });
      const summary = await runUseCase(readHome, { actor, input: {} });
      const parts: readonly string[] = expected[role];
      expect(Object.keys(summary).sort(), role).toEqual([...parts, "mailboxEnabled"].sort());
      expect(summary.mailboxEnabled, role).toBe(fakeMailInUse);
      if (parts.includes("jobs")) {
        // Other tests make jobs too: the count is the table's, and the recent ones are the five newest.
        expect(summary.jobs?.count, role).toBe(await countInDatabase("select count(*) as n from jobs"));
        expect(summary.jobs?.recent, role).toEqual(await listJobs({ limit: 5 }));
      }
      if (parts.includes("people")) {
        expect(summary.people, role).toEqual({
          active: await countInDatabase(`select count(*) as n from "user" where deactivated_at is null`),
          deactivated: await countInDatabase(`select count(*) as n from "user" where deactivated_at is not null`),
          admins: await countInDatabase(`select count(*) as n from "user" where deactivated_at is null and role = 'admin'`),
          pendingInvitations: await countInDatabase(
            `select count(*) as n from invitations where accepted_at is null and revoked_at is null and expires_at > now()`,
          ),
        });
      }
      if (parts.includes("audit")) {
        // The five newest events that are not sign-ins, the change just written first.
        const recent = summary.audit?.recent ?? [];
        expect(recent, role).toEqual((await listAuditEvents({ limit: 5, excludeActions: SIGN_IN_ACTIONS })).events);
        expect(recent[0], role).toMatchObject({
          action: "users.reactivate",
          actorEmail: marker,
          label: "Reactivated an account",
        });
        expect(
          recent.filter((event) => SIGN_IN_ACTIONS.includes(event.action as AuditAction)),
          role,
        ).toEqual([]);
      }
    }
    await expectReadRefused(readHome, null, "unauthenticated");
  });
});

describe("jobs", () => {
  it("are read by engineers, leads and auditors, and include the demo jobs", async () => {
    // The demo jobs were made by the demo standards lead, who is their responsible engineer too. No other test
    // makes a job numbered MF-….
    const lead = DEMO_USERS.find((u) => u.role === "lead")!;
    // Other tests' job numbers are random and may hold "MF-" inside (one was AM-MX7BUTMF-1H): the demo's start with it.
    const demoOnly = <T extends { jobNumber: string }>(list: T[]) => list.filter((job) => job.jobNumber.startsWith("MF-"));
    const jobs = demoOnly(await listJobs({ search: "MF-" }));
    expect(jobs.map((p) => p.jobNumber)).toEqual(["MF-2304", "MF-2291"]);
    expect(
      jobs.map(
        ({ id: _id, createdAt: _createdAt, updatedAt: _updatedAt, responsibleEngineerId: _r, runCount: _n, ...rest }) => rest,
      ),
    ).toEqual(
      [...DEMO_JOBS].reverse().map(({ responsible: _role, ...p }) => ({
        ...p,
        status: "active",
        responsibleEngineerName: lead.name,
        createdByName: lead.name,
      })),
    );
    expect(Object.keys(jobs[0]).sort()).toEqual([
      "client",
      "createdAt",
      "createdByName",
      "id",
      "jobNumber",
      "name",
      "responsibleEngineerId",
      "responsibleEngineerName",
      "runCount",
      "site",
      "status",
      "updatedAt",
    ]);
    expect((await listJobs({ search: "mf-2291" })).map((p) => p.jobNumber)).toEqual(["MF-2291"]);

    for (const role of ["lead", "engineer", "auditor"] as const) {
      const { actor } = await createTestUser({ role });
      expect(demoOnly(await runUseCase(readJobs, { actor, input: { q: "MF-" } })), role).toEqual(jobs);
    }
    const { actor: admin } = await createTestUser({ role: "admin" });
    await expectReadRefused(readJobs, admin, "forbidden");
    await expectReadRefused(readJobs, null, "unauthenticated");
  });
});

describe("audit trail", () => {
  it("pages newest first for auditors and admins, and is closed to others", async () => {
    const { actor: auditor } = await createTestUser({ role: "auditor" });
    const marker = uniqueEmail("page");
    // Written raw, with an action no version of Gusset knows: the trail shows its key as its label.
    // One statement, so no other writer's event takes an id between the markers.
    const markers = await db
      .insert(schema.auditEvents)
      .values([0, 1, 2].map((i) => ({ action: "test.page", actorEmail: marker, details: { i } })))
      .returning({ id: schema.auditEvents.id });
    const last = Math.max(...markers.map((m) => m.id));
    // Read from just after the last marker: an event another part of the app writes meanwhile (a sign-in
    // recorded after its response) lands above this page instead of shifting it.
    const top = last + 1;
    const first = await runUseCase(readAuditTrail, { actor: auditor, input: { limit: 2, before: top } });
    expect(first.events).toHaveLength(2);
    expect(first.events[0].id).toBeGreaterThan(first.events[1].id);
    expect(first.nextBefore).toBe(first.events[1].id);
    const second = await runUseCase(readAuditTrail, { actor: auditor, input: { limit: 2, before: first.nextBefore! } });
    expect(second.events).toHaveLength(2);
    expect(second.events[0].id).toBeLessThan(first.events[1].id);
    expect(first.events.map((e) => e.details)).toEqual([{ i: 2 }, { i: 1 }]);
    expect(first.events[0]).toMatchObject({
      action: "test.page",
      actorEmail: marker,
      actorId: null,
      actorName: null,
      label: "test.page",
      subject: null,
    });
    expect(second.events[0]).toMatchObject({ action: "test.page", actorEmail: marker, details: { i: 0 } });
    // The use case serves exactly what the query gives.
    expect(await listAuditEvents({ limit: 2, before: top })).toEqual(first);
    // Below the markers, an event whose id was taken before them may commit between two reads (a sign-in recorded
    // after its response): the second page is compared by its marker.
    const secondMarker = (page: Awaited<ReturnType<typeof listAuditEvents>>) => page.events[0];
    expect(secondMarker(await listAuditEvents({ limit: 2, before: first.nextBefore! }))).toEqual(second.events[0]);

    // An admin reads the same trail, page for page.
    const { actor: admin } = await createTestUser({ role: "admin" });
    expect(await runUseCase(readAuditTrail, { actor: admin, input: { limit: 2, before: top } })).toEqual(first);
    expect(
      secondMarker(await runUseCase(readAuditTrail, { actor: admin, input: { limit: 2, before: first.nextBefore! } })),
    ).toEqual(second.events[0]);
    for (const role of ["lead", "engineer"] as const) {
      const { actor } = await createTestUser({ role });
      await expectReadRefused(readAuditTrail, actor, "forbidden");
    }
    await expectReadRefused(readAuditTrail, null, "unauthenticated");
    // A page size out of range is bad input, not a silently clamped page.
    await expectNoChangeFrom(() =>
      expect(runUseCase(readAuditTrail, { actor: auditor, input: { limit: 500 } })).rejects.toMatchObject({
        code: "invalid-input",
        fieldErrors: { limit: [expect.any(String)] },
      }),
    );
  });

  it("filters by actor in the query", async () => {
    const { actor } = await createTestUser({ role: "engineer" });
    await recordAuditEvent({ action: "auth.sign-in", actorId: actor.id, actorEmail: actor.email, details: {} });
    const { events } = await listAuditEvents({ actorId: actor.id });
    expect(events.map((e) => [e.action, e.actorId, e.actorName])).toEqual([["auth.sign-in", actor.id, actor.name]]);
  });
});

describe("demo mailbox", () => {
  it("lists captured e-mails for admins only, while the fake SMTP is in use", async () => {
    expect(isMailboxEnabled()).toBe(fakeMailInUse);
    const to = uniqueEmail("mailbox");
    await sendMail({ to, subject: "Mailbox check", text: "Plain words.", html: "<p>Plain words.</p>" });
    await waitForMessage({ to });
    expect((await listCapturedMail())?.find((m) => m.to.includes(to))).toMatchObject({
      subject: "Mailbox check",
      text: expect.stringContaining("Plain words."),
    });
    const { actor: admin } = await createTestUser({ role: "admin" });
    const mail = await runUseCase(readDemoMailbox, { actor: admin, input: {} });
    expect(mail?.find((m) => m.to.includes(to))).toMatchObject({
      subject: "Mailbox check",
      text: expect.stringContaining("Plain words."),
    });
    for (const role of ["lead", "engineer", "auditor"] as const) {
      const { actor } = await createTestUser({ role });
      await expectReadRefused(readDemoMailbox, actor, "forbidden");
    }
    await expectReadRefused(readDemoMailbox, null, "unauthenticated");
  });

  it("is absent when no fake SMTP is configured", async () => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    const saved = process.env.FAKE_MAIL_API_URL;
    // Settings are parsed once (lib/server-env.ts): forget them on the way in and on the way out.
    delete process.env.FAKE_MAIL_API_URL;
    forgetServerEnv();
    try {
      expect(isMailboxEnabled()).toBe(false);
      expect(await listCapturedMail()).toBeNull();
      expect(await runUseCase(readDemoMailbox, { actor: admin, input: {} })).toBeNull();
      expect(await runUseCase(readShell, { actor: admin, input: {} })).toEqual({
        firmName: DEMO_FIRM_NAME,
        mailboxEnabled: false,
      });
      expect((await runUseCase(readHome, { actor: admin, input: {} })).mailboxEnabled).toBe(false);
    } finally {
      if (saved !== undefined) process.env.FAKE_MAIL_API_URL = saved;
      forgetServerEnv();
    }
    expect(isMailboxEnabled()).toBe(fakeMailInUse);
  });
});

describe("firm", () => {
  it("has the seeded name", async () => {
    expect(await getFirmName()).toBe(DEMO_FIRM_NAME);
    expect(DEMO_FIRM_NAME).toBe("Marrowby Fenn Structural");
  });
});
