// Refused and failed calls: text with control or bidirectional-control characters and over-long
// addresses are refused with a sentence and change nothing; a call refused for the caller's role and a
// failed invitation acceptance leave an audit event; every audit event a call writes carries the
// client's address.
import { describe, expect, it } from "vitest";
import { AppError } from "@/lib/domain/errors";
import { PLAIN_TEXT_MESSAGE } from "@/lib/domain/schemas/text";
import { acceptInvitation } from "@/lib/use-cases/invitations";
import { inviteUser, setUserRole } from "@/lib/use-cases/people";
import { runUseCase } from "@/lib/use-cases/run";
import { expectRowsUnchanged, snapshotRows } from "../support/snapshot";
import { auditEventsFor, createTestUser, uniqueEmail } from "./helpers/people";

async function refusal(promise: Promise<unknown>): Promise<AppError> {
  const error = await promise.then(
    () => null,
    (thrown: unknown) => thrown,
  );
  expect(error).toBeInstanceOf(AppError);
  return error as AppError;
}

describe("text a person types", () => {
  it.each([
    ["a NUL byte", "Dana\u0000 Example"],
    ["a right-to-left override (shows 'Engineer · admin' as 'reenignE · admin')", "\u202eEngineer"],
    ["a first-strong isolate", "Dana \u2068Example"],
    ["a newline", "Dana\nExample"],
  ])("a name with %s is refused with a sentence and nothing is written", async (_what, name) => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    const before = await snapshotRows();
    const error = await refusal(
      runUseCase(inviteUser, { actor: admin, input: { email: uniqueEmail("hidden"), name, role: "engineer" } }),
    );
    expect(error.code).toBe("invalid-input");
    expect(error.fieldErrors).toEqual({ name: [PLAIN_TEXT_MESSAGE] });
    await expectRowsUnchanged(before);
  });

  it("an invitation e-mail longer than 254 characters is refused with a sentence", async () => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    const email = `${"a".repeat(64)}@${"b".repeat(63)}.${"c".repeat(63)}.${"d".repeat(54)}.example`;
    expect(email.length).toBe(255);
    const before = await snapshotRows();
    const error = await refusal(
      runUseCase(inviteUser, { actor: admin, input: { email, name: "Long Address", role: "engineer" } }),
    );
    expect(error.fieldErrors).toEqual({ email: ["An e-mail address has at most 254 characters. Check what you typed."] });
    await expectRowsUnchanged(before);
  });
});

describe("refusals are audited", () => {
  it("an engineer trying to change a role is refused, and the refusal is in the audit trail with their address", async () => {
    const { actor: engineer } = await createTestUser({ role: "engineer", label: "climber" });
    const before = await snapshotRows();
    const error = await refusal(
      runUseCase(setUserRole, { actor: engineer, input: { userId: engineer.id, role: "admin" }, ipAddress: "203.0.113.50" }),
    );
    expect(error.code).toBe("forbidden");
    await expectRowsUnchanged(before, {
      except: [
        {
          table: "audit_events",
          change: "added",
          why: "a call refused for the caller's role is audited",
          where: (row) => row.action === "access.refused" && row.actor_id === engineer.id,
        },
      ],
    });
    const [event] = await auditEventsFor({ action: "access.refused", actorEmail: engineer.email });
    expect(event).toMatchObject({
      actorId: engineer.id,
      ipAddress: "203.0.113.50",
      details: { useCase: "users.set-role", permission: "users.set-role" },
    });
  });

  it("nobody signed in: refused without an event (there is no one to name)", async () => {
    const before = await snapshotRows();
    expect((await refusal(runUseCase(setUserRole, { actor: null, input: { userId: "x", role: "admin" } }))).code).toBe(
      "unauthenticated",
    );
    await expectRowsUnchanged(before);
  });

  it("a failed invitation acceptance leaves an event, without the token", async () => {
    const token = "unknown-token-abcdefghijklmnopqrstuvwxyz";
    const before = await snapshotRows();
    const error = await refusal(
      runUseCase(acceptInvitation, {
        actor: null,
        input: { token, password: "a-long-password-1", confirmPassword: "a-long-password-1" },
        ipAddress: "203.0.113.51",
      }),
    );
    expect(error.code).toBe("not-found");
    const changes = await expectRowsUnchanged(before, {
      except: [
        {
          table: "audit_events",
          change: "added",
          why: "a failed acceptance is audited",
          where: (row) => row.action === "invitations.accept.failed" && row.ip_address === "203.0.113.51",
        },
      ],
    });
    expect(JSON.stringify(changes)).not.toContain(token);
    const [event] = changes.map((change) => change.after);
    expect(event).toMatchObject({ actor_id: null, details: { reason: "not-found", message: error.message } });
  });

  it("an admin's change records the client's address", async () => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    const email = uniqueEmail("addressed");
    await runUseCase(inviteUser, {
      actor: admin,
      input: { email, name: "Addressed Person", role: "engineer" },
      ipAddress: "203.0.113.52",
    });
    const [event] = await auditEventsFor({ action: "users.invite", actorEmail: admin.email });
    expect(event).toMatchObject({ actorId: admin.id, ipAddress: "203.0.113.52", details: { email, role: "engineer" } });
  });
});
