// The database goes away under the running test server, and comes back. While it is away, a page answers
// 503 with Gusset's outage page, the API 503 `unavailable`, /api/health 503 naming the database as down;
// once it is back, all of it works again with no restart. The server is not told anything: the test
// stops and starts this checkout's PostgreSQL (scripts/postgres-control.mjs).
//
// Every other test needs the database, so this file runs alone and last: vitest.config.ts gives it a
// project of its own after the browser tests. afterAll starts PostgreSQL again whatever happened.
import { execFileSync } from "node:child_process";
import path from "node:path";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { isDatabaseUnavailable } from "@/lib/domain/errors";
import { appUrl, testEnv } from "../support/env";
import { createTestUser, signInHeaders, TEST_PASSWORD } from "./helpers/people";

const MESSAGE = "Gusset cannot reach its database; try again in a minute.";
const CONTROL = path.resolve(import.meta.dirname, "..", "..", "scripts", "postgres-control.mjs");

let stopped = false;
/** `npm test` starts PostgreSQL without fsync; start it again as it was. */
let fast = false;

function postgres(command: "stop" | "start"): void {
  const args = [CONTROL, command, ...(command === "start" && fast ? ["--fast"] : [])];
  execFileSync(process.execPath, args, { env: process.env, stdio: ["ignore", "inherit", "inherit"], timeout: 90_000 });
  stopped = command === "stop";
}

async function get(pathname: string, headers: HeadersInit = {}) {
  const response = await fetch(appUrl(pathname), { headers, redirect: "manual" });
  return { status: response.status, headers: response.headers, text: await response.text() };
}

let signedIn: Headers;
let adminEmail: string;
let held: pg.Client;
const heldErrors: unknown[] = [];

beforeAll(async () => {
  const { actor } = await createTestUser({ role: "admin", label: "outage-admin" });
  adminEmail = actor.email;
  signedIn = await signInHeaders(actor.email, TEST_PASSWORD);
  expect((await get("/api/health")).status).toBe(200);
  // A connection open when the server goes down, as the app's pool holds them.
  held = new pg.Client({ connectionString: testEnv.databaseUrl });
  held.on("error", (error) => heldErrors.push(error));
  await held.connect();
  fast = (await held.query<{ fsync: string }>("show fsync")).rows[0].fsync === "off";
});

afterAll(async () => {
  if (stopped) postgres("start");
  await held?.end().catch(() => undefined);
});

describe("while the database is stopped", () => {
  beforeAll(() => postgres("stop"));

  it("is really gone: an open connection is ended and a new one refused, both read as an outage", async () => {
    await expect.poll(() => heldErrors.length, { timeout: 5000 }).toBeGreaterThan(0);
    expect(heldErrors[0]).toMatchObject({ code: "57P01" }); // terminating connection due to administrator command
    expect(isDatabaseUnavailable(heldErrors[0])).toBe(true);
    const fresh = new pg.Client({ connectionString: testEnv.databaseUrl });
    const refused = await fresh.connect().then(
      () => null,
      (error: unknown) => error,
    );
    await fresh.end().catch(() => undefined);
    expect(refused).toMatchObject({ code: "ECONNREFUSED" });
    expect(isDatabaseUnavailable(refused)).toBe(true);
  });

  it.each([
    ["a signed-in page", "/home", true],
    ["the People page with a query", "/admin/users?filter=active", true],
    ["the sign-in page, signed out", "/sign-in", false],
    ["the bare address", "/", false],
  ])("answers %s with 503 and the outage page", async (_label, pathname, withSession) => {
    const page = await get(pathname, withSession ? signedIn : {});
    expect(page.status).toBe(503);
    expect(page.headers.get("retry-after")).toBe("30");
    expect(page.headers.get("content-type")).toMatch(/^text\/html/);
    expect(page.headers.get("content-security-policy")).toMatch(/'nonce-[A-Za-z0-9+/]{22}=='/);
    expect(page.headers.get("x-frame-options")).toBe("DENY");
    expect(page.text).toContain('data-testid="unavailable-page"');
    expect(page.text).toContain(`<p data-testid="unavailable-message">${MESSAGE}</p>`);
    expect(page.text).toContain("<title>Cannot reach the database · Gusset</title>");
    // "Try again" reloads the page that was asked for.
    const retry = /<a href="([^"]*)"[^>]*data-testid="unavailable-retry"/.exec(page.text)?.[1];
    expect(retry?.replaceAll("&amp;", "&")).toBe(pathname);
    // The whole page came from the server with no database: nothing of it failed half-way.
    expect(page.text).not.toMatch(/Application error|Internal Server Error/);
  });

  it("answers the API with 503 `unavailable` in JSON", async () => {
    for (const pathname of ["/api/me", "/api/auth/get-session"]) {
      const answer = await get(pathname, signedIn);
      expect([pathname, answer.status, answer.headers.get("retry-after")]).toEqual([pathname, 503, "30"]);
      expect(JSON.parse(answer.text)).toEqual({ error: { code: "unavailable", message: MESSAGE } });
    }
  });

  it("reports the database down on /api/health with 503, with or without a session cookie", async () => {
    for (const headers of [{}, signedIn]) {
      const health = await get("/api/health", headers);
      expect(health.status).toBe(503);
      // no-transform: a small JSON answer goes as it is, not through gzip (lib/domain/json-response.ts).
      expect(health.headers.get("cache-control")?.split(", ")).toEqual(["no-store", "no-transform"]);
      expect(JSON.parse(health.text)).toEqual({ status: "unavailable", checks: { database: "down", queue: "unknown" } });
    }
  });
});

describe("when the database is back", () => {
  beforeAll(() => postgres("start"));

  it("reports it up on /api/health and serves pages and the API again, with no restart", async () => {
    await expect.poll(async () => (await get("/api/health")).status, { timeout: 20_000, interval: 250 }).toBe(200);
    expect(JSON.parse((await get("/api/health")).text)).toEqual({ status: "ok", checks: { database: "up", queue: "up" } });
    const home = await get("/home", signedIn);
    expect(home.status).toBe(200);
    expect(home.text).toContain("<title>Home · Gusset</title>");
    expect(home.text).not.toContain("unavailable-page");
    const me = await get("/api/me", signedIn);
    expect(me.status).toBe(200);
    expect(JSON.parse(me.text)).toMatchObject({ email: adminEmail, role: "admin" });
  });
});
