// Sign-in through better-auth's HTTP endpoint, as the browser does it: each failure gets a clear
// answer and changes nothing but the failed-sign-in audit event; attempts are rate-limited per address.
import { describe, expect, it } from "vitest";
import { describeAuthError } from "@/lib/auth/client";
import { SIGN_IN_ADDRESS_RATE_LIMIT, SIGN_IN_RATE_LIMIT, handleAuthRequest } from "@/lib/auth/server";
import { auditEventsFor, countRows, createTestUser, uniqueEmail, uniqueIp } from "./helpers/people";

const BASE = (process.env.BETTER_AUTH_URL ?? "http://127.0.0.1:3000").replace(/\/+$/, "");

async function post(path: string, body: unknown, { ip = uniqueIp(), origin = BASE, cookie = "" } = {}) {
  const response = await handleAuthRequest(
    new Request(`${BASE}/api/auth${path}`, {
      method: "POST",
      headers: { "content-type": "application/json", origin, "x-forwarded-for": ip, ...(cookie ? { cookie } : {}) },
      body: JSON.stringify(body),
    }),
  );
  const isJson = response.headers.get("content-type")?.includes("application/json");
  return { status: response.status, body: isJson ? await response.json() : await response.text(), headers: response.headers };
}

function changedTables(before: Record<string, number>, after: Record<string, number>) {
  return Object.keys(before).filter((table) => before[table] !== after[table]);
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

  it("answers a wrong password clearly; only the failed-sign-in event is written", async () => {
    const { actor } = await createTestUser({ role: "engineer" });
    const before = await countRows();
    const result = await post("/sign-in/email", { email: actor.email, password: "not-the-password" });
    expect(result.status).toBe(401);
    expect(result.body.code).toBe("INVALID_EMAIL_OR_PASSWORD");
    expect(describeAuthError({ status: 401, code: result.body.code })).toMatch(/do not match an account/);
    expect(changedTables(before, await countRows())).toEqual(["audit_events"]);
    const [event] = await auditEventsFor({ action: "auth.sign-in.failed", actorEmail: actor.email });
    expect(event).toMatchObject({ actorId: actor.id, details: { reason: "INVALID_EMAIL_OR_PASSWORD", knownUser: true } });
  });

  it("answers an unknown e-mail with the same words as a wrong password", async () => {
    const email = uniqueEmail("nobody");
    const before = await countRows();
    const result = await post("/sign-in/email", { email, password: "whatever-password" });
    expect(result.status).toBe(401);
    expect(result.body.code).toBe("INVALID_EMAIL_OR_PASSWORD");
    expect(changedTables(before, await countRows())).toEqual(["audit_events"]);
    const [event] = await auditEventsFor({ action: "auth.sign-in.failed", actorEmail: email });
    expect(event).toMatchObject({ actorId: null, details: { knownUser: false } });
  });

  it("answers a malformed e-mail clearly", async () => {
    const before = await countRows();
    const result = await post("/sign-in/email", { email: "not-an-address", password: "whatever-password" });
    expect(result.status).toBe(400);
    expect(result.body.code).toBe("INVALID_EMAIL");
    expect(describeAuthError({ status: 400, code: result.body.code })).toBe("Enter an e-mail address like name@firm.example.");
    expect(changedTables(before, await countRows())).toEqual(["audit_events"]);
  });

  it("has no sign-up (people join by invitation only) and no unguarded profile endpoints", async () => {
    const before = await countRows();
    const result = await post("/sign-up/email", { email: uniqueEmail("self"), password: "a-long-password", name: "Self Signed" });
    expect(result.status).toBe(404);
    for (const path of ["/update-user", "/delete-user", "/change-email"]) expect((await post(path, {})).status).toBe(404);
    expect(await countRows()).toEqual(before);
  });

  it("refuses a sign-in posted from another site by a browser that holds our cookies (origin check)", async () => {
    const { actor, password } = await createTestUser({ role: "engineer" });
    const cookie = "better-auth.session_token=anything";
    const result = await post("/sign-in/email", { email: actor.email, password }, { origin: "https://evil.example", cookie });
    expect(result.status).toBe(403);
    expect(result.body.code).toBe("INVALID_ORIGIN");
    // 127.0.0.1 and localhost name the same demo server: both are trusted.
    const local = new URL(BASE);
    const twin = local.hostname === "127.0.0.1" ? "localhost" : local.hostname === "localhost" ? "127.0.0.1" : local.hostname;
    const ok = await post("/sign-in/email", { email: actor.email, password }, { origin: `${local.protocol}//${twin}:${local.port}`, cookie });
    expect(ok.status).toBe(200);
  });

  it(`allows ${SIGN_IN_RATE_LIMIT.max} attempts a minute per account and address, then answers 429 and audits the refusal`, async () => {
    const { actor, password } = await createTestUser({ role: "engineer" });
    const { actor: colleague, password: colleaguePassword } = await createTestUser({ role: "lead" });
    const ip = uniqueIp();
    for (let attempt = 1; attempt <= SIGN_IN_RATE_LIMIT.max; attempt++) {
      expect((await post("/sign-in/email", { email: actor.email, password: "wrong-password-x" }, { ip })).status).toBe(401);
    }
    const before = await countRows();
    // Even the right password is refused until the window has passed.
    const limited = await post("/sign-in/email", { email: actor.email, password }, { ip });
    expect(limited.status).toBe(429);
    expect(Number(limited.headers.get("x-retry-after"))).toBeGreaterThan(0);
    expect(describeAuthError({ status: 429 })).toMatch(/Too many attempts/);
    expect(changedTables(before, await countRows())).toEqual(["audit_events"]);
    const events = await auditEventsFor({ action: "auth.sign-in.failed", actorEmail: actor.email });
    expect(events.map((e) => e.details.reason)).toContain("RATE_LIMITED");
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
    expect((await post("/sign-in/email", { email, password: "guess-password" }, { ip })).status).toBe(429);
    const [event] = await auditEventsFor({ action: "auth.sign-in.failed", actorEmail: email });
    expect(event.details).toMatchObject({ reason: "RATE_LIMITED", knownUser: false });
  });
});
