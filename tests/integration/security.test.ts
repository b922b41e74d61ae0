// Attacks replayed against the running test server over HTTP (scripts/serve.mjs in front of Next), so
// what an attacker meets is what is tested: forged client addresses, redirects after sign-in, reset
// requests from other sites and their timing, switched-off endpoints, control characters, and server
// actions from other sites, too large or unreadable. `npm run probe:security` runs this file alone.
//
// Addresses: Linux answers all of 127.0.0.0/8 on loopback, so a test picks the address it connects from.
// The test server trusts 127.0.0.2 as its load balancer (GUSSET_TRUSTED_PROXIES in scripts/lib/env.mjs);
// 127.0.0.3 plays an attacker who is not a proxy; the browser tests use 127.0.0.1, whose counters these
// tests leave alone.
import http from "node:http";
import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { ACCOUNT_LOCKED_MESSAGE, ACCOUNT_SIGN_IN_LIMIT, FOREIGN_ORIGIN_MESSAGE, SIGN_IN_RATE_LIMIT } from "@/lib/auth/server";
import { testEnv } from "../support/env";
import { auditEventsFor, createTestUser, uniqueEmail } from "./helpers/people";

const BASE = testEnv.baseUrl.replace(/\/+$/, "");
const PROXY = "127.0.0.2";
const ATTACKER = "127.0.0.3";

type Reply = { status: number; headers: http.IncomingHttpHeaders; text: string; json: () => Record<string, unknown> };

function send(
  pathname: string,
  {
    method = "GET",
    headers = {},
    body,
    from = ATTACKER,
  }: { method?: string; headers?: Record<string, string>; body?: string | Buffer; from?: string } = {},
): Promise<Reply> {
  const url = new URL(pathname, BASE);
  return new Promise((resolve, reject) => {
    const request = http.request(
      url,
      {
        method,
        headers: body === undefined ? headers : { "content-length": String(Buffer.byteLength(body)), ...headers },
        localAddress: from,
      },
      (response) => {
        const chunks: Buffer[] = [];
        response.on("data", (chunk: Buffer) => chunks.push(chunk));
        response.on("end", () => {
          const text = Buffer.concat(chunks).toString("utf8");
          resolve({ status: response.statusCode ?? 0, headers: response.headers, text, json: () => JSON.parse(text) });
        });
      },
    );
    request.on("error", reject);
    if (body !== undefined) request.write(body);
    request.end();
  });
}

const json = (value: unknown) => JSON.stringify(value);
const ownOrigin = { origin: BASE, "content-type": "application/json" };

type AuthPostOptions = { from?: string; forwardedFor?: string; origin?: string };

/** A POST to one of the auth endpoints, as a browser on Gusset's page sends it unless told otherwise. */
function authPost(endpoint: string, body: unknown, options: AuthPostOptions = {}) {
  return send(`/api/auth${endpoint}`, {
    method: "POST",
    from: options.from,
    headers: {
      ...ownOrigin,
      ...(options.origin ? { origin: options.origin } : {}),
      ...(options.forwardedFor ? { "x-forwarded-for": options.forwardedFor } : {}),
    },
    body: json(body),
  });
}

const signIn = (email: string, password: string, options?: AuthPostOptions) =>
  authPost("/sign-in/email", { email, password }, options);
const requestReset = (email: string, options?: AuthPostOptions) =>
  authPost("/request-password-reset", { email, redirectTo: "/reset-password" }, options);

/** A fresh address from TEST-NET-3 for each request a test sends through the trusted proxy. */
let nextHost = 1;
function testNetAddress(): string {
  nextHost = (nextHost % 250) + 1;
  return `203.0.113.${nextHost}`;
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)];
}

async function sessionCookie(email: string, password: string): Promise<string> {
  const reply = await signIn(email, password, { from: PROXY, forwardedFor: testNetAddress() });
  expect(reply.status).toBe(200);
  const cookies = reply.headers["set-cookie"] ?? [];
  return cookies.map((cookie) => cookie.split(";")[0]).join("; ");
}

