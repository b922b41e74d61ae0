// Invitation → e-mail (really received by the fake SMTP, sent by the worker after the commit) → accept →
// sign in; and every way a link can be wrong (unknown, expired, used, withdrawn), each with a clear
// message and nothing changed.
import { eq } from "drizzle-orm";
import { describe, expect, it, vi } from "vitest";
import { db } from "@/db";
import * as schema from "@/db/schema";
import { acceptInvitationAction } from "@/app/(auth)/invite/[token]/actions";
import { auth } from "@/lib/auth/server";
import { INVITATION_MESSAGES } from "@/lib/domain/schemas/invitations";
import { hashInvitationToken, listPendingInvitations } from "@/lib/data/invitations";
import { acceptInvitation, lookupInvitation } from "@/lib/use-cases/invitations";
import { inviteUser, listPeople, revokeInvitation } from "@/lib/use-cases/people";
import { runUseCase } from "@/lib/use-cases/run";
import { acceptFailureAudited, expectNoChangeFrom, refusalWrites, type ExpectedChange } from "../support/snapshot";
import { auditEventsFor, createTestUser, inviteWithToken, sessionCount, uniqueEmail } from "./helpers/people";

vi.mock("next/headers", () => ({ headers: async () => new Headers(), cookies: async () => ({ set: () => undefined }) }));

const NEW_PASSWORD = "a-long-enough-password";

async function inviteAndReadToken(role: "engineer" | "lead" | "auditor" | "admin" = "engineer") {
  const invited = await inviteWithToken(role);
  expect(invited.link).toMatch(/\/invite\/[A-Za-z0-9_-]{43}$/);
  return invited;
}

/** What the invitation page shows for a link (public: the link is the credential). */
function lookup(token: string) {
  return runUseCase(lookupInvitation, { actor: null, input: { token } });
}

/** Accepting through the use case, as the public form's action does (nobody is signed in). */
function accept(token: string, password = NEW_PASSWORD) {
  return runUseCase(acceptInvitation, { actor: null, input: { token, password, confirmPassword: password } });
}

/** The public form's own server action; on success it signs the person in and redirects (throws NEXT_REDIRECT). */
function submitAcceptForm(input: { token: string; password: string; confirmPassword: string }) {
  return acceptInvitationAction(null, input);
}

/**
 * The call is refused with this code and message, and no row of any table changes except the refusal's own
 * audit event where there is one (a failed acceptance; a signed-in person refused for their role); no job.
 */
async function expectRefusal(call: () => Promise<unknown>, code: string, message: string, except: ExpectedChange[] = []) {
  await expectNoChangeFrom(() => expect(call()).rejects.toMatchObject({ code, message }), { except });
}

/** Accepting is refused with this code and message; only the failed acceptance's audit event is written. */
async function expectAcceptRefused(token: string, code: string, message: string, password?: string) {
  await expectRefusal(() => accept(token, password), code, message, [acceptFailureAudited(code)]);
}

