// Managing people: roles, deactivation (which ends open sessions and blocks sign-in), reactivation,
// and the rule that the firm always keeps one active admin.
import { and, eq, isNull, ne } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import * as schema from "@/db/schema";
import type { Actor } from "@/lib/domain/actor";
import { ACCOUNT_DEACTIVATED_MESSAGE, auth, handleAuthRequest } from "@/lib/auth/server";
import { getActorFromHeaders } from "@/lib/auth/session";
import { runInTransaction } from "@/lib/data/transaction";
import { listUsers } from "@/lib/data/users";
import { deactivateUser, listPeople, reactivateUser, setUserRole } from "@/lib/use-cases/people";
import { runUseCase } from "@/lib/use-cases/run";
import { expectNoChangeFrom, refusalAudited, refusalWrites, type ExpectedChange } from "../support/snapshot";
import { auditEventsFor, createTestUser, sessionCount, signInHeaders, uniqueIp } from "./helpers/people";

const BASE = (process.env.BETTER_AUTH_URL ?? "http://127.0.0.1:3000").replace(/\/+$/, "");

class Rollback extends Error {}

/** The one write a refused sign-in of a deactivated account makes: its audit event. */
function deactivatedSignInAudited(email: string): ExpectedChange {
  return {
    table: "audit_events",
    change: "added",
    why: "a refused sign-in is audited (lib/auth/server.ts)",
    where: (row) =>
      row.action === "auth.sign-in.failed" &&
      row.actor_email === email &&
      (row.details as { reason?: string }).reason === "ACCOUNT_DEACTIVATED",
  };
}

/** Runs `work` in a transaction that is always rolled back, so a test can shape the whole user table. */
async function withRollback(work: (tx: Parameters<Parameters<typeof runInTransaction>[0]>[0]) => Promise<void>) {
  await expect(
    runInTransaction(async (tx) => {
      await work(tx);
      throw new Rollback();
    }),
  ).rejects.toBeInstanceOf(Rollback);
}

