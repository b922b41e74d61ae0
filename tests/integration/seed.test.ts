// The demo seed: fills an empty database once (firm, one user per role, two jobs) and leaves a
// database with users alone; the demo users can sign in with the passwords the README prints.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_FIRM_NAME, DEMO_JOBS, DEMO_USERS } from "@/db/demo-users";
import { auth } from "@/lib/auth/server";
import { DEMO_SECTIONS } from "@/lib/libraries";
import { libraryContentHash } from "@/lib/libraries/document";
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
    expect(firstSeed.stdout).toMatch(/demo firm created \(5 users, 2 jobs\)/);
    const second = runScript("scripts/seed.ts", ["--conditions=react-server"]);
    expect(second.status, second.stderr).toBe(0);
    expect(second.stdout).toMatch(/already seeded/);
  }, 60_000);

  it("creates the firm, one user per role with a password login, and the two jobs", async () => {
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
    const jobs = await query(freshUrl, "select job_number from jobs order by job_number");
    expect(jobs.map((p) => p.job_number)).toEqual(DEMO_JOBS.map((p) => p.jobNumber).sort());
  });
});

describe("demo users in the test database", () => {
  it.each(DEMO_USERS)("$role signs in with the printed password", async ({ email, password, role }) => {
    const result = await auth.api.signInEmail({ body: { email, password } });
    expect(result.user).toMatchObject({ email, role });
  });
});

describe("starting libraries", () => {
  it("publishes the demo catalogue and content/libraries as version 1 each, by two different leads, with an entry row per entry", async () => {
    expect(firstSeed.stdout).toMatch(/starting libraries published \(3 libraries, \d+ entries\)/);
    const libraries = await query(
      freshUrl,
      `select l.slug, l.kind, v.number, v.title, v.content_hash, v.document, v.author_id <> v.reviewer_id as four_eyes,
              (select count(*)::int from library_version_entries e where e.version_id = v.id) as entries,
              (select array_agg(kind order by id) from library_version_events ev where ev.version_id = v.id) as events
         from libraries l join library_versions v on v.library_id = l.id order by l.slug`,
    );
    expect(libraries.map((l) => [l.slug, l.kind, l.number, l.four_eyes, l.events])).toEqual([
      ["firm-sections", "sections", 1, true, ["published"]],
      ["load-combinations", "combinations", 1, true, ["published"]],
      ["materials", "materials", 1, true, ["published"]],
    ]);
    const sections = libraries[0];
    expect(sections.title).toBe("Firm sections");
    expect(sections.entries).toBe(DEMO_SECTIONS.length);
    for (const library of libraries) {
      expect(library.entries, library.slug).toBe(library.document.entries.length);
      expect(library.content_hash, library.slug).toBe(await libraryContentHash(library.document));
    }
    // Every section is a row of the catalogue, listed values kept beside the builder's.
    expect(sections.document.entries[0]).toMatchObject({
      key: DEMO_SECTIONS[0].designation,
      origin: { from: "catalogue", file: "demo-catalogue.csv", row: 2 },
      listed: { A: expect.any(Number) },
    });
  });
});
