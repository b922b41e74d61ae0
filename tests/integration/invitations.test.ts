// Invitation → e-mail (really received by the fake SMTP) → accept → sign in; and every way a link can
// be wrong (unknown, expired, used, withdrawn), each with a clear message and nothing changed.
import { eq } from "drizzle-orm";
import { redirect } from "next/navigation";
import { describe, expect, it, vi } from "vitest";
import { db } from "@/db";
import * as schema from "@/db/schema";
import { guardedAction } from "@/lib/auth/guard";
import { auth } from "@/lib/auth/server";
import { acceptInvitationSchema } from "@/lib/data/invitation-schemas";
import {
  INVITATION_MESSAGES,
  acceptInvitation,
  getInvitationByToken,
  listPendingInvitations,
  revokeInvitation,
} from "@/lib/data/invitations";
import { hashInvitationToken, inviteUser } from "@/lib/data/users";
import { expectNoChangeFrom } from "../support/snapshot";
import { auditEventsFor, createTestUser, inviteWithToken, sessionCount, uniqueEmail } from "./helpers/people";

vi.mock("next/headers", () => ({ headers: async () => new Headers(), cookies: async () => ({ set: () => undefined }) }));

const NEW_PASSWORD = "a-long-enough-password";

async function inviteAndReadToken(role: "engineer" | "lead" | "auditor" | "admin" = "engineer") {
  const invited = await inviteWithToken(role);
  expect(invited.link).toMatch(/\/invite\/[A-Za-z0-9_-]{43}$/);
  return invited;
}

/** The call is refused with this code and message, and no row of any table changes (refusals write no audit event). */
async function expectRefusal(call: () => Promise<unknown>, code: string, message: string) {
  await expectNoChangeFrom(() => expect(call()).rejects.toMatchObject({ code, message }));
}

