// Password reset by e-mail: the message is really received by the fake SMTP, its link's token sets a
// new password once, and every open session of that person ends.
import { describe, expect, it } from "vitest";
import { auth, handleAuthRequest } from "@/lib/auth/server";
import { firstLink, listMessages, waitForMessage } from "../support/mailbox";
import { expectRowsUnchanged, snapshotRows, type ExpectedChange } from "../support/snapshot";
import { auditEventsFor, createTestUser, sessionCount, signInHeaders, uniqueEmail, uniqueIp } from "./helpers/people";

const BASE = (process.env.BETTER_AUTH_URL ?? "http://127.0.0.1:3000").replace(/\/+$/, "");
const RESET_SUBJECT = "Reset your Gusset password";

async function requestReset(email: string, ip = uniqueIp()) {
  const response = await handleAuthRequest(
    new Request(`${BASE}/api/auth/request-password-reset`, {
      method: "POST",
      headers: { "content-type": "application/json", origin: BASE, "x-gusset-client-address": ip },
      body: JSON.stringify({ email }),
    }),
  );
  return { status: response.status, body: await response.json() };
}

// The writes a reset request makes whatever the address (lib/auth/server.ts, better-auth's limiter).
function resetRequestAudited(email: string, knownUser: boolean): ExpectedChange {
  return {
    table: "audit_events",
    change: "added",
    why: "every reset request is audited, known address or not",
    where: (row) =>
      row.action === "auth.password-reset.requested" &&
      row.actor_email === email &&
      (row.details as { knownUser?: boolean }).knownUser === knownUser,
  };
}
function resetRequestCounted(ip: string, email: string): ExpectedChange[] {
  return [
    {
      table: "rate_limit",
      change: "added",
      why: "the request counts against better-auth's per-address limit for reset requests",
      where: (row) => row.key === `${ip}|/request-password-reset`,
    },
    {
      table: "rate_limit",
      change: "added",
      why: "the request counts against Gusset's per-address limit, checked before the answer",
      where: (row) => row.key === `gusset:password-reset|${ip}`,
    },
    {
      table: "rate_limit",
      change: "added",
      why: "the request counts against the per-address-mailed limit (reset e-mails to one address an hour)",
      where: (row) => row.key === `gusset:password-reset-email|${email}`,
    },
  ];
}

/**
 * The messages that reached `email` by the time a later reset mail to someone else arrived. The app
 * queues its mail before it answers and the worker takes the queue's jobs oldest first, so anything
 * the earlier request queued is in the mailbox by then: no fixed wait, and no race with a slow send.
 * (The snapshots around the requests also prove that no job was queued at all.)
 */
async function mailTo(email: string): Promise<unknown[]> {
  const { actor: witness } = await createTestUser({ role: "engineer", label: "reset-witness" });
  expect((await requestReset(witness.email)).status).toBe(200);
  await waitForMessage({ to: witness.email, subjectIncludes: RESET_SUBJECT });
  return (await listMessages()).filter((message) => message.to.includes(email));
}

async function resetTokenFor(email: string): Promise<string> {
  const mail = await waitForMessage({ to: email, subjectIncludes: RESET_SUBJECT });
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
    const before = await snapshotRows();
    await expect(auth.api.resetPassword({ body: { token, newPassword: "short" } })).rejects.toMatchObject({
      body: { code: "PASSWORD_TOO_SHORT" },
    });
    // The password, the sessions and the token itself are as they were; only the refusal is audited.
    await expectRowsUnchanged(before, {
      except: [
        {
          table: "audit_events",
          change: "added",
          why: "a refused reset is audited (lib/auth/server.ts)",
          where: (row) =>
            row.action === "auth.password-reset.failed" && (row.details as { reason?: string }).reason === "PASSWORD_TOO_SHORT",
        },
      ],
    });
    expect((await auth.api.signInEmail({ body: { email: actor.email, password } })).user.id).toBe(actor.id);
  });

  it("answers an unknown address the same way and sends nothing", async () => {
    const { actor: known } = await createTestUser({ role: "engineer" });
    const knownAnswer = await requestReset(known.email);
    const email = uniqueEmail("nobody");
    const ip = uniqueIp();
    const before = await snapshotRows();
    const asked = await requestReset(email, ip);
    expect(asked).toEqual(knownAnswer);
    expect(asked.status).toBe(200);
    await expectRowsUnchanged(before, { except: [resetRequestAudited(email, false), ...resetRequestCounted(ip, email)] });
    expect(await mailTo(email)).toEqual([]);
  });

  it("sends no reset link to a deactivated account", async () => {
    const { actor } = await createTestUser({ role: "engineer", deactivated: true });
    const ip = uniqueIp();
    const before = await snapshotRows();
    expect((await requestReset(actor.email, ip)).status).toBe(200);
    await expectRowsUnchanged(before, {
      except: [
        resetRequestAudited(actor.email, true),
        ...resetRequestCounted(ip, actor.email),
        {
          table: "verification",
          change: "added",
          // better-auth stores the token before it calls sendResetPassword, which then declines to
          // send it (lib/auth/server.ts): the token exists but nobody ever receives it.
          why: "better-auth stores the reset token before our sender declines to mail it",
          where: (row) => String(row.identifier).startsWith("reset-password:") && row.value === actor.id,
        },
      ],
    });
    expect(await mailTo(actor.email)).toEqual([]);
  });
});
