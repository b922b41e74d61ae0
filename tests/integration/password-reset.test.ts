// Password reset by e-mail: the message is really received by the fake SMTP, its link's token sets a
// new password once, and every open session of that person ends.
import { describe, expect, it } from "vitest";
import { auth, handleAuthRequest } from "@/lib/auth/server";
import { firstLink, listMessages, waitForMessage } from "../support/mailbox";
import { auditEventsFor, countRows, createTestUser, sessionCount, signInHeaders, uniqueEmail, uniqueIp } from "./helpers/people";

const BASE = (process.env.BETTER_AUTH_URL ?? "http://127.0.0.1:3000").replace(/\/+$/, "");

async function requestReset(email: string) {
  const response = await handleAuthRequest(
    new Request(`${BASE}/api/auth/request-password-reset`, {
      method: "POST",
      headers: { "content-type": "application/json", origin: BASE, "x-forwarded-for": uniqueIp() },
      body: JSON.stringify({ email }),
    }),
  );
  return { status: response.status, body: await response.json() };
}

async function resetTokenFor(email: string): Promise<string> {
  const mail = await waitForMessage({ to: email, subjectIncludes: "Reset your Gusset password" });
  const link = new URL(firstLink(mail));
  expect(`${link.origin}${link.pathname}`).toBe(`${BASE}/reset-password`);
  const token = link.searchParams.get("token");
  if (!token) throw new Error("no token in the reset link");
  return token;
}

describe("password reset", () => {
  it("e-mails a link whose token sets a new password and ends every open session", async () => {
    const { actor, password } = await createTestUser({ role: "engineer" });
    await signInHeaders(actor.email, password);
    expect(await sessionCount(actor.id)).toBe(1);

    const asked = await requestReset(actor.email);
    expect(asked.status).toBe(200);
    const token = await resetTokenFor(actor.email);

    const newPassword = "a-brand-new-password";
    await auth.api.resetPassword({ body: { token, newPassword } });
    expect(await sessionCount(actor.id)).toBe(0);
    await expect(auth.api.signInEmail({ body: { email: actor.email, password } })).rejects.toMatchObject({
      body: { code: "INVALID_EMAIL_OR_PASSWORD" },
    });
    expect((await auth.api.signInEmail({ body: { email: actor.email, password: newPassword } })).user.id).toBe(actor.id);
    expect(await auditEventsFor({ action: "auth.password-reset.requested", actorEmail: actor.email })).toHaveLength(1);
    expect(await auditEventsFor({ action: "auth.password-reset", subject: `user:${actor.id}` })).toHaveLength(1);

    // The token works once.
    await expect(auth.api.resetPassword({ body: { token, newPassword: "yet-another-password" } })).rejects.toMatchObject({
      body: { code: "INVALID_TOKEN" },
    });
  });

  it("refuses a too-short new password and changes nothing", async () => {
    const { actor, password } = await createTestUser({ role: "lead" });
    await requestReset(actor.email);
    const token = await resetTokenFor(actor.email);
    const before = await countRows();
    await expect(auth.api.resetPassword({ body: { token, newPassword: "short" } })).rejects.toMatchObject({
      body: { code: "PASSWORD_TOO_SHORT" },
    });
    const after = await countRows();
    expect({ ...after, audit_events: before.audit_events }).toEqual(before); // only the failed-reset event
    expect((await auth.api.signInEmail({ body: { email: actor.email, password } })).user.id).toBe(actor.id);
  });

  it("answers an unknown address the same way and sends nothing", async () => {
    const email = uniqueEmail("nobody");
    const asked = await requestReset(email);
    expect(asked.status).toBe(200);
    await new Promise((resolve) => setTimeout(resolve, 300));
    expect((await listMessages()).some((m) => m.to.includes(email))).toBe(false);
  });

  it("sends no reset link to a deactivated account", async () => {
    const { actor } = await createTestUser({ role: "engineer", deactivated: true });
    expect((await requestReset(actor.email)).status).toBe(200);
    await new Promise((resolve) => setTimeout(resolve, 300));
    expect((await listMessages()).some((m) => m.to.includes(actor.email))).toBe(false);
  });
});
