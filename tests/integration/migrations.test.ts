// The migrations in drizzle/ build the whole schema on an EMPTY database (a fresh one made for this
// test on the same server, dropped afterwards), through the same script `npm start` runs; and what the
// database itself enforces: append-only audit events and the role CHECKs. The append-only triggers are
// checked as the owner role, whom they stop too; the app's role is stopped before them, by its privileges
// (database-role.test.ts).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { appRole, ownerRole, ownerServerUrl, scratchDatabase, withClient } from "./helpers/scratch-database";

const scratch = scratchDatabase("migrate");
const freshUrl = scratch.url;
const freshOwnerUrl = scratch.ownerUrl;

/** Every access list of the database, its schemas and its relations, to show a second run grants nothing new. */
const accessLists = () =>
  withClient(freshOwnerUrl, async (client) => {
    const { rows } = await client.query(
      `select 'database' as kind, datname::text as name, datacl::text as acl from pg_database where datname = current_database()
       union all select 'schema', nspname::text, nspacl::text from pg_namespace
       union all select 'relation', oid::regclass::text, relacl::text from pg_class where relkind in ('r', 'p', 'v', 'S')
       order by 1, 2`,
    );
    return rows;
  });
const runMigrate = () => scratch.runScript("scripts/migrate.ts");

let firstRun: ReturnType<typeof runMigrate>;

// Migrated once here, so each test below can run alone or in any order.
beforeAll(async () => {
  await scratch.create();
  firstRun = runMigrate();
}, 60_000);

afterAll(async () => {
  await scratch.drop();
});

describe("migrations on an empty database", () => {
  it("apply cleanly with scripts/migrate.ts, and a second run applies nothing and grants nothing new", async () => {
    expect(firstRun.status, firstRun.stderr).toBe(0);
    expect(firstRun.stdout).toMatch(
      new RegExp(
        `privileges of ${appRole} set on \\d+ tables \\(\\d+ of the job queue; append-only: audit_events, calc_revision_events, calc_revisions, calc_sheet_pdf_keys, calc_sheet_pdfs, calcs, job_attachments, library_review_comments, library_version_entries, library_version_events, library_versions, log_leaves, log_nodes, log_positions, log_tree_heads, rerun_batch_items, rerun_batches, run_library_entries, runs, standard_attachments, standard_review_comments, standard_version_events, standard_version_library_pins, standard_versions, withdrawal_mappings, withdrawal_outcomes, withdrawals\\)`,
      ),
    );
    const before = await accessLists();
    const second = runMigrate();
    expect(second.status, second.stderr).toBe(0);
    expect(second.stdout).toMatch(/ 0 new migration/);
    expect(await accessLists()).toEqual(before);
  }, 60_000);

  it("refuse to run when the app's role is the owner, and change nothing", async () => {
    const before = await accessLists();
    const run = scratch.runScript("scripts/migrate.ts", [], { DATABASE_URL: freshOwnerUrl.toString() });
    expect(run.status).toBe(1);
    expect(run.stderr).toContain(`DATABASE_URL and DATABASE_OWNER_URL both log in as ${ownerRole}`);
    expect(await accessLists()).toEqual(before);
  }, 60_000);

  it("create every table the app uses", async () => {
    const tables = await withClient(freshOwnerUrl, async (client) => {
      const result = await client.query(
        "select table_name from information_schema.tables where table_schema = 'public' order by 1",
      );
      return result.rows.map((row) => row.table_name as string);
    });
    expect(tables).toEqual([
      "account",
      "audit_events",
      "calc_revision_events",
      "calc_revisions",
      "calc_sheet_pdf_keys",
      "calc_sheet_pdfs",
      "calcs",
      "ended_session",
      "firm",
      "invitations",
      "job_attachments",
      "jobs",
      "libraries",
      "library_drafts",
      "library_review_comments",
      "library_reviews",
      "library_version_entries",
      "library_version_events",
      "library_versions",
      "log_leaves",
      "log_nodes",
      "log_pending",
      "log_positions",
      "log_tree_heads",
      "rate_limit",
      "rerun_batch_items",
      "rerun_batches",
      "run_library_entries",
      "runs",
      "session",
      "standard_attachments",
      "standard_drafts",
      "standard_review_comments",
      "standard_reviews",
      "standard_version_events",
      "standard_version_library_pins",
      "standard_versions",
      "standards",
      "user",
      "verification",
      "withdrawal_mappings",
      "withdrawal_outcomes",
      "withdrawals",
    ]);
  });

  it("keep a run's record compressed with lz4 (the integrity check decompresses every record)", async () => {
    const compression = await withClient(freshOwnerUrl, async (client) => {
      const column = await client.query(
        "select attcompression from pg_attribute where attrelid = 'runs'::regclass and attname = 'record'",
      );
      return column.rows[0].attcompression as string;
    });
    expect(compression).toBe("l");
  });

  it("make audit_events append-only, for the owner too: INSERT works, UPDATE, DELETE and TRUNCATE raise", async () => {
    await withClient(freshOwnerUrl, async (client) => {
      await client.query("insert into audit_events (action) values ('test.append')");
      await expect(client.query("update audit_events set action = 'test.changed'")).rejects.toThrow(/append-only: UPDATE/);
      await expect(client.query("delete from audit_events")).rejects.toThrow(/append-only: DELETE/);
      await expect(client.query("truncate audit_events")).rejects.toThrow(/append-only: TRUNCATE/);
      const { rows } = await client.query("select action from audit_events");
      expect(rows).toEqual([{ action: "test.append" }]);
    });
  });

  it("refuse a role that is not one of the four", async () => {
    await withClient(freshUrl, async (client) => {
      await expect(
        client.query(`insert into "user" (id, name, email, role) values ('u1', 'Test', 't@test.gusset.example', 'superuser')`),
      ).rejects.toThrow(/user_role_check/);
      await expect(
        client.query(
          `insert into invitations (email, name, role, token_hash, expires_at) values ('t@test.gusset.example', 'T', 'owner', 'h', now())`,
        ),
      ).rejects.toThrow(/invitations_role_check/);
    });
  });
});

describe("the test database", () => {
  it("refuses to change or delete its audit events too, even to the owner", async () => {
    await withClient(ownerServerUrl, async (client) => {
      const { rows } = await client.query("insert into audit_events (action) values ('test.append-only') returning id");
      const id = rows[0].id as string;
      await expect(client.query("update audit_events set details = '{\"x\":1}' where id = $1", [id])).rejects.toThrow(
        /append-only/,
      );
      await expect(client.query("delete from audit_events where id = $1", [id])).rejects.toThrow(/append-only/);
    });
  });
});
