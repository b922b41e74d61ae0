// The app's database role (DATABASE_URL: the Next server, the worker, the seed and this process connect
// as it) reads and writes rows, and nothing more: it cannot change or remove audit events, switch the
// append-only triggers off, or create or own anything (scripts/lib/app-privileges.ts grants it).
//
// Before it had its own role the app connected as `postgres`, a superuser. Then UPDATE, DELETE and
// TRUNCATE on audit_events were refused too, by the append-only triggers and with the same SQLSTATE 42501
// (insufficient_privilege); only the message differs ("audit_events is append-only: UPDATE is not
// allowed" then, "permission denied for table audit_events" now), so those checks compare messages word
// for word. Every other refusal below, and the role, ownership and privilege checks, would have failed:
// a superuser may disable triggers, set session_replication_role, create tables and own everything.
//
// Each statement that must be refused runs in a transaction that is rolled back, so if it were allowed
// it would leave nothing behind for the tests after it.
import pg from "pg";
import PgBoss from "pg-boss";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { JOB_SCHEMA } from "@/lib/jobs/queues";
import { appUrl, testEnv } from "../support/env";
import { createTestUser, signInHeaders } from "./helpers/people";
import { appRole, ownerRole } from "./helpers/scratch-database";

const INSUFFICIENT_PRIVILEGE = "42501";

let client: pg.Client;

beforeAll(async () => {
  client = new pg.Client({ connectionString: testEnv.databaseUrl });
  await client.connect();
});

afterAll(async () => {
  await client.end();
});

async function rows<T extends pg.QueryResultRow>(sql: string, values: unknown[] = []): Promise<T[]> {
  return (await client.query<T>(sql, values)).rows;
}

/** Runs `sql` in a transaction that is rolled back; the error's SQLSTATE and message, or "allowed". */
async function attempt(sql: string): Promise<{ code: string; message: string } | "allowed"> {
  await client.query("begin");
  try {
    await client.query(sql);
    return "allowed";
  } catch (error) {
    const { code, message } = error as pg.DatabaseError;
    return { code: code ?? "", message };
  } finally {
    await client.query("rollback");
  }
}

const refused = (message: string) => ({ code: INSUFFICIENT_PRIVILEGE, message });

