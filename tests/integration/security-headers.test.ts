// Every kind of response the served test build gives carries the security headers, exactly: a page
// signed out and signed in, the 403 and 404 pages, a route handler, better-auth's endpoints and a static
// file. Route handlers and static files carry the policy without a nonce. A page's Content-Security-Policy names a nonce that is new for every response and that every
// script on the page carries (Next stamps it). Over https (not served by the tests), the proxy adds HSTS
// and better-auth marks its cookies Secure; both are checked in-process with an https address.
import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { NextRequest } from "next/server";
import { forgetServerEnv } from "@/lib/server-env";
import { appUrl } from "../support/env";
import { createTestUser, signInHeaders, TEST_PASSWORD } from "./helpers/people";

// Written out by hand from the issue, not imported from lib/domain/security-headers.ts: a change to the
// policy must change this test too.
const NONCE = "([A-Za-z0-9+/]{22}==)";
/** The policy with these script sources (no regular-expression characters in the rest of it). */
const policyWith = (scripts: string) =>
  [
    "default-src 'self'",
    `script-src ${scripts}`,
    // The run form's preview runs the evaluation bundle as a module Worker from the app's own origin.
    "worker-src 'self'",
    "style-src 'self'",
    "style-src-attr 'unsafe-inline'",
    "img-src 'self'",
    "font-src 'self'",
    "connect-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join("; ");
const PAGE_POLICY = new RegExp(`^${policyWith(`'self' 'nonce-${NONCE}' 'strict-dynamic'`)}$`);
const STATIC_POLICY = policyWith("'self'");

const OTHER_HEADERS = {
  "x-content-type-options": "nosniff",
  "referrer-policy": "strict-origin-when-cross-origin",
  "x-frame-options": "DENY",
};

/** The response's security headers, each exactly once (a header sent twice arrives joined by ", "). */
function expectSecurityHeaders(response: Response, policy: "page" | "static"): string | null {
  for (const [name, value] of Object.entries(OTHER_HEADERS)) expect(response.headers.get(name), name).toBe(value);
  // Served over http: no HSTS (a browser would ignore it, and a local address must stay reachable).
  expect(response.headers.get("strict-transport-security")).toBeNull();
  const csp = response.headers.get("content-security-policy");
  if (policy === "static") {
    expect(csp).toBe(STATIC_POLICY);
    return null;
  }
  expect(csp).toMatch(PAGE_POLICY);
  return PAGE_POLICY.exec(csp!)![1];
}

async function get(path: string, headers: HeadersInit = {}): Promise<{ response: Response; text: string }> {
  const response = await fetch(appUrl(path), { headers, redirect: "manual" });
  return { response, text: await response.text() };
}

/** Every <script> tag's nonce attribute (undefined for a tag without one). */
function scriptNonces(html: string): (string | undefined)[] {
  return [...html.matchAll(/<script\b[^>]*>/g)].map((tag) => /\snonce="([^"]*)"/.exec(tag[0])?.[1]);
}

let admin: Headers;
let engineer: Headers;

beforeAll(async () => {
  const person = await createTestUser({ role: "admin", label: "headers-admin" });
  admin = await signInHeaders(person.actor.email, TEST_PASSWORD);
  const other = await createTestUser({ role: "engineer", label: "headers-engineer" });
  engineer = await signInHeaders(other.actor.email, TEST_PASSWORD);
});

