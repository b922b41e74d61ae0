// Audit events in words (issue 9, item 1): who acted on whom, never a raw id; a role change says from
// which role to which when that was recorded; a subject no longer on record is named plainly.
import { describe, expect, it } from "vitest";
import {
  auditActorOf,
  auditSentence,
  auditSentenceParts,
  auditSubjectOf,
  type AuditSentenceEvent,
} from "@/lib/domain/audit-sentence";
import { AUDIT_ACTION_LABELS, type AuditAction } from "@/lib/domain/audit-actions";

const ines = { actorName: "Ines Okafor-Lind", actorEmail: "ines@marrowby-fenn.example" };
const sam = { subject: "user:6hJ2kQ9xPzL0", subjectName: "Sam Reed", subjectEmail: "sam@marrowby-fenn.example" };

function event(overrides: Partial<AuditSentenceEvent>): AuditSentenceEvent {
  return {
    action: "users.reactivate",
    actorName: null,
    actorEmail: null,
    subject: null,
    subjectName: null,
    subjectEmail: null,
    details: {},
    ...overrides,
  };
}

describe("auditSentence", () => {
  it.each<[string, Partial<AuditSentenceEvent>, string]>([
    [
      "a library's publication names it, its version, its size and its author",
      {
        action: "libraries.publish",
        ...ines,
        details: {
          slug: "firm-sections",
          title: "Firm sections",
          number: 2,
          entries: 27,
          authorName: "Sam Reed",
          supersedes: [1],
        },
      },
      "Ines Okafor-Lind approved and published the library Firm sections version 2 (27 entries) by Sam Reed, superseding version 1",
    ],
    [
      "an entry's withdrawal names the entry, the library's version and why",
      {
        action: "libraries.entry.withdraw",
        ...ines,
        details: { slug: "firm-sections", number: 1, entryKey: "GI 200x100x8", reason: "tf is 8.5 mm" },
      },
      "Ines Okafor-Lind withdrew GI 200x100x8 from the library firm-sections version 1: tf is 8.5 mm",
    ],
    [
      "a library event that names no library still reads",
      { action: "libraries.withdraw", ...ines, details: {} },
      "Ines Okafor-Lind withdrew a library version ?: no reason given",
    ],
    [
      "a deactivation names both people",
      { action: "users.deactivate", ...ines, ...sam, details: { email: sam.subjectEmail, sessionsEnded: 0 } },
      "Ines Okafor-Lind deactivated Sam Reed",
    ],
    [
      "a deactivation that ended sessions counts them",
      { action: "users.deactivate", ...ines, ...sam, details: { email: sam.subjectEmail, sessionsEnded: 2 } },
      "Ines Okafor-Lind deactivated Sam Reed, ending 2 open sessions",
    ],
    [
      "a role change says from which role to which",
      { action: "users.set-role", ...ines, ...sam, details: { email: sam.subjectEmail, from: "engineer", to: "lead" } },
      "Ines Okafor-Lind changed Sam Reed's role from Engineer to Standards lead",
    ],
    [
      "a role change recorded without its old role says only the new one",
      { action: "users.set-role", ...ines, ...sam, details: { email: sam.subjectEmail, to: "auditor" } },
      "Ines Okafor-Lind changed Sam Reed's role to QA auditor",
    ],
    [
      "an invitation names the invited e-mail and role",
      {
        action: "users.invite",
        ...ines,
        subject: "invitation:0b7e3c1e-9a55-4d2b-8f0e-1c2d3e4f5a6b",
        subjectName: "Dana Example",
        subjectEmail: "dana@elsewhere.example",
        details: { email: "dana@elsewhere.example", role: "engineer", replacedInvitations: [] },
      },
      "Ines Okafor-Lind invited dana@elsewhere.example as Engineer",
    ],
    [
      "an invitation that replaced an earlier one says it was cancelled",
      {
        action: "users.invite",
        ...ines,
        subject: "invitation:0b7e3c1e",
        subjectEmail: "dana@elsewhere.example",
        details: { email: "dana@elsewhere.example", role: "auditor", replacedInvitations: ["a1"] },
      },
      "Ines Okafor-Lind invited dana@elsewhere.example as QA auditor, cancelling the earlier invitation",
    ],
    [
      "a cancelled invitation",
      {
        action: "invitations.revoke",
        ...ines,
        subject: "invitation:0b7e3c1e",
        subjectEmail: "dana@elsewhere.example",
        details: { email: "dana@elsewhere.example", role: "engineer" },
      },
      "Ines Okafor-Lind cancelled the invitation to dana@elsewhere.example as Engineer",
    ],
    [
      "an accepted invitation",
      {
        action: "invitations.accept",
        actorName: "Dana Example",
        actorEmail: "dana@elsewhere.example",
        details: { role: "lead", invitedById: "x" },
      },
      "Dana Example accepted the invitation and joined as Standards lead",
    ],
    [
      "a reactivation",
      { action: "users.reactivate", ...ines, ...sam, details: { email: sam.subjectEmail } },
      "Ines Okafor-Lind reactivated Sam Reed",
    ],
    [
      "a sign-in",
      { action: "auth.sign-in", ...ines, subject: "user:1", subjectName: ines.actorName },
      "Ines Okafor-Lind signed in",
    ],
    [
      "a failed sign-in for a known person gives the reason in words",
      {
        action: "auth.sign-in.failed",
        ...ines,
        subject: "user:1",
        subjectName: ines.actorName,
        details: { reason: "INVALID_EMAIL_OR_PASSWORD", knownUser: true },
      },
      "Failed sign-in as Ines Okafor-Lind: wrong password",
    ],
    [
      "a failed sign-in for an address with no account",
      {
        action: "auth.sign-in.failed",
        actorEmail: "nobody@elsewhere.example",
        details: { reason: "INVALID_EMAIL_OR_PASSWORD", knownUser: false },
      },
      "Failed sign-in as nobody@elsewhere.example: no account has this e-mail",
    ],
    [
      "a failed sign-in for a deactivated account",
      { action: "auth.sign-in.failed", ...ines, ...sam, details: { reason: "ACCOUNT_DEACTIVATED", knownUser: true } },
      "Failed sign-in as Sam Reed: the account is deactivated",
    ],
    [
      "an outcome after a withdrawal names the calc, its revision and what was done",
      {
        action: "withdrawals.outcome",
        ...ines,
        details: {
          calc: "C-012",
          letter: "B",
          outcome: "drawings-revised",
          reason: null,
          newRevision: null,
          reference: "S-101 rev C",
        },
      },
      "Ines Okafor-Lind recorded for C-012 rev B after a withdrawal: drawings revised (S-101 rev C)",
    ],
    [
      "a batch re-run says how many runs, on what",
      { action: "withdrawals.batch.start", ...ines, details: { batchId: "b", runs: 12, successor: "beam v2" } },
      "Ines Okafor-Lind started re-running 12 runs on beam v2",
    ],
    [
      "a refused action names the use case and what it needs",
      { action: "access.refused", ...ines, details: { useCase: "audit.list", permission: "audit.read" } },
      "Ines Okafor-Lind was refused audit.list (it needs audit.read)",
    ],
    [
      "a reproduction says how it was made and whether it came out the same",
      {
        action: "runs.reproduce",
        ...ines,
        details: {
          runId: "0d8f3c1a-5b7e-4c2d-9a10-7f6e5d4c3b2a",
          mode: "current",
          bundleSha256: "ab".repeat(32),
          identical: false,
          differing: 2,
        },
      },
      "Ines Okafor-Lind reproduced run 0d8f3c1a with today's bundle: 2 outputs differ",
    ],
    [
      "a refused reproduction gives the reason",
      {
        action: "runs.reproduce.refused",
        ...ines,
        details: {
          runId: "0d8f3c1a-5b7e-4c2d-9a10-7f6e5d4c3b2a",
          mode: "as-issued",
          bundleSha256: "ab".repeat(32),
          reason: "the stored bundle's bytes do not match its sha256",
        },
      },
      "Ines Okafor-Lind could not reproduce run 0d8f3c1a as issued: the stored bundle's bytes do not match its sha256",
    ],
    [
      "the seed is Gusset's own doing",
      { action: "system.seed", details: { firm: "Marrowby Fenn Structural", users: 4, projects: 1 } },
      "Gusset set up the demo firm Marrowby Fenn Structural with 4 people and 1 job",
    ],
    [
      "an unused invitation link has no actor",
      { action: "invitations.accept.failed", details: { reason: "conflict", message: "This invitation has expired." } },
      "An invitation link could not be used: This invitation has expired.",
    ],
  ])("%s", (_name, overrides, expected) => {
    expect(auditSentence(event(overrides))).toBe(expected);
  });

  it("says plainly when the person acted on is no longer on record", () => {
    const gone = event({
      action: "users.deactivate",
      ...ines,
      subject: "user:6hJ2kQ9xPzL0",
      details: { email: "old@x.example" },
    });
    expect(auditSentence(gone)).toBe("Ines Okafor-Lind deactivated a deleted account (old@x.example)");
    const unknown = event({ action: "users.reactivate", ...ines, subject: "user:6hJ2kQ9xPzL0", details: {} });
    expect(auditSentence(unknown)).toBe("Ines Okafor-Lind reactivated an unknown account");
    expect(auditSubjectOf(event({ action: "users.invite", subject: "invitation:zz", details: {} }))).toBe(
      "an unknown invitation",
    );
  });

  it("names an actor with no account by the e-mail recorded, and an actor with nothing recorded as someone", () => {
    expect(auditActorOf(event({ actorEmail: "typed@x.example" }))).toEqual({ person: "typed@x.example", email: null });
    expect(auditActorOf(event({}))).toBe("Someone");
    expect(auditActorOf(event({ ...ines }))).toEqual({ person: ines.actorName, email: ines.actorEmail });
  });

  it("never puts a raw id in a sentence, for any action this version knows", () => {
    for (const action of Object.keys(AUDIT_ACTION_LABELS) as AuditAction[]) {
      const withNames = auditSentence(event({ action, ...ines, ...sam, details: { email: sam.subjectEmail } }));
      const withoutNames = auditSentence(event({ action, subject: "user:6hJ2kQ9xPzL0", details: {} }));
      for (const sentence of [withNames, withoutNames]) {
        expect(sentence, action).not.toContain("6hJ2kQ9xPzL0");
        expect(sentence, action).not.toMatch(/undefined|null|\[object/);
      }
    }
  });

  it("says what a CSV export of the run log held: its filters, or every run", () => {
    const exported = (filters: Record<string, string>) =>
      auditSentence(event({ action: "runs.export", ...ines, details: { filters, asOf: "2026-03-14T09:32:05.123Z" } }));
    expect(exported({ job: "MF-2291", pass: "false" })).toBe(
      "Ines Okafor-Lind exported the run log as CSV (job MF-2291, pass false)",
    );
    expect(exported({})).toBe("Ines Okafor-Lind exported the run log as CSV, every run");
  });

  it("keeps an action it has no sentence for readable: who, then the stored key", () => {
    expect(auditSentence(event({ action: "test.future-kind", ...ines }))).toBe("Ines Okafor-Lind: test.future-kind");
  });

  it("marks the people in the sentence, with their e-mails, so a page can show them", () => {
    const parts = auditSentenceParts(
      event({ action: "users.set-role", ...ines, ...sam, details: { email: sam.subjectEmail, from: "engineer", to: "admin" } }),
    );
    expect(parts.filter((part) => typeof part !== "string")).toEqual([
      { person: "Ines Okafor-Lind", email: "ines@marrowby-fenn.example" },
      { person: "Sam Reed", email: "sam@marrowby-fenn.example" },
    ]);
  });
});