describe("the app's database role", () => {
  it("is a login of its own: not a superuser, not the owner, a member of no role", async () => {
    const [role] = await rows(
      `select current_user as name, rolsuper, rolcreatedb, rolcreaterole, rolreplication, rolbypassrls,
              current_setting('is_superuser') as is_superuser,
              (select count(*)::int from pg_auth_members where member = current_user::regrole) as memberships
         from pg_roles where rolname = current_user`,
    );
    expect(role).toEqual({
      name: appRole,
      rolsuper: false,
      rolcreatedb: false,
      rolcreaterole: false,
      rolreplication: false,
      rolbypassrls: false,
      is_superuser: "off",
      memberships: 0,
    });
    expect(appRole).not.toBe(ownerRole);
    expect(await attempt(`set role ${ownerRole}`)).toEqual(refused(`permission denied to set role "${ownerRole}"`));
  });

  it("owns no table, schema, function or type; the owner role owns audit_events", async () => {
    expect(await rows("select tablename from pg_tables where tableowner = current_user")).toEqual([]);
    const owned = await rows(
      `select 'relation' as kind, oid::regclass::text as name from pg_class where relowner = current_user::regrole
       union all select 'schema', nspname from pg_namespace where nspowner = current_user::regrole
       union all select 'routine', oid::regprocedure::text from pg_proc where proowner = current_user::regrole
       union all select 'type', oid::regtype::text from pg_type where typowner = current_user::regrole`,
    );
    expect(owned).toEqual([]);
    expect(await rows("select tableowner from pg_tables where schemaname = 'public' and tablename = 'audit_events'")).toEqual([
      { tableowner: ownerRole },
    ]);
  });

  it("appends to audit_events and reads the event back", async () => {
    const [{ id }] = await rows<{ id: string }>(
      "insert into audit_events (action, details) values ('test.database-role', '{\"probe\":1}') returning id",
    );
    expect(await rows("select action, details from audit_events where id = $1", [id])).toEqual([
      { action: "test.database-role", details: { probe: 1 } },
    ]);
  });

  it("is refused UPDATE, DELETE and TRUNCATE on audit_events by its privileges, before any trigger", async () => {
    const [{ id }] = await rows<{ id: string }>("insert into audit_events (action) values ('test.database-role') returning id");
    const denied = refused("permission denied for table audit_events");
    expect(await attempt(`update audit_events set action = 'test.rewritten' where id = ${id}`)).toEqual(denied);
    expect(await attempt(`delete from audit_events where id = ${id}`)).toEqual(denied);
    expect(await attempt("truncate audit_events")).toEqual(denied);
    expect(await rows("select action from audit_events where id = $1", [id])).toEqual([{ action: "test.database-role" }]);
  });

  it("cannot switch the append-only triggers off, drop them, or stop triggers firing for its session", async () => {
    const notOwner = refused("must be owner of table audit_events");
    const notOwnerOfRelation = refused("must be owner of relation audit_events"); // DROP TRIGGER words it so
    expect(await attempt("alter table audit_events disable trigger audit_events_no_update_delete")).toEqual(notOwner);
    expect(await attempt("alter table audit_events disable trigger all")).toEqual(notOwner);
    expect(await attempt("drop trigger audit_events_no_update_delete on audit_events")).toEqual(notOwnerOfRelation);
    // Nor the trigger that gives each evidence row its leaf in the verifiable log.
    expect(await attempt("alter table audit_events disable trigger audit_events_log")).toEqual(notOwner);
    expect(await attempt("alter table runs disable trigger runs_log")).toEqual(refused("must be owner of table runs"));
    expect(await attempt("set session_replication_role = replica")).toEqual(
      refused('permission denied to set parameter "session_replication_role"'),
    );
    expect(
      await rows(
        "select tgname, tgenabled from pg_trigger where tgrelid = 'audit_events'::regclass and not tgisinternal order by 1",
      ),
    ).toEqual([
      { tgname: "audit_events_log", tgenabled: "O" },
      { tgname: "audit_events_no_truncate", tgenabled: "O" },
      { tgname: "audit_events_no_update_delete", tgenabled: "O" },
    ]);
  });

  it("cannot create anything: tables, temporary tables, functions, schemas, job queues", async () => {
    const [{ database }] = await rows<{ database: string }>("select current_database() as database");
    expect(await attempt("create table gusset_role_probe (id int)")).toEqual(refused("permission denied for schema public"));
    expect(await attempt(`create table ${JOB_SCHEMA}.gusset_role_probe (id int)`)).toEqual(
      refused(`permission denied for schema ${JOB_SCHEMA}`),
    );
    expect(await attempt("create temporary table gusset_role_probe (id int)")).toEqual(
      refused(`permission denied to create temporary tables in database "${database}"`),
    );
    expect(await attempt("create function gusset_role_probe() returns int language sql as 'select 1'")).toEqual(
      refused("permission denied for schema public"),
    );
    expect(await attempt("create schema gusset_role_probe")).toEqual(refused(`permission denied for database ${database}`));
    // pg-boss's own functions run with the caller's rights: queues are made and removed by the migrations only.
    const queueTable = refused(`permission denied for table queue`);
    expect(await attempt(`select ${JOB_SCHEMA}.create_queue('gusset-role-probe', '{"policy":"standard"}')`)).toEqual(queueTable);
    expect(await attempt(`select ${JOB_SCHEMA}.delete_queue('mail.send')`)).toEqual(queueTable);
  });

  it("holds exactly the privileges it needs on every table, sequence and schema", async () => {
    const appendOnly = (
      await rows<{ name: string }>(
        `select distinct t.tgrelid::regclass::text as name from pg_trigger t join pg_proc f on f.oid = t.tgfoid
          where not t.tgisinternal and f.proname like 'gusset\\_refuse\\_%'`,
      )
    ).map((row) => row.name);
    expect(appendOnly).toContain("audit_events");
    const jobQueue: Record<string, string[]> = {
      job: ["SELECT", "INSERT", "UPDATE", "DELETE"],
      archive: ["SELECT", "INSERT", "UPDATE", "DELETE"],
      version: ["SELECT", "UPDATE"], // pg-boss stamps its maintenance runs
      queue: ["SELECT"],
      schedule: ["SELECT"],
      subscription: ["SELECT"],
    };
    const tables = await rows<{ schema: string; name: string; parent: string | null; granted: string[] }>(
      `select n.nspname as schema, c.oid::regclass::text as name,
              (select p.relname from pg_inherits i join pg_class p on p.oid = i.inhparent where i.inhrelid = c.oid) as parent,
              array(select privilege from unnest(array['SELECT', 'INSERT', 'UPDATE', 'DELETE', 'TRUNCATE', 'REFERENCES', 'TRIGGER'])
                      as privilege where has_table_privilege(c.oid, privilege)) as granted
         from pg_class c join pg_namespace n on n.oid = c.relnamespace
        where c.relkind in ('r', 'p', 'v', 'm', 'f') and n.nspname not in ('pg_catalog', 'information_schema', 'pg_toast')
        order by 1, 2`,
    );
    const expected = (table: (typeof tables)[number]) => {
      if (table.schema === "public") {
        return appendOnly.includes(table.name) ? ["SELECT", "INSERT"] : ["SELECT", "INSERT", "UPDATE", "DELETE"];
      }
      if (table.schema === JOB_SCHEMA) return jobQueue[table.parent === "job" ? "job" : table.name.slice(JOB_SCHEMA.length + 1)];
      return []; // the migration log (drizzle)
    };
    expect(tables.length).toBeGreaterThan(10);
    expect(tables.map((table) => ({ table: table.name, granted: table.granted }))).toEqual(
      tables.map((table) => ({ table: table.name, granted: expected(table) })),
    );

    const sequences = await rows(
      `select c.oid::regclass::text as name, has_sequence_privilege(c.oid, 'USAGE') as usage,
              has_sequence_privilege(c.oid, 'UPDATE') as setval
         from pg_class c join pg_namespace n on n.oid = c.relnamespace where c.relkind = 'S' and n.nspname = 'public' order by 1`,
    );
    // The bigserial ids of the append-only tables: nextval, never setval.
    expect(sequences).toEqual(
      [
        "audit_events_id_seq",
        "calc_revision_events_id_seq",
        "library_review_comments_id_seq",
        "library_version_events_id_seq",
        "log_leaves_id_seq",
        "rerun_batch_items_id_seq",
        "standard_review_comments_id_seq",
        "standard_version_events_id_seq",
        "withdrawal_outcomes_id_seq",
      ].map((name) => ({
        name,
        usage: true,
        setval: false,
      })),
    );

    const schemas = await rows(
      `select nspname as name, has_schema_privilege(oid, 'USAGE') as usage, has_schema_privilege(oid, 'CREATE') as create
         from pg_namespace where nspname in ('public', $1, 'drizzle') order by 1`,
      [JOB_SCHEMA],
    );
    expect(schemas).toEqual(
      [
        { name: "drizzle", usage: false, create: false },
        { name: JOB_SCHEMA, usage: true, create: false },
        { name: "public", usage: true, create: false },
      ].sort((a, b) => a.name.localeCompare(b.name)),
    );
    expect(
      await rows(
        `select has_database_privilege(current_database(), 'CONNECT') as connect,
                has_database_privilege(current_database(), 'CREATE') as create,
                has_database_privilege(current_database(), 'TEMPORARY') as temporary`,
      ),
    ).toEqual([{ connect: true, create: false, temporary: false }]);
  });

  it("runs pg-boss's maintenance and reads its queues", async () => {
    const boss = new PgBoss({
      connectionString: testEnv.databaseUrl,
      schema: JOB_SCHEMA,
      migrate: false,
      supervise: false,
      schedule: false,
    });
    await boss.start();
    try {
      await boss.maintain(); // expires, archives and deletes old jobs, each under pg-boss's advisory lock
      expect((await boss.getQueues()).map((queue) => queue.name)).toContain("mail.send");
    } finally {
      await boss.stop({ graceful: false });
    }
  });

  it("is the only role the Next server and the worker connect as", async () => {
    const { actor, password } = await createTestUser({ role: "engineer" });
    const response = await fetch(appUrl("/api/me"), { headers: await signInHeaders(actor.email, password) });
    expect(response.status).toBe(200); // the server has just read the session from the database
    const sessions = await rows<{ usename: string; application_name: string }>(
      `select usename, application_name from pg_stat_activity
        where datname = current_database() and backend_type = 'client backend' and pid <> pg_backend_pid()`,
    );
    expect(sessions.some((session) => session.application_name === "pgboss")).toBe(true); // the worker
    expect([...new Set(sessions.map((session) => session.usename))]).toEqual([appRole]);
  });
});
