// Sign-in through better-auth's HTTP endpoint, as the browser does it: each failure gets a clear
// answer and changes nothing but the failed-sign-in audit event and the attempt counters; attempts are
// rate-limited per account and address.
import { describe, expect, it } from "vitest";
import { describeAuthError } from "@/lib/auth/client";
import { SIGN_IN_ADDRESS_RATE_LIMIT, SIGN_IN_RATE_LIMIT, handleAuthRequest } from "@/lib/auth/server";
import { expectRowsUnchanged, snapshotRows, type ExpectedChange } from "../support/snapshot";
import { auditEventsFor, createTestUser, uniqueEmail, uniqueIp } from "./helpers/people";

const BASE = (process.env.BETTER_AUTH_URL ?? "http://127.0.0.1:3000").replace(/\/+$/, "");

async function post(path: string, body: unknown, { ip = uniqueIp(), origin = BASE, cookie = "" } = {}) {
  const response = await handleAuthRequest(
    new Request(`${BASE}/api/auth${path}`, {
      method: "POST",
      headers: { "content-type": "application/json", origin, "x-gusset-client-address": ip, ...(cookie ? { cookie } : {}) },
      body: JSON.stringify(body),
    }),
  );
  const isJson = response.headers.get("content-type")?.includes("application/json");
  return { status: response.status, body: isJson ? await response.json() : await response.text(), headers: response.headers };
}

// The writes a refused sign-in makes on purpose (lib/auth/server.ts), each named so that nothing else may change.

/** Every refused attempt is written to the audit trail, with better-auth's reason. */
function failedSignInAudited(email: string, reason: string): ExpectedChange {
  return {
    table: "audit_events",
    change: "added",
    why: `the refused sign-in of ${email} (${reason}) is audited`,
    where: (row) =>
      row.action === "auth.sign-in.failed" && row.actor_email === email && (row.details as { reason?: string }).reason === reason,
  };
}

/** Every attempt that names an e-mail counts against the per-account-and-address limit (handleAuthRequest). */
function attemptCounted(ip: string, email: string): ExpectedChange {
  return {
    table: "rate_limit",
    change: "added or changed",
    why: "the attempt counts against the per-account-and-address sign-in limit",
    where: (row) => row.key === `gusset:sign-in|${ip}|${email}`,
  };
}

/** …and against the per-account limit, from any address, until a sign-in succeeds. */
function accountCounted(email: string): ExpectedChange {
  return {
    table: "rate_limit",
    change: "added or changed",
    why: "the attempt counts against the per-account sign-in limit",
    where: (row) => row.key === `gusset:sign-in-account|${email}`,
  };
}

/** …and every attempt that reaches better-auth counts against its per-address limit for the path. */
function addressCounted(ip: string, path: string): ExpectedChange {
  return {
    table: "rate_limit",
    change: "added or changed",
    why: `the request counts against better-auth's per-address limit for ${path}`,
    where: (row) => row.key === `${ip}|${path}`,
  };
}