describe("client address", () => {
  it("ignores X-Forwarded-For from a peer that is not a trusted proxy: forged addresses do not escape the limit", async () => {
    const { actor } = await createTestUser({ role: "engineer", label: "forged-xff" });
    const statuses: number[] = [];
    for (let attempt = 1; attempt <= SIGN_IN_RATE_LIMIT.max + 3; attempt++) {
      statuses.push((await signIn(actor.email, "wrong-password-x", { forwardedFor: `10.9.8.${attempt}` })).status);
    }
    // Before the fix every attempt was a new address to the limiter: 8 × 401, never a 429.
    expect(statuses).toEqual([...Array<number>(SIGN_IN_RATE_LIMIT.max).fill(401), 429, 429, 429]);
    const events = await auditEventsFor({ action: "auth.sign-in.failed", actorEmail: actor.email });
    expect(events).toHaveLength(SIGN_IN_RATE_LIMIT.max + 3);
    expect(new Set(events.map((event) => event.ipAddress))).toEqual(new Set([ATTACKER]));
  }, 120_000);

  it("ignores forged X-Forwarded-For on reset requests too", async () => {
    const statuses: number[] = [];
    for (let attempt = 1; attempt <= 5; attempt++) {
      statuses.push((await requestReset(uniqueEmail("reset-flood"), { forwardedFor: `10.7.6.${attempt}` })).status);
    }
    expect(statuses).toEqual([200, 200, 200, 429, 429]);
  });

  it("reads the client from X-Forwarded-For when a trusted proxy connects: the rightmost address it did not add", async () => {
    const email = uniqueEmail("behind-proxy");
    expect((await signIn(email, "wrong-password-x", { from: PROXY, forwardedFor: "203.0.113.77" })).status).toBe(401);
    // A client that sends its own X-Forwarded-For through the proxy only adds entries on the left.
    expect((await signIn(email, "wrong-password-x", { from: PROXY, forwardedFor: "6.6.6.6, 203.0.113.78" })).status).toBe(401);
    const events = await auditEventsFor({ action: "auth.sign-in.failed", actorEmail: email });
    expect(events.map((event) => event.ipAddress).sort()).toEqual(["203.0.113.77", "203.0.113.78"]);
  });

  it(`locks an account after ${ACCOUNT_SIGN_IN_LIMIT.max} failed sign-ins from any addresses, known e-mail or not, in the same words`, async () => {
    const { actor, password } = await createTestUser({ role: "engineer", label: "lockout" });
    const unknown = uniqueEmail("lockout-nobody");
    for (const email of [actor.email, unknown]) {
      for (let attempt = 1; attempt <= ACCOUNT_SIGN_IN_LIMIT.max; attempt++) {
        expect((await signIn(email, "wrong-password-x", { from: PROXY, forwardedFor: testNetAddress() })).status).toBe(401);
      }
    }
    const locked = await signIn(actor.email, "wrong-password-x", { from: PROXY, forwardedFor: testNetAddress() });
    const lockedUnknown = await signIn(unknown, "wrong-password-x", { from: PROXY, forwardedFor: testNetAddress() });
    expect(locked.status).toBe(429);
    expect(locked.json()).toEqual({ code: "ACCOUNT_LOCKED", message: ACCOUNT_LOCKED_MESSAGE });
    expect(lockedUnknown.status).toBe(429);
    expect(lockedUnknown.json()).toEqual(locked.json());
    // Even the right password waits out the lock.
    expect((await signIn(actor.email, password, { from: PROXY, forwardedFor: testNetAddress() })).status).toBe(429);
    const reasons = (await auditEventsFor({ action: "auth.sign-in.failed", actorEmail: actor.email })).map((e) => e.details);
    expect(reasons.filter((details) => (details as { reason: string }).reason === "ACCOUNT_LOCKED")).toHaveLength(2);
  }, 180_000); // some 25 password checks, each a deliberately slow hash

  it("forgets the failed sign-ins of an account once someone signs in to it", async () => {
    const { actor, password } = await createTestUser({ role: "engineer", label: "lockout-reset" });
    const attempt = (pass: string) => signIn(actor.email, pass, { from: PROXY, forwardedFor: testNetAddress() });
    for (let i = 1; i < ACCOUNT_SIGN_IN_LIMIT.max; i++) expect((await attempt("wrong-password-x")).status).toBe(401);
    expect((await attempt(password)).status).toBe(200);
    for (let i = 1; i < ACCOUNT_SIGN_IN_LIMIT.max; i++) expect((await attempt("wrong-password-x")).status).toBe(401);
    expect((await attempt(password)).status).toBe(200);
  }, 180_000);
});

