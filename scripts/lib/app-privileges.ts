// What the app's own login (the role in DATABASE_URL) may do in the database. The owner role grants it
// after every migration run (scripts/migrate.ts), so a table added by a later migration is covered
// without anyone remembering to. The rules are applied from the catalogue each time, as REVOKE ALL then
// GRANT per object in one transaction: running them twice changes nothing, and a privilege given by hand
// outside them is taken back.
//
//   the database     CONNECT only; TEMPORARY is taken from PUBLIC too, so the app creates no objects at all
//   public and any other schema of ours
//                    USAGE, never CREATE
//     tables         SELECT, INSERT, UPDATE, DELETE, minus whatever a `gusset_refuse_…` trigger on the table
//                    refuses (audit_events: SELECT and INSERT only); never TRUNCATE, REFERENCES or TRIGGER
//     sequences      USAGE (nextval for serial ids)
//   pgboss           USAGE. job (and each queue's partition of it) and archive: SELECT, INSERT, UPDATE,
//                    DELETE, for sending, fetching, completing and archiving jobs; version: SELECT and
//                    UPDATE (pg-boss stamps its maintenance runs there); queue, schedule, subscription:
//                    SELECT (queues are made by the migrations, never by the app)
//   drizzle          nothing (the migration log)
//
// The app never owns anything: only an owner (or a superuser) may ALTER TABLE … DISABLE TRIGGER or drop
// the append-only triggers, and only a superuser may SET session_replication_role.
import type pg from "pg";
import { JOB_SCHEMA } from "@/lib/jobs/queues";

const MIGRATION_LOG_SCHEMA = "drizzle";
const ROW_PRIVILEGES = ["SELECT", "INSERT", "UPDATE", "DELETE"] as const;
type Privilege = (typeof ROW_PRIVILEGES)[number];

export type Relation = {
  schema: string;
  name: string;
  kind: "table" | "sequence";
  /** The table this one is a partition of, when it is one. */
  partitionOf: string | null;
  /** The statements a `gusset_refuse_…` trigger on the table refuses (INSERT, UPDATE, DELETE). */
  refused: string[];
};

/** The privileges the app's role gets on one table of ours, per the rules above. */
export function tablePrivileges(table: Relation): Privilege[] {
  if (table.schema === JOB_SCHEMA) {
    const jobRows = ["job", "archive"].includes(table.name) || table.partitionOf === "job";
    if (jobRows) return [...ROW_PRIVILEGES];
    return table.name === "version" ? ["SELECT", "UPDATE"] : ["SELECT"];
  }
  return ROW_PRIVILEGES.filter((privilege) => !table.refused.includes(privilege));
}

const quote = (identifier: string) => `"${identifier.replaceAll('"', '""')}"`;
const qualified = (relation: Relation) => `${quote(relation.schema)}.${quote(relation.name)}`;

/** Refuses an app role that would make the grants meaningless: missing, the owner itself, a superuser or the owner's member. */
export async function checkAppRole(client: pg.ClientBase, appRole: string): Promise<void> {
  const { rows } = await client.query<{ owner: string; superuser: boolean; member: boolean }>(
    `select current_user as owner, rolsuper as superuser, pg_has_role(rolname, current_user, 'MEMBER') as member
       from pg_roles where rolname = $1`,
    [appRole],
  );
  if (rows.length === 0) {
    throw new Error(`the app's role ${appRole} (the user in DATABASE_URL) does not exist; create it first (see README)`);
  }
  const [{ owner, superuser, member }] = rows;
  if (appRole === owner) {
    throw new Error(`DATABASE_URL and DATABASE_OWNER_URL both log in as ${owner}: the app must not connect as the owner`);
  }
  if (superuser) throw new Error(`the app's role ${appRole} is a superuser: it could switch off the append-only triggers`);
  if (member) throw new Error(`the app's role ${appRole} is a member of the owner role ${owner}: it could SET ROLE to it`);
}

