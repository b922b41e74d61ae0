// The migrations in drizzle/ build the whole schema on an EMPTY database (a fresh one made for this
// test on the same server, dropped afterwards), through the same script `npm start` runs; and what the
// database itself enforces: append-only audit events and the role CHECKs.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { scratchDatabase, serverUrl, withClient } from "./helpers/scratch-database";

const scratch = scratchDatabase("migrate");
const freshUrl = scratch.url;
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
  it("apply cleanly with scripts/migrate.ts, and a second run applies nothing", () => {
    expect(firstRun.status, firstRun.stderr).toBe(0);
    const second = runMigrate();
    expect(second.status, second.stderr).toBe(0);
    expect(second.stdout).toMatch(/ 0 new migration/);
  }, 60_000);

  it("create every table the app uses", async () => {
    const tables = await withClient(freshUrl, async (client) => {
      const result = await client.query(
        "select table_name from information_schema.tables where table_schema = 'public' order by 1",
      );
      return result.rows.map((row) => row.table_name as string);
    });
    expect(tables).toEqual([
      "account",
      "audit_events",
      "firm",
      "invitations",
      "projects",
      "rate_limit",
      "session",
      "user",
      "verification",
    ]);
  });

  it("make audit_events append-only: INSERT works, UPDATE, DELETE and TRUNCATE raise", async () => {
    await withClient(freshUrl, async (client) => {
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
  it("refuses to change or delete its audit events too", async () => {
    await withClient(serverUrl, async (client) => {
      const { rows } = await client.query("insert into audit_events (action) values ('test.append-only') returning id");
      const id = rows[0].id as string;
      await expect(client.query("update audit_events set details = '{\"x\":1}' where id = $1", [id])).rejects.toThrow(
        /append-only/,
      );
      await expect(client.query("delete from audit_events where id = $1", [id])).rejects.toThrow(/append-only/);
    });
  });
});
