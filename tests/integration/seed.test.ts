// The demo seed: fills an empty database once (firm, one user per role, two projects) and leaves a
// database with users alone; the demo users can sign in with the passwords the README prints.
import { spawnSync } from "node:child_process";
import { randomBytes } from "node:crypto";
import path from "node:path";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_FIRM_NAME, DEMO_PROJECTS, DEMO_USERS } from "@/db/demo-users";
import { auth } from "@/lib/auth/server";

const serverUrl = new URL(process.env.DATABASE_URL ?? "postgres://postgres@127.0.0.1:54329/gusset_test");
const databaseName = `gusset_seed_check_${randomBytes(4).toString("hex")}`;
const freshUrl = new URL(serverUrl);
freshUrl.pathname = `/${databaseName}`;

function runScript(script: string, args: string[] = []) {
  const tsx = path.resolve("node_modules/.bin/tsx");
  return spawnSync(tsx, [...args, script], { env: { ...process.env, DATABASE_URL: freshUrl.toString() }, encoding: "utf8" });
}

async function query(url: URL, sql: string) {
  const client = new pg.Client({ connectionString: url.toString() });
  await client.connect();
  try {
    return (await client.query(sql)).rows;
  } finally {
    await client.end();
  }
}

let firstSeed: ReturnType<typeof runScript>;

// Migrated and seeded once here, so the tests below can run alone or in any order.
beforeAll(async () => {
  await query(serverUrl, `create database "${databaseName}"`);
  const migrated = runScript("scripts/migrate.ts");
  expect(migrated.status, migrated.stderr).toBe(0);
  firstSeed = runScript("scripts/seed.ts", ["--conditions=react-server"]);
}, 90_000);

afterAll(async () => {
  await query(serverUrl, `drop database if exists "${databaseName}" with (force)`);
});

describe("demo seed", () => {
  it("seeds an empty database once, then says it is already seeded", () => {
    expect(firstSeed.status, firstSeed.stderr).toBe(0);
    expect(firstSeed.stdout).toMatch(/demo firm created \(4 users, 2 projects\)/);
    const second = runScript("scripts/seed.ts", ["--conditions=react-server"]);
    expect(second.status, second.stderr).toBe(0);
    expect(second.stdout).toMatch(/already seeded/);
  }, 60_000);

  it("creates the firm, one user per role with a password login, and the two projects", async () => {
    expect(await query(freshUrl, "select name from firm")).toEqual([{ name: DEMO_FIRM_NAME }]);
    const users = await query(
      freshUrl,
      `select u.email, u.role, a.provider_id, a.password like '%:%' as hashed
       from "user" u join account a on a.user_id = u.id order by u.email`,
    );
    expect(users).toEqual(
      [...DEMO_USERS]
        .sort((a, b) => a.email.localeCompare(b.email))
        .map((u) => ({ email: u.email, role: u.role, provider_id: "credential", hashed: true })),
    );
    const projects = await query(freshUrl, "select job_number from projects order by job_number");
    expect(projects.map((p) => p.job_number)).toEqual(DEMO_PROJECTS.map((p) => p.jobNumber).sort());
  });
});

describe("demo users in the test database", () => {
  it.each(DEMO_USERS)("$role signs in with the printed password", async ({ email, password, role }) => {
    const result = await auth.api.signInEmail({ body: { email, password } });
    expect(result.user).toMatchObject({ email, role });
  });
});
