// The audit trail a person can read (issue 9, item 1), against the real PostgreSQL: subjects resolved to
// names and e-mails, filters by actor, action and days in a time zone, sign-ins hidden unless asked for.
// The trail is append-only and shared by every test, so each test acts through people it made itself
// and filters by them.
import { describe, expect, it } from "vitest";
import { db } from "@/db";
import * as schema from "@/db/schema";
import { auditSentence } from "@/lib/domain/audit-sentence";
import { recordAuditEvent } from "@/lib/data/audit";
import { deactivateUser, inviteUser, setUserRole } from "@/lib/use-cases/people";
import { readAuditPeople, readAuditTrail } from "@/lib/use-cases/reads";
import { runUseCase } from "@/lib/use-cases/run";
import { expectNoChangeFrom, refusalWrites } from "../support/snapshot";
import { createTestUser, uniqueEmail } from "./helpers/people";

describe("the filtered audit trail", () => {
  it("names who acted on whom, and filters by actor and action", async () => {
    const { actor: admin } = await createTestUser({ role: "admin", label: "trail-admin" });
    const { actor: auditor } = await createTestUser({ role: "auditor", label: "trail-auditor" });
    const { actor: sam } = await createTestUser({ role: "engineer", label: "trail-sam" });
    const invited = uniqueEmail("trail-invitee");

    await runUseCase(setUserRole, { actor: admin, input: { userId: sam.id, role: "lead" } });
    await runUseCase(inviteUser, { actor: admin, input: { email: invited, name: "Dana Example", role: "auditor" } });
    await runUseCase(deactivateUser, { actor: admin, input: { userId: sam.id } });
    // Sam signed in earlier that day; another admin's change must not show under this admin.
    await recordAuditEvent({
      action: "auth.sign-in",
      actorId: sam.id,
      actorEmail: sam.email,
      subject: `user:${sam.id}`,
      details: {},
    });
    const { actor: otherAdmin } = await createTestUser({ role: "admin", label: "trail-other" });
    await runUseCase(setUserRole, { actor: otherAdmin, input: { userId: sam.id, role: "auditor" } });

    const byAdmin = await runUseCase(readAuditTrail, { actor: auditor, input: { actor: admin.id } });
    expect(byAdmin.events.map((e) => e.action)).toEqual(["users.deactivate", "users.invite", "users.set-role"]);
    expect(byAdmin.events.every((e) => e.actorId === admin.id && e.actorName === admin.name)).toBe(true);
    expect(byAdmin.nextBefore).toBeNull();

    const [deactivation, invitation, roleChange] = byAdmin.events;
    // The person acted on, by name and e-mail from the user table; the invitation by the invited e-mail.
    expect(deactivation).toMatchObject({ subject: `user:${sam.id}`, subjectName: sam.name, subjectEmail: sam.email });
    expect(roleChange).toMatchObject({
      subjectName: sam.name,
      subjectEmail: sam.email,
      details: { from: "engineer", to: "lead" },
    });
    expect(invitation).toMatchObject({ subjectName: "Dana Example", subjectEmail: invited });
    expect(auditSentence(roleChange)).toBe(`${admin.name} changed ${sam.name}'s role from Engineer to Standards lead`);
    expect(auditSentence(deactivation)).toBe(`${admin.name} deactivated ${sam.name}`);
    expect(auditSentence(invitation)).toBe(`${admin.name} invited ${invited} as QA auditor`);

    const roleChanges = await runUseCase(readAuditTrail, { actor: admin, input: { actor: admin.id, action: "users.set-role" } });
    expect(roleChanges.events.map((e) => e.id)).toEqual([roleChange.id]);

    // By action alone: both role changes of Sam, the newest first, each with its own "from".
    const allRoleChanges = await runUseCase(readAuditTrail, { actor: auditor, input: { action: "users.set-role", limit: 200 } });
    const samsChanges = allRoleChanges.events.filter((e) => e.subject === `user:${sam.id}`);
    expect(samsChanges.map((e) => [e.actorId, e.details.from, e.details.to])).toEqual([
      [otherAdmin.id, "lead", "auditor"],
      [admin.id, "engineer", "lead"],
    ]);
    expect(allRoleChanges.events.every((e) => e.action === "users.set-role")).toBe(true);
  });

  it("hides sign-ins unless they are asked for, by the checkbox or by choosing the action", async () => {
    const { actor: auditor } = await createTestUser({ role: "auditor" });
    const { actor: person } = await createTestUser({ role: "engineer", label: "trail-signer" });
    const subject = `user:${person.id}`;
    await recordAuditEvent({ action: "auth.sign-in", actorId: person.id, actorEmail: person.email, subject, details: {} });
    await recordAuditEvent({
      action: "auth.sign-in.failed",
      actorId: person.id,
      actorEmail: person.email,
      subject,
      details: { reason: "INVALID_EMAIL_OR_PASSWORD", knownUser: true },
    });
    await recordAuditEvent({ action: "auth.password-reset", actorId: person.id, actorEmail: person.email, subject, details: {} });

    const actions = async (input: Record<string, unknown>) =>
      (await runUseCase(readAuditTrail, { actor: auditor, input: { actor: person.id, ...input } })).events.map((e) => e.action);
    expect(await actions({})).toEqual(["auth.password-reset"]);
    expect(await actions({ signIns: "1" })).toEqual(["auth.password-reset", "auth.sign-in.failed", "auth.sign-in"]);
    expect(await actions({ action: "auth.sign-in.failed" })).toEqual(["auth.sign-in.failed"]);
    expect(await actions({ action: "auth.sign-in" })).toEqual(["auth.sign-in"]);
  });

  it("filters by whole days in the reader's time zone, both days included", async () => {
    const { actor: auditor } = await createTestUser({ role: "auditor" });
    const { actor: person } = await createTestUser({ role: "engineer", label: "trail-days" });
    // Around midnight in Tokyo (UTC+9 all year, common practice) and in UTC, in a year no other test writes.
    const instants = ["2001-03-14T14:59:59Z", "2001-03-14T15:00:00Z", "2001-03-15T14:59:59Z", "2001-03-15T15:00:00Z"];
    for (const [i, at] of instants.entries()) {
      await db
        .insert(schema.auditEvents)
        .values({ action: "users.reactivate", actorId: person.id, details: { i }, occurredAt: new Date(at) });
    }
    const shown = async (input: Record<string, unknown>) =>
      (await runUseCase(readAuditTrail, { actor: auditor, input: { actor: person.id, ...input } })).events.map(
        (e) => e.details.i,
      );
    expect(await shown({ from: "2001-03-15", to: "2001-03-15", tz: "Asia/Tokyo" })).toEqual([2, 1]);
    expect(await shown({ from: "2001-03-14", to: "2001-03-14" })).toEqual([1, 0]);
    expect(await shown({ from: "2001-03-15" })).toEqual([3, 2]);
    expect(await shown({ to: "2001-03-14", tz: "Asia/Tokyo" })).toEqual([0]);
    expect(await shown({ from: "2001-03-14", to: "2001-03-15", tz: "UTC" })).toEqual([3, 2, 1, 0]);
    expect(await shown({ from: "2001-03-16" })).toEqual([]);
  });

  it("pages with the filters kept", async () => {
    const { actor: auditor } = await createTestUser({ role: "auditor" });
    const { actor: person } = await createTestUser({ role: "engineer", label: "trail-pages" });
    for (let i = 0; i < 3; i++) {
      await recordAuditEvent({ action: "users.reactivate", actorId: person.id, details: { email: `${i}@x.example` } });
      await recordAuditEvent({ action: "auth.sign-in", actorId: person.id, details: {} });
    }
    const input = { actor: person.id, action: "users.reactivate", limit: 2 };
    const first = await runUseCase(readAuditTrail, { actor: auditor, input });
    const second = await runUseCase(readAuditTrail, { actor: auditor, input: { ...input, before: first.nextBefore } });
    expect([...first.events, ...second.events].map((e) => e.details.email)).toEqual([
      "2@x.example",
      "1@x.example",
      "0@x.example",
    ]);
    expect(second.nextBefore).toBeNull();
  });

  it("says plainly when the person or invitation acted on is not on record", async () => {
    const { actor: auditor } = await createTestUser({ role: "auditor" });
    const { actor: admin } = await createTestUser({ role: "admin", label: "trail-ghosts" });
    await recordAuditEvent({
      action: "users.deactivate",
      actorId: admin.id,
      actorEmail: admin.email,
      subject: "user:no-such-person-0001",
      details: { email: "gone@x.example", sessionsEnded: 0 },
    });
    await recordAuditEvent({
      action: "invitations.revoke",
      actorId: admin.id,
      subject: "invitation:00000000-0000-4000-8000-000000000000",
      details: { email: "was-invited@x.example", role: "engineer" },
    });
    const { events } = await runUseCase(readAuditTrail, { actor: auditor, input: { actor: admin.id } });
    expect(events.map((e) => [e.subjectName, e.subjectEmail])).toEqual([
      [null, null],
      [null, null],
    ]);
    expect(events.map(auditSentence)).toEqual([
      `${admin.name} cancelled the invitation to was-invited@x.example as Engineer`,
      `${admin.name} deactivated a deleted account (gone@x.example)`,
    ]);
  });

  it("is read by auditors and admins only, and refuses bad filters as bad input", async () => {
    const { actor: auditor } = await createTestUser({ role: "auditor" });
    const { actor: admin } = await createTestUser({ role: "admin" });
    const people = await runUseCase(readAuditPeople, { actor: auditor, input: {} });
    expect(await runUseCase(readAuditPeople, { actor: admin, input: {} })).toEqual(people);
    expect(people.find((p) => p.id === auditor.id)).toEqual({
      id: auditor.id,
      name: auditor.name,
      email: auditor.email,
      deactivated: false,
    });
    const { actor: leaver } = await createTestUser({ role: "engineer", label: "trail-leaver", deactivated: true });
    expect((await runUseCase(readAuditPeople, { actor: auditor, input: {} })).find((p) => p.id === leaver.id)).toMatchObject({
      deactivated: true,
    });

    for (const role of ["lead", "engineer"] as const) {
      const { actor } = await createTestUser({ role });
      // Each refusal writes only its access.refused event.
      const refuse = (useCase: { name: string }, call: () => Promise<unknown>) =>
        expectNoChangeFrom(() => expect(call()).rejects.toMatchObject({ code: "forbidden" }), {
          except: refusalWrites("forbidden", actor, useCase.name),
        });
      await refuse(readAuditTrail, () => runUseCase(readAuditTrail, { actor, input: {} }));
      await refuse(readAuditPeople, () => runUseCase(readAuditPeople, { actor, input: {} }));
    }
    await expect(runUseCase(readAuditTrail, { actor: null, input: {} })).rejects.toMatchObject({ code: "unauthenticated" });
    await expect(
      runUseCase(readAuditTrail, { actor: auditor, input: { action: "users.explode", from: "2026-02-30" } }),
    ).rejects.toMatchObject({
      code: "invalid-input",
      fieldErrors: { action: ["Choose an action from the list."], from: ["That date does not exist."] },
    });
  });
});