describe("redirect after sign-in", () => {
  const hostile = [
    "/%09/evil.example",
    "/%0a/evil.example",
    "/%0d%0a/evil.example",
    "/%00",
    "//evil.example",
    "/%5Cevil.example",
  ];

  it.each(hostile)("a signed-in visitor asking for ?next=%s is sent home", async (next) => {
    const { actor, password } = await createTestUser({ role: "engineer", label: "redirect" });
    const cookie = await sessionCookie(actor.email, password);
    const reply = await send(`/sign-in?next=${next}`, { headers: { cookie } });
    // Before the fix: a 307 to //evil.example for the tab, and a 500 for the newline and NUL.
    expect(reply.status).toBe(307);
    expect(reply.headers.location).toBe("/home");
  });

  it.each(hostile)("a signed-out visitor asking for ?next=%s gets the form, which leads home", async (next) => {
    const reply = await send(`/sign-in?next=${next}`);
    expect(reply.status).toBe(200);
    // The form's own prop, in the page's flight data: after signing in it goes home.
    expect(reply.text).toContain(String.raw`\"next\":\"/home\"`);
  });

  it("a signed-out visitor is sent to sign in with the page they asked for, never a path they claim in a header", async () => {
    const reply = await send("/admin/users?tab=pending", { headers: { "x-gusset-path": "//evil.example" } });
    expect(reply.status).toBe(307);
    expect(reply.headers.location).toBe(`/sign-in?next=${encodeURIComponent("/admin/users?tab=pending")}`);
  });

  it("keeps a path on Gusset", async () => {
    const { actor, password } = await createTestUser({ role: "engineer", label: "redirect-ok" });
    const cookie = await sessionCookie(actor.email, password);
    const reply = await send(`/sign-in?next=${encodeURIComponent("/jobs?view=all")}`, { headers: { cookie } });
    expect(reply.status).toBe(307);
    expect(reply.headers.location).toBe("/jobs?view=all");
  });
});

describe("password reset requests", () => {
  it("refuses a request from another site, and audits it", async () => {
    const email = uniqueEmail("reset-foreign");
    const reply = await requestReset(email, { from: PROXY, forwardedFor: testNetAddress(), origin: "https://evil.example" });
    expect(reply.status).toBe(403);
    expect(reply.json()).toEqual({ code: "INVALID_ORIGIN", message: FOREIGN_ORIGIN_MESSAGE });
    const [event] = await auditEventsFor({ action: "auth.password-reset.requested", actorEmail: email });
    expect(event.details).toEqual({ reason: "INVALID_ORIGIN", knownUser: false });
  });

  it("answers a known and an unknown address alike and in about the same time", async () => {
    const known: number[] = [];
    const unknown: number[] = [];
    const answers = new Set<string>();
    for (let round = 0; round < 8; round++) {
      const { actor } = await createTestUser({ role: "engineer", label: "reset-timing" });
      for (const [email, times] of [
        [actor.email, known],
        [uniqueEmail("reset-timing-nobody"), unknown],
      ] as const) {
        const started = performance.now();
        const reply = await requestReset(email, { from: PROXY, forwardedFor: testNetAddress() });
        times.push(performance.now() - started);
        expect(reply.status).toBe(200);
        answers.add(reply.text);
      }
    }
    expect(answers.size).toBe(1);
    const gap = Math.abs(median(known) - median(unknown));
    console.info(
      `[security] reset request, median answer: known address ${median(known).toFixed(1)} ms, unknown ${median(unknown).toFixed(1)} ms, gap ${gap.toFixed(1)} ms`,
    );
    // Before the fix the gap was about 120 ms (the look-up, token and queued mail ran before the answer).
    // Both now do the same work before answering; the bound leaves room for a busy machine.
    expect(gap).toBeLessThan(60);
  });
});

