// Signing in over HTTP for tests, gently. The server allows a handful of sign-in attempts per minute
// from one address and only forgets them after a minute without any (lib/auth/server.ts), so demo
// sessions are cached in a temp file across test files (checked with /api/me before reuse), and a
// refused attempt waits out the server's Retry-After and tries again.
import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { DEMO_USERS } from "@/db/demo-users";
import type { Role } from "@/lib/domain/roles";
import { appUrl, testEnv } from "../env";

// The first demo person of each role (the demo has a second lead, the reviewer, listed after the first).
export const DEMO_BY_ROLE = Object.fromEntries(DEMO_USERS.toReversed().map((user) => [user.role, user])) as Record<
  Role,
  (typeof DEMO_USERS)[number]
>;

/** The one cookie better-auth's session needs, as "name=value". */
export type SessionCookie = string;

const cacheFile = path.join(
  os.tmpdir(),
  `gusset-test-sessions-${crypto.createHash("sha256").update(testEnv.baseUrl).digest("hex").slice(0, 12)}.json`,
);

function readCache(): Record<string, SessionCookie> {
  try {
    return JSON.parse(fs.readFileSync(cacheFile, "utf8")) as Record<string, SessionCookie>;
  } catch {
    return {};
  }
}

function writeCache(email: string, cookie: SessionCookie): void {
  fs.writeFileSync(cacheFile, JSON.stringify({ ...readCache(), [email]: cookie }), { mode: 0o600 });
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/** Longest we wait for the sign-in limiter before giving up (it forgets after 60 s of quiet). */
const RATE_LIMIT_PATIENCE_MS = 150_000;

export type SignInAnswer = { status: number; cookie: SessionCookie | null; body: { code?: string; message?: string } };

/** One attempt, exactly as a browser on the app's own origin would make it. */
export async function postSignIn(email: string, password: string): Promise<SignInAnswer & { retryAfterS: number | null }> {
  const response = await fetch(appUrl("/api/auth/sign-in/email"), {
    method: "POST",
    headers: { "Content-Type": "application/json", Origin: testEnv.baseUrl },
    body: JSON.stringify({ email, password }),
    redirect: "manual",
  });
  const setCookies = response.headers.getSetCookie();
  const session = setCookies.map((line) => line.split(";")[0]).find((pair) => /session_token=/.test(pair)) ?? null;
  const retryAfter = response.headers.get("x-retry-after") ?? response.headers.get("retry-after");
  const body = (await response.json().catch(() => ({}))) as SignInAnswer["body"];
  return { status: response.status, cookie: session, body, retryAfterS: retryAfter ? Number(retryAfter) : null };
}

/** Signs in, waiting out the rate limiter if it refuses; throws on any other failure. */
export async function signInOverHttp(email: string, password: string): Promise<SessionCookie> {
  const deadline = Date.now() + RATE_LIMIT_PATIENCE_MS;
  for (;;) {
    const answer = await postSignIn(email, password);
    if (answer.status === 200 && answer.cookie) return answer.cookie;
    if (answer.status === 429 && Date.now() < deadline) {
      await sleep(((answer.retryAfterS ?? 60) + 1) * 1000);
      continue;
    }
    throw new Error(`sign-in as ${email} answered ${answer.status}: ${JSON.stringify(answer.body)}`);
  }
}

/** Who the cookie belongs to now, or null when the session is gone. */
export async function whoAmI(cookie: SessionCookie | null): Promise<{ email: string; role: Role } | null> {
  const response = await fetch(appUrl("/api/me"), { headers: cookie ? { Cookie: cookie } : {} });
  if (response.status !== 200) return null;
  return (await response.json()) as { email: string; role: Role };
}

/** A live session for a demo user: the cached one if the server still honours it, else a new one. */
export async function demoSession(role: Role): Promise<SessionCookie> {
  const { email, password } = DEMO_BY_ROLE[role];
  const cached = readCache()[email];
  if (cached && (await whoAmI(cached))?.email === email) return cached;
  const cookie = await signInOverHttp(email, password);
  writeCache(email, cookie);
  return cookie;
}

/** The cookie in the shape a Playwright browser context takes. */
export function toBrowserCookies(cookie: SessionCookie): { name: string; value: string; url: string }[] {
  const separator = cookie.indexOf("=");
  return [{ name: cookie.slice(0, separator), value: cookie.slice(separator + 1), url: testEnv.baseUrl }];
}

/** An address nobody has used before, on the reserved .example domain (never deliverable). */
export function uniqueEmail(label: string): string {
  return `${label}-${Date.now().toString(36)}-${crypto.randomBytes(3).toString("hex")}@marrowby-fenn.example`;
}
