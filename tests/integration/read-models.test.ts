// What each role may read: the home summary, projects, the audit trail and the demo mailbox. Each
// function checks the permission itself and returns small records.
import { describe, expect, it } from "vitest";
import { listAuditEvents, recordAuditEvent } from "@/lib/data/audit";
import { getFirmName } from "@/lib/data/firm";
import { getHomeSummary } from "@/lib/data/home";
import { isMailboxEnabled, listCapturedMail } from "@/lib/data/mailbox";
import { listProjects } from "@/lib/data/projects";
import { sendMail } from "@/lib/mail/send-mail";
import { createTestUser, uniqueEmail } from "./helpers/people";
import { waitForMessage } from "../support/mailbox";

describe("home summary", () => {
  it("holds exactly the parts each role may read", async () => {
    const expected = {
      admin: ["audit", "people"],
      lead: ["projects"],
      engineer: ["projects"],
      auditor: ["audit", "people", "projects"],
    } as const;
    for (const role of ["admin", "lead", "engineer", "auditor"] as const) {
      const { actor } = await createTestUser({ role });
      const summary = await getHomeSummary({ actor });
      expect(Object.keys(summary).sort(), role).toEqual([...expected[role]]);
      if (summary.projects) expect(summary.projects.count).toBeGreaterThanOrEqual(summary.projects.recent.length);
      if (summary.people) expect(summary.people.admins).toBeGreaterThanOrEqual(1);
    }
    await expect(getHomeSummary({ actor: null })).rejects.toMatchObject({ code: "unauthenticated" });
  });
});

describe("projects", () => {
  it("are read by engineers, leads and auditors, and include the demo jobs", async () => {
    for (const role of ["lead", "engineer", "auditor"] as const) {
      const { actor } = await createTestUser({ role });
      const projects = await listProjects({ actor });
      expect(projects.map((p) => p.jobNumber)).toEqual(expect.arrayContaining(["MF-2291", "MF-2304"]));
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
    expect(second.events[0].id).toBeLessThan(first.events[1].id);
    expect(first.events[0]).toMatchObject({ action: "test.page", actorEmail: marker, label: "test.page", details: { i: 2 } });

    const { actor: admin } = await createTestUser({ role: "admin" });
    await expect(listAuditEvents({ actor: admin })).resolves.toBeTruthy();
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
    expect(await getFirmName()).toBeTruthy();
  });
});