describe("deactivation", () => {
  it("ends an open session at once and blocks the next sign-in with a clear message", async () => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    const { actor, password } = await createTestUser({ role: "engineer" });
    const headers = await signInHeaders(actor.email, password);
    expect(await getActorFromHeaders(headers)).toEqual({ ...actor, sessionId: expect.any(String) });

    const result = await runUseCase(deactivateUser, { actor: admin, input: { userId: actor.id } });
    expect(result).toMatchObject({ user: { id: actor.id, status: "deactivated" }, sessionsEnded: 1 });
    expect(await sessionCount(actor.id)).toBe(0);
    expect(await getActorFromHeaders(headers)).toBeNull();
    expect(await auth.api.getSession({ headers })).toBeNull();

    await expectNoChangeFrom(
      () =>
        expect(auth.api.signInEmail({ body: { email: actor.email, password } })).rejects.toMatchObject({
          body: { code: "ACCOUNT_DEACTIVATED", message: ACCOUNT_DEACTIVATED_MESSAGE },
        }),
      { except: [deactivatedSignInAudited(actor.email)] },
    );
    expect(await sessionCount(actor.id)).toBe(0);
    const failed = await auditEventsFor({ action: "auth.sign-in.failed", actorEmail: actor.email });
    expect(failed.map((e) => e.details.reason)).toEqual(["ACCOUNT_DEACTIVATED"]);
    const deactivated = await auditEventsFor({ action: "users.deactivate", subject: `user:${actor.id}` });
    expect(deactivated.map((e) => [e.actorId, e.details])).toEqual([[admin.id, { email: actor.email, sessionsEnded: 1 }]]);

    // Through the HTTP endpoint the browser uses, too; the attempt also counts against the three limits.
    const ip = uniqueIp();
    const response = await expectNoChangeFrom(
      () =>
        handleAuthRequest(
          new Request(`${BASE}/api/auth/sign-in/email`, {
            method: "POST",
            headers: { "content-type": "application/json", origin: BASE, "x-gusset-client-address": ip },
            body: JSON.stringify({ email: actor.email, password }),
          }),
        ),
      {
        except: [
          deactivatedSignInAudited(actor.email),
          {
            table: "rate_limit",
            change: "added or changed",
            why: "per-account-and-address sign-in limit",
            where: (row) => row.key === `gusset:sign-in|${ip}|${actor.email}`,
          },
          {
            table: "rate_limit",
            change: "added or changed",
            why: "per-account sign-in limit, from any address",
            where: (row) => row.key === `gusset:sign-in-account|${actor.email}`,
          },
          {
            table: "rate_limit",
            change: "added or changed",
            why: "better-auth's per-address limit",
            where: (row) => row.key === `${ip}|/sign-in/email`,
          },
        ],
      },
    );
    expect(response.status).toBe(403);
    expect((await response.json()).message).toBe(ACCOUNT_DEACTIVATED_MESSAGE);
  });

  it("a session whose user is marked deactivated reads as signed out even if the row survived", async () => {
    const { actor, password } = await createTestUser({ role: "lead" });
    const headers = await signInHeaders(actor.email, password);
    await runInTransaction(async (tx) => {
      await tx.update(schema.user).set({ deactivatedAt: new Date() }).where(eq(schema.user.id, actor.id));
    });
    expect(await sessionCount(actor.id)).toBe(1);
    expect(await getActorFromHeaders(headers)).toBeNull();
  });

  it("reactivation lets the person sign in again", async () => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    const { actor, password } = await createTestUser({ role: "auditor", deactivated: true });
    await expect(runUseCase(reactivateUser, { actor: admin, input: { userId: actor.id } })).resolves.toMatchObject({
      id: actor.id,
      status: "active",
    });
    expect((await auth.api.signInEmail({ body: { email: actor.email, password } })).user.id).toBe(actor.id);
    await expectNoChangeFrom(() =>
      expect(runUseCase(reactivateUser, { actor: admin, input: { userId: actor.id } })).rejects.toMatchObject({
        code: "conflict",
        message: `${actor.name} is already active.`,
      }),
    );
  });

  it("only an admin may deactivate", async () => {
    const { actor: target, password } = await createTestUser({ role: "engineer" });
    await signInHeaders(target.email, password);
    for (const role of ["lead", "engineer", "auditor", null] as const) {
      const actor = role ? (await createTestUser({ role })).actor : null;
      const code = role ? "forbidden" : "unauthenticated";
      await expectNoChangeFrom(
        () => expect(runUseCase(deactivateUser, { actor, input: { userId: target.id } })).rejects.toMatchObject({ code }),
        { except: refusalWrites(code, actor, "users.deactivate") },
      );
      await expectNoChangeFrom(
        () => expect(runUseCase(reactivateUser, { actor, input: { userId: target.id } })).rejects.toMatchObject({ code }),
        { except: refusalWrites(code, actor, "users.reactivate") },
      );
    }
    // The target's open session survived every refusal.
    expect(await sessionCount(target.id)).toBe(1);
  });
});