describe("invitations", () => {
  it("e-mails a link that lets the invitee set a password, become a user with the role, and sign in", async () => {
    const { admin, email, invitation, token, mail } = await inviteAndReadToken("lead");
    expect(invitation).toMatchObject({ email, name: "Dana Example", role: "lead", replacedInvitations: [] });
    expect(mail.text).toContain("Dana Example");
    expect(mail.text).toContain("Standards lead");
    expect(mail.text).toContain(admin.name);

    // Only the hash is stored.
    const [row] = await db.select().from(schema.invitations).where(eq(schema.invitations.id, invitation.id));
    expect(row.tokenHash).toBe(hashInvitationToken(token));
    expect(row.tokenHash).not.toContain(token);
    expect(row.expiresAt.getTime() - row.createdAt.getTime()).toBeCloseTo(7 * 24 * 3600 * 1000, -4);

    expect(await lookup(token)).toMatchObject({ email, name: "Dana Example", role: "lead", status: "valid" });
    const accepted = await accept(token);
    expect(accepted).toEqual({
      userId: expect.any(String),
      email,
      invitationId: invitation.id,
      role: "lead",
      invitedById: admin.id,
    });

    const [created] = await db.select().from(schema.user).where(eq(schema.user.email, email));
    expect(created).toMatchObject({ id: accepted.userId, name: "Dana Example", role: "lead", deactivatedAt: null });
    const signedIn = await auth.api.signInEmail({ body: { email, password: NEW_PASSWORD } });
    expect(signedIn.user.email).toBe(email);
    expect(await lookup(token)).toMatchObject({ status: "used" });
    // The new person is the event's actor: nobody was signed in when the link was used.
    const events = await auditEventsFor({ action: "invitations.accept", subject: `invitation:${invitation.id}` });
    expect(events.map((e) => [e.actorId, e.actorEmail, e.details])).toEqual([
      [accepted.userId, email, { role: "lead", invitedById: admin.id }],
    ]);
  });

  it("signs the new user in once the rows are committed, then lets Next redirect home", async () => {
    const { email, token } = await inviteAndReadToken();
    // better-auth reads the new rows over its own connection: a sign-in before the commit would fail.
    await expect(submitAcceptForm({ token, password: NEW_PASSWORD, confirmPassword: NEW_PASSWORD })).rejects.toMatchObject({
      digest: expect.stringMatching(/^NEXT_REDIRECT;[a-z]+;\/home;/),
    });
    const [created] = await db.select().from(schema.user).where(eq(schema.user.email, email));
    expect(await sessionCount(created.id)).toBe(1);
    expect(await auditEventsFor({ action: "auth.sign-in", actorEmail: email })).toHaveLength(1);
  });

  it("refuses a used link with a clear message and changes nothing", async () => {
    const { token } = await inviteAndReadToken();
    await accept(token);
    await expectAcceptRefused(token, "conflict", INVITATION_MESSAGES.used, "another-password-1");
  });

  it("refuses an expired link with a clear message and changes nothing", async () => {
    const { token, invitation } = await inviteAndReadToken();
    await db
      .update(schema.invitations)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(schema.invitations.id, invitation.id));
    expect(await lookup(token)).toMatchObject({ status: "expired" });
    await expectAcceptRefused(token, "conflict", INVITATION_MESSAGES.expired);
  });

  it("refuses an unknown link with a clear message and changes nothing", async () => {
    expect(await lookup("no-such-token")).toBeNull();
    await expectAcceptRefused("no-such-token", "not-found", INVITATION_MESSAGES.unknown);
  });

  it("refuses a withdrawn link, and a new invitation withdraws the previous one", async () => {
    const { admin, email, token, invitation } = await inviteAndReadToken();
    const again = await runUseCase(inviteUser, { actor: admin, input: { email, name: "Dana Example", role: "engineer" } });
    expect(again.replacedInvitations).toEqual([invitation.id]);
    expect(await lookup(token)).toMatchObject({ status: "revoked" });
    const [replacing] = await auditEventsFor({ action: "users.invite", subject: `invitation:${again.id}` });
    expect(replacing.details).toEqual({ email, role: "engineer", replacedInvitations: [invitation.id] });
    await expectAcceptRefused(token, "conflict", INVITATION_MESSAGES.revoked);

    const pending = (await listPendingInvitations()).filter((p) => p.email === email);
    expect(pending.map((p) => p.id)).toEqual([again.id]);
    // The admin's page reads the same list through its use case.
    const { invitations } = await runUseCase(listPeople, { actor: admin, input: {} });
    expect(invitations.filter((p) => p.email === email).map((p) => p.id)).toEqual([again.id]);
    await runUseCase(revokeInvitation, { actor: admin, input: { invitationId: again.id } });
    expect((await listPendingInvitations()).filter((p) => p.email === email)).toEqual([]);
    await expectRefusal(
      () => runUseCase(revokeInvitation, { actor: admin, input: { invitationId: again.id } }),
      "conflict",
      "That invitation was already cancelled.",
    );
  });

  it("refuses to invite an address that already has an account", async () => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    const { actor: existing } = await createTestUser({ role: "engineer" });
    await expectNoChangeFrom(() =>
      expect(
        runUseCase(inviteUser, { actor: admin, input: { email: existing.email, name: "Again", role: "engineer" } }),
      ).rejects.toMatchObject({
        code: "conflict",
        fieldErrors: { email: ["This e-mail address already has an account."] },
      }),
    );
  });

  it("refuses anyone but an admin to invite or revoke; the admin's revocation makes the link refuse", async () => {
    const { token, invitation } = await inviteAndReadToken();
    const refusals = [
      ...(["lead", "engineer", "auditor"] as const).map((role) => ({
        role,
        code: "forbidden",
        message: "Your role does not allow this.",
      })),
      { role: null, code: "unauthenticated", message: "Please sign in to continue." },
    ];
    for (const { role, code, message } of refusals) {
      const actor = role ? (await createTestUser({ role })).actor : null;
      await expectRefusal(
        () => runUseCase(inviteUser, { actor, input: { email: uniqueEmail("x"), name: "X", role: "admin" } }),
        code,
        message,
        refusalWrites(code, actor, "users.invite"),
      );
      await expectRefusal(
        () => runUseCase(revokeInvitation, { actor, input: { invitationId: invitation.id } }),
        code,
        message,
        refusalWrites(code, actor, "invitations.revoke"),
      );
    }
    expect(await lookup(token)).toMatchObject({ status: "valid" });

    const { actor: admin } = await createTestUser({ role: "admin" });
    expect(await runUseCase(revokeInvitation, { actor: admin, input: { invitationId: invitation.id } })).toEqual({
      id: invitation.id,
      email: invitation.email,
      name: invitation.name,
      role: "engineer",
      expiresAt: invitation.expiresAt,
      createdAt: invitation.createdAt,
    });
    const [row] = await db.select().from(schema.invitations).where(eq(schema.invitations.id, invitation.id));
    expect(row.revokedAt).toBeInstanceOf(Date);
    expect(row.acceptedAt).toBeNull();
    const [event] = await auditEventsFor({ action: "invitations.revoke", subject: `invitation:${invitation.id}` });
    expect(event).toMatchObject({ actorId: admin.id, details: { email: invitation.email, role: "engineer" } });

    // The revoked link now refuses, says why, and creates no account.
    expect(await lookup(token)).toMatchObject({ status: "revoked" });
    await expectAcceptRefused(token, "conflict", INVITATION_MESSAGES.revoked);
    expect(await db.select().from(schema.user).where(eq(schema.user.email, invitation.email))).toEqual([]);
  });

  it("answers a too-short or mismatched password on the public form with field messages and writes nothing", async () => {
    const { token, email } = await inviteAndReadToken();
    await expectNoChangeFrom(
      async () => {
        const short = await submitAcceptForm({ token, password: "short", confirmPassword: "short" });
        expect(short).toMatchObject({
          ok: false,
          error: { code: "invalid-input", fieldErrors: { password: ["Use at least 10 characters."] } },
        });
        const mismatch = await submitAcceptForm({ token, password: NEW_PASSWORD, confirmPassword: "something-else" });
        expect(mismatch).toMatchObject({ ok: false, error: { fieldErrors: { confirmPassword: ["The two passwords differ."] } } });
      },
      { except: [{ ...acceptFailureAudited("invalid-input"), count: 2 }] },
    );
    expect(await lookup(token)).toMatchObject({ status: "valid" });

    // The same form with a good password makes the account and sends the person home.
    await expect(submitAcceptForm({ token, password: NEW_PASSWORD, confirmPassword: NEW_PASSWORD })).rejects.toMatchObject({
      digest: expect.stringContaining("NEXT_REDIRECT"),
    });
    const [created] = await db.select().from(schema.user).where(eq(schema.user.email, email));
    expect(created).toMatchObject({ email, role: "engineer" });
    expect(await lookup(token)).toMatchObject({ status: "used" });
  });
});
