// What each role may read: the home summary, projects, the audit trail and the demo mailbox. Each
// function checks the permission itself and returns small records.
import { describe, expect, it } from "vitest";
import { pool } from "@/db";
import { DEMO_FIRM_NAME, DEMO_PROJECTS, DEMO_USERS } from "@/db/demo-users";
import { listAuditEvents, recordAuditEvent } from "@/lib/data/audit";
import { getFirmName } from "@/lib/data/firm";
import { getHomeSummary } from "@/lib/data/home";
import { isMailboxEnabled, listCapturedMail } from "@/lib/data/mailbox";
import { listProjects } from "@/lib/data/projects";
import { sendMail } from "@/lib/mail/send-mail";
import { createTestUser, uniqueEmail } from "./helpers/people";
import { waitForMessage } from "../support/mailbox";

/** One number counted straight from the tables, to compare with what the data layer reports. */
async function countInDatabase(query: string): Promise<number> {
  const { rows } = await pool.query<{ n: string }>(query);
  return Number(rows[0].n);
}

describe("home summary", () => {
  it("holds exactly the parts each role may read, with the numbers in the database", async () => {
    const expected = {
      admin: ["audit", "people"],
      lead: ["projects"],
      engineer: ["projects"],
      auditor: ["audit", "people", "projects"],
    } as const;
    for (const role of ["admin", "lead", "engineer", "auditor"] as const) {
      const { actor } = await createTestUser({ role });
      const marker = uniqueEmail("home");
      await recordAuditEvent({ action: "test.home", actorEmail: marker });
      const summary = await getHomeSummary({ actor });
      const parts: readonly string[] = expected[role];
      expect(Object.keys(summary).sort(), role).toEqual(parts);
      if (parts.includes("projects")) {
        // No test makes projects: the demo jobs are all there are, seeded together, newest job number first.
        expect(summary.projects?.count, role).toBe(DEMO_PROJECTS.length);
        expect(summary.projects?.recent.map((p) => p.jobNumber), role).toEqual(DEMO_PROJECTS.map((p) => p.jobNumber).sort().reverse());
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
        // The five newest events, the one just written first.
        expect(summary.audit?.recent, role).toEqual((await listAuditEvents({ actor, limit: 5 })).events);
        expect(summary.audit?.recent[0], role).toMatchObject({ action: "test.home", actorEmail: marker });
      }
    }
    await expect(getHomeSummary({ actor: null })).rejects.toMatchObject({ code: "unauthenticated" });
  });
});

describe("projects", () => {
  it("are read by engineers, leads and auditors, and include the demo jobs", async () => {
    for (const role of ["lead", "engineer", "auditor"] as const) {
      const { actor } = await createTestUser({ role });
      const projects = await listProjects({ actor });
      expect(projects.map((p) => p.jobNumber)).toEqual(["MF-2304", "MF-2291"]);
      // The demo jobs were made by the demo standards lead.
      const lead = DEMO_USERS.find((u) => u.role === "lead")!;
      expect(projects.map(({ id: _id, createdAt: _createdAt, ...rest }) => rest)).toEqual(
        [...DEMO_PROJECTS].reverse().map((p) => ({ ...p, createdByName: lead.name })),
      );
      expect(Object.keys(projects[0]).sort()).toEqual(["client", "createdAt", "createdByName", "id", "jobNumber", "name"]);
    }
    const { actor: admin } = await createTestUser({ role: "admin" });
    await expect(listProjects({ actor: admin })).rejects.toMatchObject({ code: "forbidden" });
  });
});

describe("audit trail", () => {
  it("pages newest first for auditors and admins, and is closed to others", async () => {
    const { actor: auditor } = await createTestUser({ role: "auditor" });
    const marker = uniqueEmail("page");
    for (let i = 0; i < 3; i++) await recordAuditEvent({ action: "test.page", actorEmail: marker, details: { i } });
    const first = await listAuditEvents({ actor: auditor, limit: 2 });
    expect(first.events).toHaveLength(2);
    expect(first.events[0].id).toBeGreaterThan(first.events[1].id);
    expect(first.nextBefore).toBe(first.events[1].id);
    const second = await listAuditEvents({ actor: auditor, limit: 2, before: first.nextBefore! });
    expect(second.events).toHaveLength(2);
    expect(second.events[0].id).toBeLessThan(first.events[1].id);
    expect(first.events.map((e) => e.details)).toEqual([{ i: 2 }, { i: 1 }]);
    expect(first.events[0]).toMatchObject({ action: "test.page", actorEmail: marker, actorId: null, actorName: null, label: "test.page", subject: null });
    expect(second.events[0]).toMatchObject({ action: "test.page", actorEmail: marker, details: { i: 0 } });

    // An admin reads the same trail, page for page.
    const { actor: admin } = await createTestUser({ role: "admin" });
    expect(await listAuditEvents({ actor: admin, limit: 2 })).toEqual(first);
    expect(await listAuditEvents({ actor: admin, limit: 2, before: first.nextBefore! })).toEqual(second);
    for (const role of ["lead", "engineer"] as const) {
      const { actor } = await createTestUser({ role });
      await expect(listAuditEvents({ actor })).rejects.toMatchObject({ code: "forbidden" });
    }
  });
});

describe("demo mailbox", () => {
  it("lists captured e-mails for admins only, while the fake SMTP is in use", async () => {
    expect(await isMailboxEnabled()).toBe(Boolean(process.env.FAKE_MAIL_API_URL));
    const to = uniqueEmail("mailbox");
    await sendMail({ to, subject: "Mailbox check", text: "Plain words.", html: "<p>Plain words.</p>" });
    await waitForMessage({ to });
    const { actor: admin } = await createTestUser({ role: "admin" });
    const mail = await listCapturedMail({ actor: admin });
    expect(mail?.find((m) => m.to.includes(to))).toMatchObject({ subject: "Mailbox check", text: expect.stringContaining("Plain words.") });
    const { actor: auditor } = await createTestUser({ role: "auditor" });
    await expect(listCapturedMail({ actor: auditor })).rejects.toMatchObject({ code: "forbidden" });
  });

  it("is absent when no fake SMTP is configured", async () => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    const saved = process.env.FAKE_MAIL_API_URL;
    delete process.env.FAKE_MAIL_API_URL;
    try {
      expect(await isMailboxEnabled()).toBe(false);
      expect(await listCapturedMail({ actor: admin })).toBeNull();
    } finally {
      if (saved !== undefined) process.env.FAKE_MAIL_API_URL = saved;
    }
  });
});

describe("firm", () => {
  it("has the seeded name", async () => {
    expect(await getFirmName()).toBe(DEMO_FIRM_NAME);
    expect(DEMO_FIRM_NAME).toBe("Marrowby Fenn Structural");
  });
});