describe("roles", () => {
  it("an admin changes a role, and the change is audited with before and after", async () => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    const { actor } = await createTestUser({ role: "engineer" });
    await expect(runUseCase(setUserRole, { actor: admin, input: { userId: actor.id, role: "lead" } })).resolves.toMatchObject({
      user: { id: actor.id, role: "lead" },
      previousRole: "engineer",
    });
    const [event] = await auditEventsFor({ action: "users.set-role", subject: `user:${actor.id}` });
    expect(event).toMatchObject({ actorId: admin.id, details: { from: "engineer", to: "lead" } });
  });

  it("setting the role a person already has changes nothing and writes no event", async () => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    const { actor } = await createTestUser({ role: "auditor" });
    const result = await expectNoChangeFrom(() =>
      runUseCase(setUserRole, { actor: admin, input: { userId: actor.id, role: "auditor" } }),
    );
    expect(result).toMatchObject({ user: { id: actor.id, role: "auditor" }, previousRole: "auditor" });
  });

  it("no one else may change a role", async () => {
    const { actor: target } = await createTestUser({ role: "engineer" });
    for (const role of ["lead", "engineer", "auditor"] as const) {
      const { actor } = await createTestUser({ role });
      await expectNoChangeFrom(
        () =>
          expect(runUseCase(setUserRole, { actor, input: { userId: target.id, role: "admin" } })).rejects.toMatchObject({
            code: "forbidden",
          }),
        { except: [refusalAudited(actor.id, "users.set-role")] },
      );
    }
    await expectNoChangeFrom(() =>
      expect(runUseCase(setUserRole, { actor: null, input: { userId: target.id, role: "admin" } })).rejects.toMatchObject({
        code: "unauthenticated",
      }),
    );
  });

  it("answers an unknown person with not-found", async () => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    await expectNoChangeFrom(() =>
      expect(runUseCase(setUserRole, { actor: admin, input: { userId: "no-such-user", role: "lead" } })).rejects.toMatchObject({
        code: "not-found",
        message: "That person no longer exists.",
      }),
    );
  });

  it("lists people as small records without secrets", async () => {
    const { actor: auditor } = await createTestUser({ role: "auditor" });
    const { people } = await runUseCase(listPeople, { actor: auditor, input: {} });
    expect(people).toEqual(await listUsers());
    const me = people.find((p) => p.id === auditor.id);
    expect(me && Object.keys(me).sort()).toEqual(["createdAt", "deactivatedAt", "email", "id", "name", "role", "status"]);
    for (const role of ["lead", "engineer"] as const) {
      const { actor } = await createTestUser({ role });
      await expectNoChangeFrom(
        () => expect(runUseCase(listPeople, { actor, input: {} })).rejects.toMatchObject({ code: "forbidden" }),
        {
          except: [refusalAudited(actor.id, "people.list")],
        },
      );
    }
    await expectNoChangeFrom(() =>
      expect(runUseCase(listPeople, { actor: null, input: {} })).rejects.toMatchObject({ code: "unauthenticated" }),
    );
  });
});

describe("the last active admin", () => {
  it("cannot be demoted or deactivated, not even by themselves; with a second admin they can", async () => {
    const { actor: last } = await createTestUser({ role: "admin", label: "last-admin" });
    const { actor: other } = await createTestUser({ role: "admin", label: "other-admin" });
    await withRollback(async (tx) => {
      // Inside this transaction only `last` is an active admin (rolled back afterwards).
      await tx
        .update(schema.user)
        .set({ deactivatedAt: new Date() })
        .where(and(eq(schema.user.role, "admin"), isNull(schema.user.deactivatedAt), ne(schema.user.id, last.id)));
      const message = /last active admin/;
      await expect(runUseCase(setUserRole, { actor: last, input: { userId: last.id, role: "engineer" } })).rejects.toMatchObject({
        code: "conflict",
        message: expect.stringMatching(message),
      });
      await expect(runUseCase(deactivateUser, { actor: last, input: { userId: last.id } })).rejects.toMatchObject({
        code: "conflict",
        message: expect.stringMatching(message),
      });
      const [still] = await tx.select().from(schema.user).where(eq(schema.user.id, last.id));
      expect(still).toMatchObject({ role: "admin", deactivatedAt: null });

      // A second active admin lifts the rule.
      await tx.update(schema.user).set({ deactivatedAt: null }).where(eq(schema.user.id, other.id));
      const asOther: Actor = other;
      await expect(
        runUseCase(setUserRole, { actor: asOther, input: { userId: last.id, role: "engineer" } }),
      ).resolves.toMatchObject({
        user: { id: last.id, role: "engineer" },
        previousRole: "admin",
      });
      // Now `other` is the last one.
      await expect(runUseCase(deactivateUser, { actor: asOther, input: { userId: other.id } })).rejects.toMatchObject({
        code: "conflict",
      });
    });
  });
});