/** The schemas the owner holds (directly, or as the database's owner for `public`), but the migration log. */
async function listSchemas(client: pg.ClientBase): Promise<string[]> {
  const { rows } = await client.query<{ name: string }>(
    `select nspname as name from pg_namespace
      where nspname not like 'pg\\_%' and nspname <> 'information_schema' and nspname <> $1
        and pg_has_role(current_user, nspowner, 'USAGE')
      order by 1`,
    [MIGRATION_LOG_SCHEMA],
  );
  return rows.map((row) => row.name);
}

async function listRelations(client: pg.ClientBase, schemas: string[]): Promise<Relation[]> {
  const { rows } = await client.query<Relation>(
    `select n.nspname as schema, c.relname as name,
            case when c.relkind = 'S' then 'sequence' else 'table' end as kind,
            (select p.relname from pg_inherits i join pg_class p on p.oid = i.inhparent
              where i.inhrelid = c.oid and c.relispartition) as "partitionOf",
            array(select distinct ops.op from pg_trigger t join pg_proc f on f.oid = t.tgfoid
                    cross join lateral (values ('INSERT', 4), ('DELETE', 8), ('UPDATE', 16)) as ops(op, bit)
                   where t.tgrelid = c.oid and not t.tgisinternal and f.proname like 'gusset\\_refuse\\_%'
                     and t.tgtype & ops.bit <> 0 order by 1) as refused
       from pg_class c join pg_namespace n on n.oid = c.relnamespace
      where n.nspname = any($1) and c.relkind in ('r', 'p', 'v', 'm', 'f', 'S')
      order by 1, 2`,
    [schemas],
  );
  return rows;
}

export type GrantSummary = { tables: number; appendOnly: string[]; jobQueueTables: number };

/** Applies the rules above for `appRole`, in one transaction, as the connected owner role. */
export async function grantAppPrivileges(client: pg.ClientBase, appRole: string): Promise<GrantSummary> {
  await checkAppRole(client, appRole);
  const app = quote(appRole);
  await client.query("begin");
  try {
    const { rows } = await client.query<{ database: string }>("select current_database() as database");
    const database = quote(rows[0].database);
    const statements = [
      `revoke temporary on database ${database} from public`,
      `revoke all on database ${database} from ${app}`,
      `grant connect on database ${database} to ${app}`,
      `revoke all on schema ${quote(MIGRATION_LOG_SCHEMA)} from ${app}`,
      `revoke all on all tables in schema ${quote(MIGRATION_LOG_SCHEMA)} from ${app}`,
    ];
    const schemas = await listSchemas(client);
    for (const schema of schemas) {
      statements.push(`revoke create on schema ${quote(schema)} from public`);
      statements.push(`revoke all on schema ${quote(schema)} from ${app}`);
      statements.push(`grant usage on schema ${quote(schema)} to ${app}`);
    }
    const relations = await listRelations(client, schemas);
    for (const relation of relations) {
      if (relation.kind === "sequence") {
        statements.push(`revoke all on sequence ${qualified(relation)} from public, ${app}`);
        statements.push(`grant usage on sequence ${qualified(relation)} to ${app}`);
      } else {
        statements.push(`revoke all on table ${qualified(relation)} from public, ${app}`);
        statements.push(`grant ${tablePrivileges(relation).join(", ")} on table ${qualified(relation)} to ${app}`);
      }
    }
    for (const statement of statements) await client.query(statement);
    await client.query("commit");
    const tables = relations.filter((relation) => relation.kind === "table");
    return {
      tables: tables.length,
      appendOnly: tables.filter((table) => table.schema !== JOB_SCHEMA && table.refused.length > 0).map((table) => table.name),
      jobQueueTables: tables.filter((table) => table.schema === JOB_SCHEMA).length,
    };
  } catch (error) {
    await client.query("rollback");
    throw error;
  }
}