describe("switched-off endpoints", () => {
  it.each(["/change-password", "/revoke-other-sessions", "/list-sessions", "/update-session", "/verify-password"])(
    "%s is not there, even with a session",
    async (endpoint) => {
      const { actor, password } = await createTestUser({ role: "engineer", label: "endpoints" });
      const cookie = await sessionCookie(actor.email, password);
      const reply = await send(`/api/auth${endpoint}`, {
        method: endpoint === "/list-sessions" ? "GET" : "POST",
        headers: { ...ownOrigin, cookie },
        body: json({ currentPassword: password, newPassword: "another-long-password", revokeOtherSessions: false }),
      });
      expect(reply.status).toBe(404);
    },
  );
});

describe("control characters", () => {
  it.each([
    ["sign-in", "/api/auth/sign-in/email", { email: "nul\u0000@test.gusset.example", password: "whatever-password" }],
    ["reset request", "/api/auth/request-password-reset", { email: "nul\u0000@test.gusset.example" }],
    ["reset", "/api/auth/reset-password", { token: "abc\u0000", newPassword: "another-long-password" }],
  ])("a NUL byte in a %s field is a 400 with a sentence, not a 500", async (_what, endpoint, body) => {
    const reply = await send(endpoint, {
      method: "POST",
      from: PROXY,
      headers: { ...ownOrigin, "x-forwarded-for": testNetAddress() },
      body: json(body),
    });
    expect(reply.status).toBe(400);
    expect(reply.json()).toEqual({
      code: "INVALID_CHARACTERS",
      message: "Remove the control characters from what you typed and try again.",
    });
  });
});

describe("server actions", () => {
  const manifest = JSON.parse(readFileSync(path.join(process.cwd(), ".next/server/server-reference-manifest.json"), "utf8")) as {
    node: Record<string, { exportedName?: string }>;
  };
  const actionId = Object.keys(manifest.node)[0];
  const post = (headers: Record<string, string>, body: string | Buffer) =>
    send("/admin/users", {
      method: "POST",
      headers: { "next-action": actionId, "content-type": "text/plain;charset=UTF-8", ...headers },
      body,
    });

  it("a call from Gusset's own page reaches the action (the baseline the refusals below differ from)", async () => {
    const reply = await post({ origin: BASE }, json([null, {}]));
    expect(reply.status).toBe(200);
    expect(reply.text).toContain("Please sign in to continue.");
  });

  it.each([
    ["another site's origin", { origin: "https://evil.example" }],
    ["no origin at all", {}],
  ])("a call with %s is refused with 403 and a sentence", async (_what, headers) => {
    const reply = await post(headers, json([null, {}]));
    expect(reply.status).toBe(403);
    expect(reply.text).toBe("This request did not come from a Gusset page. Open Gusset at its own address and try again.\n");
    expect(reply.headers["content-security-policy"]).toBe("default-src 'none'; frame-ancestors 'none'");
    expect(reply.headers["x-content-type-options"]).toBe("nosniff");
  });

  it("a body over 1 MB is refused with 413", async () => {
    const reply = await post({ origin: BASE }, Buffer.alloc(1024 * 1024 + 1, "a"));
    expect(reply.status).toBe(413);
    expect(reply.text).toMatch(/larger than Gusset accepts \(1 MB\)/);
  });

  it.each([
    ["not JSON", "not json {{{"],
    ["a NUL byte", "[\u0000"],
  ])("a body that is %s is a 400 with a sentence", async (_what, body) => {
    const reply = await post({ origin: BASE }, body);
    expect(reply.status).toBe(400);
    expect(reply.text).toBe("Gusset could not read this request. Reload the page and try again.\n");
  });
});