describe("invitations", () => {
  it("e-mails a link that lets the invitee set a password, become a user with the role, and sign in", async () => {
    const { admin, email, invitation, token, mail } = await inviteAndReadToken("lead");
    expect(mail.text).toContain("Dana Example");
    expect(mail.text).toContain("Standards lead");
    expect(mail.text).toContain(admin.name);

    // Only the hash is stored.
    const [row] = await db.select().from(schema.invitations).where(eq(schema.invitations.id, invitation.id));
    expect(row.tokenHash).toBe(hashInvitationToken(token));
    expect(row.tokenHash).not.toContain(token);
    expect(row.expiresAt.getTime() - row.createdAt.getTime()).toBeCloseTo(7 * 24 * 3600 * 1000, -4);

    expect(await getInvitationByToken({ token })).toMatchObject({ email, name: "Dana Example", role: "lead", status: "valid" });
    const accepted = await acceptInvitation({ token, password: NEW_PASSWORD });
    expect(accepted.email).toBe(email);

    const [created] = await db.select().from(schema.user).where(eq(schema.user.email, email));
    expect(created).toMatchObject({ name: "Dana Example", role: "lead", deactivatedAt: null });
    const signedIn = await auth.api.signInEmail({ body: { email, password: NEW_PASSWORD } });
    expect(signedIn.user.email).toBe(email);
    expect(await getInvitationByToken({ token })).toMatchObject({ status: "used" });
    expect(await auditEventsFor({ action: "invitations.accept", subject: `invitation:${invitation.id}` })).toHaveLength(1);
  });

  it("signs the new user in once the rows are committed", async () => {
    const { email, token } = await inviteAndReadToken();
    const { userId } = await acceptInvitation({ token, password: NEW_PASSWORD, signIn: { headers: new Headers() } });
    expect(await sessionCount(userId)).toBe(1);
    expect(await auditEventsFor({ action: "auth.sign-in", actorEmail: email })).toHaveLength(1);
  });

  it("as a server action that redirects: commits, signs in, then lets Next redirect", async () => {
    const { email, token } = await inviteAndReadToken();
    const action = guardedAction({ schema: acceptInvitationSchema, permission: "public" }, async ({ token: t, password }) => {
      await acceptInvitation({ token: t, password, signIn: { headers: new Headers() } });
      redirect("/home");
    });
    await expect(action(null, { token, password: NEW_PASSWORD, confirmPassword: NEW_PASSWORD })).rejects.toMatchObject({
      digest: expect.stringContaining("NEXT_REDIRECT"),
    });
    const [created] = await db.select().from(schema.user).where(eq(schema.user.email, email));
    expect(await sessionCount(created.id)).toBe(1);
  });

  it("refuses a used link with a clear message and changes nothing", async () => {
    const { token } = await inviteAndReadToken();
    await acceptInvitation({ token, password: NEW_PASSWORD });
    await expectRefusal(() => acceptInvitation({ token, password: "another-password-1" }), "conflict", INVITATION_MESSAGES.used);
  });

  it("refuses an expired link with a clear message and changes nothing", async () => {
    const { token, invitation } = await inviteAndReadToken();
    await db
      .update(schema.invitations)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(schema.invitations.id, invitation.id));
    expect(await getInvitationByToken({ token })).toMatchObject({ status: "expired" });
    await expectRefusal(() => acceptInvitation({ token, password: NEW_PASSWORD }), "conflict", INVITATION_MESSAGES.expired);
  });

  it("refuses an unknown link with a clear message and changes nothing", async () => {
    expect(await getInvitationByToken({ token: "no-such-token" })).toBeNull();
    await expectRefusal(() => acceptInvitation({ token: "no-such-token", password: NEW_PASSWORD }), "not-found", INVITATION_MESSAGES.unknown);
  });

  it("refuses a withdrawn link, and a new invitation withdraws the previous one", async () => {
    const { admin, email, token, invitation } = await inviteAndReadToken();
    const again = await inviteUser({ actor: admin, email, name: "Dana Example", role: "engineer" });
    expect(await getInvitationByToken({ token })).toMatchObject({ status: "revoked" });
    const [replacing] = await auditEventsFor({ action: "users.invite", subject: `invitation:${again.id}` });
    expect(replacing.details).toEqual({ email, role: "engineer", replacedInvitations: [invitation.id] });
    await expectRefusal(() => acceptInvitation({ token, password: NEW_PASSWORD }), "conflict", INVITATION_MESSAGES.revoked);

    const pending = (await listPendingInvitations({ actor: admin })).filter((p) => p.email === email);
    expect(pending.map((p) => p.id)).toEqual([again.id]);
    await revokeInvitation({ actor: admin, invitationId: again.id });
    expect((await listPendingInvitations({ actor: admin })).filter((p) => p.email === email)).toEqual([]);
    await expectRefusal(() => revokeInvitation({ actor: admin, invitationId: again.id }), "conflict", "That invitation is already revoked.");
  });

  it("refuses to invite an address that already has an account", async () => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    const { actor: existing } = await createTestUser({ role: "engineer" });
    await expectNoChangeFrom(() =>
      expect(inviteUser({ actor: admin, email: existing.email, name: "Again", role: "engineer" })).rejects.toMatchObject({
        code: "conflict",
        fieldErrors: { email: ["This e-mail address already has an account."] },
      }),
    );
  });

  it("refuses anyone but an admin to invite or revoke; the admin's revocation makes the link refuse", async () => {
    const { token, invitation } = await inviteAndReadToken();
    const refusals = [
      ...(["lead", "engineer", "auditor"] as const).map((role) => ({ role, code: "forbidden", message: "Your role does not allow this." })),
      { role: null, code: "unauthenticated", message: "Please sign in to continue." },
    ];
    for (const { role, code, message } of refusals) {
      const actor = role ? (await createTestUser({ role })).actor : null;
      await expectRefusal(() => inviteUser({ actor, email: uniqueEmail("x"), name: "X", role: "admin" }), code, message);
      await expectRefusal(() => revokeInvitation({ actor, invitationId: invitation.id }), code, message);
    }
    expect(await getInvitationByToken({ token })).toMatchObject({ status: "valid" });

    const { actor: admin } = await createTestUser({ role: "admin" });
    expect(await revokeInvitation({ actor: admin, invitationId: invitation.id })).toEqual({ id: invitation.id, email: invitation.email });
    const [row] = await db.select().from(schema.invitations).where(eq(schema.invitations.id, invitation.id));
    expect(row.revokedAt).toBeInstanceOf(Date);
    expect(row.acceptedAt).toBeNull();
    const [event] = await auditEventsFor({ action: "invitations.revoke", subject: `invitation:${invitation.id}` });
    expect(event).toMatchObject({ actorId: admin.id, details: { email: invitation.email, role: "engineer" } });

    // The revoked link now refuses, says why, and creates no account.
    expect(await getInvitationByToken({ token })).toMatchObject({ status: "revoked" });
    await expectRefusal(() => acceptInvitation({ token, password: NEW_PASSWORD }), "conflict", INVITATION_MESSAGES.revoked);
    expect(await db.select().from(schema.user).where(eq(schema.user.email, invitation.email))).toEqual([]);
  });

  it("answers a too-short or mismatched password on the public form with field messages and writes nothing", async () => {
    const { token, email } = await inviteAndReadToken();
    const accept = guardedAction({ schema: acceptInvitationSchema, permission: "public" }, (input) => acceptInvitation(input));
    await expectNoChangeFrom(async () => {
      const short = await accept(null, { token, password: "short", confirmPassword: "short" });
      expect(short).toMatchObject({ ok: false, error: { code: "invalid-input", fieldErrors: { password: ["Use at least 10 characters."] } } });
      const mismatch = await accept(null, { token, password: NEW_PASSWORD, confirmPassword: "something-else" });
      expect(mismatch).toMatchObject({ ok: false, error: { fieldErrors: { confirmPassword: ["The two passwords differ."] } } });
    });
    expect(await getInvitationByToken({ token })).toMatchObject({ status: "valid" });

    const good = await accept(null, { token, password: NEW_PASSWORD, confirmPassword: NEW_PASSWORD });
    expect(good).toMatchObject({ ok: true, data: { email } });
  });
});