describe("sign-in", () => {
  it("signs in each role, sets a session cookie and writes the sign-in event", async () => {
    for (const role of ["admin", "lead", "engineer", "auditor"] as const) {
      const { actor, password } = await createTestUser({ role });
      const result = await post("/sign-in/email", { email: actor.email, password });
      expect(result.status).toBe(200);
      expect(result.body.user).toMatchObject({ email: actor.email, role });
      expect(result.body.user).not.toHaveProperty("password");
      expect(result.headers.get("set-cookie")).toContain("better-auth.session_token=");
      const events = await auditEventsFor({ action: "auth.sign-in", actorEmail: actor.email });
      expect(events).toHaveLength(1);
      expect(events[0].actorId).toBe(actor.id);
    }
  });

  it("answers a wrong password clearly; only the failed-sign-in event and the counters are written", async () => {
    const { actor } = await createTestUser({ role: "engineer" });
    const ip = uniqueIp();
    const before = await snapshotRows();
    const result = await post("/sign-in/email", { email: actor.email, password: "not-the-password" }, { ip });
    expect(result.status).toBe(401);
    expect(result.body.code).toBe("INVALID_EMAIL_OR_PASSWORD");
    expect(describeAuthError({ status: 401, code: result.body.code })).toMatch(/do not match an account/);
    await expectRowsUnchanged(before, {
      except: [
        failedSignInAudited(actor.email, "INVALID_EMAIL_OR_PASSWORD"),
        attemptCounted(ip, actor.email),
        accountCounted(actor.email),
        addressCounted(ip, "/sign-in/email"),
      ],
    });
    const [event] = await auditEventsFor({ action: "auth.sign-in.failed", actorEmail: actor.email });
    expect(event).toMatchObject({
      actorId: actor.id,
      subject: `user:${actor.id}`,
      ipAddress: ip,
      details: { reason: "INVALID_EMAIL_OR_PASSWORD", knownUser: true },
    });
  });

  it("answers an unknown e-mail with the same words as a wrong password", async () => {
    const email = uniqueEmail("nobody");
    const ip = uniqueIp();
    const before = await snapshotRows();
    const result = await post("/sign-in/email", { email, password: "whatever-password" }, { ip });
    expect(result.status).toBe(401);
    expect(result.body.code).toBe("INVALID_EMAIL_OR_PASSWORD");
    await expectRowsUnchanged(before, {
      except: [
        failedSignInAudited(email, "INVALID_EMAIL_OR_PASSWORD"),
        attemptCounted(ip, email),
        accountCounted(email),
        addressCounted(ip, "/sign-in/email"),
      ],
    });
    const [event] = await auditEventsFor({ action: "auth.sign-in.failed", actorEmail: email });
    expect(event).toMatchObject({
      actorId: null,
      subject: null,
      details: { reason: "INVALID_EMAIL_OR_PASSWORD", knownUser: false },
    });
  });

  it("answers a malformed e-mail clearly", async () => {
    const ip = uniqueIp();
    const before = await snapshotRows();
    const result = await post("/sign-in/email", { email: "not-an-address", password: "whatever-password" }, { ip });
    expect(result.status).toBe(400);
    expect(result.body.code).toBe("INVALID_EMAIL");
    expect(describeAuthError({ status: 400, code: result.body.code })).toBe("Enter an e-mail address like name@firm.example.");
    await expectRowsUnchanged(before, {
      except: [
        failedSignInAudited("not-an-address", "INVALID_EMAIL"),
        attemptCounted(ip, "not-an-address"),
        accountCounted("not-an-address"),
        addressCounted(ip, "/sign-in/email"),
      ],
    });
  });

  it("has no sign-up (people join by invitation only) and no unguarded profile endpoints", async () => {
    const ip = uniqueIp();
    const before = await snapshotRows();
    const result = await post(
      "/sign-up/email",
      { email: uniqueEmail("self"), password: "a-long-password", name: "Self Signed" },
      { ip },
    );
    expect(result.status).toBe(404);
    for (const path of ["/update-user", "/delete-user", "/change-email"]) expect((await post(path, {}, { ip })).status).toBe(404);
    await expectRowsUnchanged(before);
  });

  it("refuses a sign-in posted from another site by a browser that holds our cookies (origin check)", async () => {
    const { actor, password } = await createTestUser({ role: "engineer" });
    const cookie = "better-auth.session_token=anything";
    const ip = uniqueIp();
    const before = await snapshotRows();
    const result = await post("/sign-in/email", { email: actor.email, password }, { ip, origin: "https://evil.example", cookie });
    expect(result.status).toBe(403);
    expect(result.body.code).toBe("INVALID_ORIGIN");
    // Refused before anything is counted, and audited (handleAuthRequest checks the origin first).
    await expectRowsUnchanged(before, { except: [failedSignInAudited(actor.email, "INVALID_ORIGIN")] });
    // 127.0.0.1 and localhost name the same demo server: both are trusted.
    const local = new URL(BASE);
    const twin = local.hostname === "127.0.0.1" ? "localhost" : local.hostname === "localhost" ? "127.0.0.1" : local.hostname;
    const ok = await post(
      "/sign-in/email",
      { email: actor.email, password },
      { origin: `${local.protocol}//${twin}:${local.port}`, cookie },
    );
    expect(ok.status).toBe(200);
  });

  it(`allows ${SIGN_IN_RATE_LIMIT.max} attempts a minute per account and address, then answers 429 and audits the refusal`, async () => {
    const { actor, password } = await createTestUser({ role: "engineer" });
    const { actor: colleague, password: colleaguePassword } = await createTestUser({ role: "lead" });
    const ip = uniqueIp();
    const windowOpened = Date.now(); // the first attempt opens the minute
    for (let attempt = 1; attempt <= SIGN_IN_RATE_LIMIT.max; attempt++) {
      expect((await post("/sign-in/email", { email: actor.email, password: "wrong-password-x" }, { ip })).status).toBe(401);
    }
    const before = await snapshotRows();
    // Even the right password is refused until the window has passed.
    const limited = await post("/sign-in/email", { email: actor.email, password }, { ip });
    const answered = Date.now();
    expect(limited.status).toBe(429);
    expect(limited.body).toEqual({ code: "TOO_MANY_REQUESTS", message: "Too many requests. Please try again later." });
    // The seconds left of the minute the first attempt opened: at most the whole window, at least
    // what remained of it when the answer came.
    const retryAfter = Number(limited.headers.get("x-retry-after"));
    expect(retryAfter).toBeLessThanOrEqual(SIGN_IN_RATE_LIMIT.window);
    expect(retryAfter).toBeGreaterThanOrEqual(Math.ceil((windowOpened + SIGN_IN_RATE_LIMIT.window * 1000 - answered) / 1000));
    expect(describeAuthError({ status: 429 })).toMatch(/Too many attempts/);
    // Refused before better-auth sees it: no session, only the audit event and the account's counter.
    await expectRowsUnchanged(before, {
      except: [failedSignInAudited(actor.email, "RATE_LIMITED"), attemptCounted(ip, actor.email)],
    });
    const events = await auditEventsFor({ action: "auth.sign-in.failed", actorEmail: actor.email });
    expect(events.sort((a, b) => a.id - b.id).map((e) => e.details.reason)).toEqual([
      ...Array<string>(SIGN_IN_RATE_LIMIT.max).fill("INVALID_EMAIL_OR_PASSWORD"),
      "RATE_LIMITED",
    ]);
    // A colleague behind the same office address is not locked out, nor is the account from elsewhere.
    expect((await post("/sign-in/email", { email: colleague.email, password: colleaguePassword }, { ip })).status).toBe(200);
    expect((await post("/sign-in/email", { email: actor.email, password })).status).toBe(200);
  });

  it(`allows ${SIGN_IN_ADDRESS_RATE_LIMIT.max} attempts a minute per address across accounts`, async () => {
    const ip = uniqueIp();
    for (let attempt = 1; attempt <= SIGN_IN_ADDRESS_RATE_LIMIT.max; attempt++) {
      const result = await post("/sign-in/email", { email: uniqueEmail("spray"), password: "guess-password" }, { ip });
      expect(result.status).toBe(401);
    }
    const email = uniqueEmail("spray");
    const before = await snapshotRows();
    expect((await post("/sign-in/email", { email, password: "guess-password" }, { ip })).status).toBe(429);
    // better-auth refuses it on its per-address count, which a refusal leaves as it was; ours counted
    // the new account's first attempt, per address and per account.
    await expectRowsUnchanged(before, {
      except: [failedSignInAudited(email, "RATE_LIMITED"), attemptCounted(ip, email), accountCounted(email)],
    });
  });
});