describe("security headers over http", () => {
  // [what, address, who, status, what shows it is that page]
  it.each([
    ["a page signed out", "/sign-in", "anonymous", 200, "<title>Sign in · Gusset</title>"],
    [
      "a page signed in: the People page, which no site may frame",
      "/admin/users",
      "admin",
      200,
      "<title>People · Gusset</title>",
    ],
    // Next draws forbidden() in the browser from the page's RSC payload, so the page's scripts must run.
    ["the 403 page", "/admin/users", "engineer", 403, '\\"data-testid\\":\\"forbidden-page\\"'],
    ["the 404 page", "/no-such-page-here", "anonymous", 404, 'data-testid="not-found-page"'],
  ] as const)("on %s, whose every script carries the response's nonce", async (_what, address, who, status, marker) => {
    const { response, text } = await get(address, who === "admin" ? admin : who === "engineer" ? engineer : {});
    expect(response.status).toBe(status);
    expect(text).toContain(marker);
    const nonce = expectSecurityHeaders(response, "page");
    const nonces = scriptNonces(text);
    expect(nonces.length).toBeGreaterThan(3); // Next's chunks and its inline RSC payload
    expect(new Set(nonces)).toEqual(new Set([nonce]));
  });

  it("gives each response a nonce of its own", async () => {
    const seen = new Set<string | null>();
    for (let i = 0; i < 3; i++) seen.add(expectSecurityHeaders((await get("/sign-in")).response, "page"));
    expect(seen.size).toBe(3);
  });

  it("on the outage page's address, which is a 404 while the database is up", async () => {
    // The header only the proxy may set is dropped when a client sends it.
    const { response, text } = await get("/unavailable", { "x-gusset-outage": "/home" });
    expect(response.status).toBe(404);
    expect(text).not.toContain("cannot reach its database");
    expectSecurityHeaders(response, "page");
    const home = await get("/home", { ...Object.fromEntries(admin), "x-gusset-outage": "/home" });
    expect(home.response.status).toBe(200);
    expect(home.text).toContain("<title>Home · Gusset</title>");
  });

  // Route handlers answer JSON and files, which run no script: they carry the fixed policy, without a nonce
  // (proxy.ts does not run for them).
  it("on a route handler, signed out and signed in", async () => {
    const health = await get("/api/health");
    expect(health.response.status).toBe(200);
    expectSecurityHeaders(health.response, "static");
    const me = await get("/api/me", admin);
    expect(me.response.status).toBe(200);
    expectSecurityHeaders(me.response, "static");
    const anonymous = await get("/api/me");
    expect(anonymous.response.status).toBe(401);
    expectSecurityHeaders(anonymous.response, "static");
  });

  it("a route handler is never swapped for the outage page, whatever header a client sends", async () => {
    const me = await get("/api/me", { ...Object.fromEntries(admin), "x-gusset-outage": "/api/me" });
    expect(me.response.status).toBe(200);
    expect(me.response.headers.get("content-type")).toBe("application/json");
    expect(JSON.parse(me.text)).toHaveProperty("email");
  });

  it("on better-auth's endpoints", async () => {
    const session = await get("/api/auth/get-session", admin);
    expect(session.response.status).toBe(200);
    expectSecurityHeaders(session.response, "static");
    const refused = await fetch(appUrl("/api/auth/sign-in/email"), {
      method: "POST",
      headers: { "Content-Type": "application/json", Origin: "https://evil.example" },
      body: JSON.stringify({ email: "nobody@test.gusset.example", password: "wrong-password-1" }),
    });
    expect(refused.status).toBe(403);
    expectSecurityHeaders(refused, "static");
  });

  it("on the build's static files, without a nonce", async () => {
    const { text } = await get("/sign-in");
    const script = /<script src="(\/_next\/static\/[^"]+\.js)"/.exec(text)?.[1];
    const stylesheet = /<link rel="stylesheet" href="(\/_next\/static\/[^"]+\.css)"/.exec(text)?.[1];
    expect(script).toBeDefined();
    expect(stylesheet).toBeDefined();
    for (const path of [script!, stylesheet!]) {
      const { response } = await get(path);
      expect(response.status, path).toBe(200);
      expectSecurityHeaders(response, "static");
    }
    const missing = await get("/_next/static/chunks/no-such-file.js");
    expect(missing.response.status).toBe(404);
    expectSecurityHeaders(missing.response, "static");
  });

  it("on the icon", async () => {
    const { text } = await get("/sign-in");
    const icon = /<link rel="icon" href="([^"]+)"/.exec(text)?.[1];
    expect(icon).toMatch(/^\/icon\.svg/);
    const { response } = await get(icon!);
    expect(response.status).toBe(200);
    expect(response.headers.get("content-type")).toBe("image/svg+xml");
    expectSecurityHeaders(response, "page");
  });
});

describe("over https", () => {
  const saved = process.env.BETTER_AUTH_URL;
  afterEach(() => {
    process.env.BETTER_AUTH_URL = saved;
    forgetServerEnv();
    vi.resetModules();
  });

  function serveOverHttps(): void {
    process.env.BETTER_AUTH_URL = "https://gusset.marrowby-fenn.example";
    forgetServerEnv();
    vi.resetModules();
  }

  it("adds HSTS and upgrade-insecure-requests to every response the proxy answers", async () => {
    serveOverHttps();
    const { proxy } = await import("@/proxy");
    for (const path of ["/sign-in", "/icon.svg"]) {
      const response = await proxy(new NextRequest(`https://gusset.marrowby-fenn.example${path}`));
      expect(response.headers.get("strict-transport-security"), path).toBe("max-age=31536000; includeSubDomains");
      expect(response.headers.get("content-security-policy"), path).toMatch(
        /; frame-ancestors 'none'; upgrade-insecure-requests$/,
      );
      expect(response.headers.get("x-frame-options")).toBe("DENY");
    }
  });

  /** The session cookie better-auth (set up for the address in force) sets when a new person signs in. */
  async function sessionCookieOnSignIn(): Promise<string | undefined> {
    const { auth } = await import("@/lib/auth/server");
    const { actor } = await createTestUser({ role: "engineer", label: "cookie" });
    const { headers } = await auth.api.signInEmail({
      body: { email: actor.email, password: TEST_PASSWORD },
      returnHeaders: true,
    });
    return headers.getSetCookie().find((cookie) => cookie.includes("session_token="));
  }

  it("has better-auth set its session cookie Secure (and __Secure- prefixed)", async () => {
    serveOverHttps();
    const session = await sessionCookieOnSignIn();
    expect(session).toMatch(/^__Secure-better-auth\.session_token=/);
    expect(session?.split(";").map((part) => part.trim().toLowerCase())).toEqual(
      expect.arrayContaining(["secure", "httponly", "samesite=lax", "path=/"]),
    );
  });

  it("and over http leaves both out", async () => {
    const session = await sessionCookieOnSignIn();
    expect(session).toMatch(/^better-auth\.session_token=/);
    expect(session?.toLowerCase()).not.toMatch(/;\s*secure/);
    const { proxy } = await import("@/proxy");
    const response = await proxy(new NextRequest("http://127.0.0.1:3100/sign-in"));
    expect(response.headers.get("strict-transport-security")).toBeNull();
    expect(response.headers.get("content-security-policy")).not.toContain("upgrade-insecure-requests");
  });
});
