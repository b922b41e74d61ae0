// The demo seed: fills an empty database once (firm, one user per role, two projects) and leaves a
// database with users alone; the demo users can sign in with the passwords the README prints.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_FIRM_NAME, DEMO_PROJECTS, DEMO_USERS } from "@/db/demo-users";
import { auth } from "@/lib/auth/server";
import { scratchDatabase, withClient } from "./helpers/scratch-database";

const scratch = scratchDatabase("seed");
const freshUrl = scratch.url;
const runScript = scratch.runScript;
const query = async (url: URL, sql: string) => (await withClient(url, (client) => client.query(sql))).rows;

let firstSeed: ReturnType<typeof runScript>;

// Migrated and seeded once here, so the tests below can run alone or in any order.
beforeAll(async () => {
  await scratch.create();
  const migrated = runScript("scripts/migrate.ts");
  expect(migrated.status, migrated.stderr).toBe(0);
  firstSeed = runScript("scripts/seed.ts", ["--conditions=react-server"]);
}, 90_000);

afterAll(async () => {
  await scratch.drop();
});

describe("demo seed", () => {
  it("seeds an empty database once, then says it is already seeded", () => {
    expect(firstSeed.status, firstSeed.stderr).toBe(0);
    expect(firstSeed.stdout).toMatch(/demo firm created \(5 users, 2 projects\)/);
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
