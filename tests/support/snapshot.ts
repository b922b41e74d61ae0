// Proof that a refused call changed nothing: the values of every row of every table in the app's
// database schema, taken before the call and compared after it. Row counts would miss an UPDATE (a
// role changed, an invitation marked revoked, a session extended) and a DELETE paired with an INSERT;
// values do not. Every table of the app's schema (public) is taken, found in the catalogue, so a new
// table is covered without an edit here.
//
// Queued jobs count too: a refused call must not queue an e-mail. They live in pg-boss's own schema
// (pgboss), whose rows the worker changes in the background whatever the test does (state, started_on,
// completed_on, retry_count, output; maintenance moves finished jobs from pgboss.job to
// pgboss.archive). So the jobs enter the snapshot as one pseudo-table "pgboss.job" holding, for every
// job in pgboss.job or pgboss.archive, only what pg-boss writes once at insert and never changes: id,
// queue name and payload. A job queued by the call shows as an added row; the worker's progress and
// archiving change nothing there. (Archiving and deletion of old jobs are hours away: JOB_RETENTION.)
//
//   const before = await snapshotRows();
//   …the refused call…
//   await expectRowsUnchanged(before);
//
// The verifiable log stays out too: its leaves are written by triggers for the evidence rows above (an added audit
// event shows as itself), and the sealer, in the worker, folds them into the tree and queues the witness's e-mail of
// each new head whenever it likes. So the log_* tables and the witness's mail are not in the snapshot.
//
// Some refusals do write, on purpose: a failed sign-in is audited and counted by the rate limiter.
// Such a test names each of those writes with `except`, and each named write must have happened.
import { isDeepStrictEqual } from "node:util";
import { expect } from "vitest";
import { pool } from "@/db";

export type Row = Record<string, unknown>;

/** Table name → its rows, ordered by primary key; each row keyed by its primary key's value. */
export type Snapshot = Record<string, Map<string, Row>>;

export type RowChange = { table: string; change: "added" | "removed" | "changed"; before: Row | null; after: Row | null };

/**
 * A write a refused call is known to make. `why` says why it is expected (it shows in failures);
 * `where` picks the row (after the change, or before it for a removal) by column values, with the
 * database's own column names; `count` is how many such changes must be there (1 unless given;
 * "any" for housekeeping that may or may not run, such as pruning expired rate-limit counters).
 */
export type ExpectedChange = {
  table: string;
  change: RowChange["change"] | "added or changed";
  why: string;
  where: (row: Row) => boolean;
  count?: number | "any";
};

type TableShape = { name: string; key: string[] };

let tablesOnce: Promise<TableShape[]> | null = null;

/** The app's tables (schema public) and their primary-key columns, in a fixed order. */
function listTables(): Promise<TableShape[]> {
  tablesOnce ??= pool
    .query<{ name: string; key: string[] | null }>(
      `select t.table_name as name,
              (select array_agg(k.column_name::text order by k.ordinal_position)
                 from information_schema.table_constraints c
                 join information_schema.key_column_usage k
                   on k.constraint_name = c.constraint_name and k.table_schema = c.table_schema
                where c.table_schema = t.table_schema and c.table_name = t.table_name
                  and c.constraint_type = 'PRIMARY KEY') as key
         from information_schema.tables t
        where t.table_schema = 'public' and t.table_type = 'BASE TABLE' and t.table_name not like 'log\\_%'
        order by t.table_name`,
    )
    .then(({ rows }) => rows.map((row) => ({ name: row.name, key: row.key ?? [] })));
  return tablesOnce;
}

const quote = (identifier: string) => `"${identifier.replace(/"/g, '""')}"`;

/** The pseudo-table of queued jobs (see the top of this file): id, queue and payload, keyed by id. */
export const JOBS_TABLE = "pgboss.job";

async function snapshotJobs(): Promise<Map<string, Row>> {
  const { rows } = await pool.query<Row>(
    `select * from (select id::text as id, name, data from pgboss.job
                    union all
                    select id::text as id, name, data from pgboss.archive) as jobs
      where data ->> 'to' is distinct from $1
      order by id`,
    [process.env.GUSSET_WITNESS_EMAIL ?? ""],
  );
  return new Map(rows.map((row) => [JSON.stringify([row.id]), row]));
}

/** Every row of every table, by value (queued jobs by their unchanging columns only). */
export async function snapshotRows(): Promise<Snapshot> {
  // The tables are read at once over the pool's connections rather than one after another: the matrices
  // take hundreds of snapshots. Nothing else writes while a refused call is checked, so it is the same read.
  const tables = await Promise.all(
    (await listTables()).map(async (table) => {
      // A table without a primary key is ordered and keyed by the whole row.
      const orderBy = table.key.length > 0 ? table.key.map(quote).join(", ") : `${quote(table.name)}::text`;
      const { rows } = await pool.query<Row>(`select * from ${quote(table.name)} order by ${orderBy}`);
      const byKey = new Map<string, Row>();
      for (const row of rows) {
        const key = table.key.length > 0 ? JSON.stringify(table.key.map((column) => row[column])) : JSON.stringify(row);
        byKey.set(key, row);
      }
      return [table.name, byKey] as const;
    }),
  );
  const snapshot: Snapshot = Object.fromEntries(tables);
  snapshot[JOBS_TABLE] = await snapshotJobs();
  return snapshot;
}

/** Rows added, removed or changed (any column's value) between two snapshots. */
export function diffSnapshots(before: Snapshot, after: Snapshot): RowChange[] {
  const changes: RowChange[] = [];
  for (const table of new Set([...Object.keys(before), ...Object.keys(after)])) {
    const old = before[table] ?? new Map<string, Row>();
    const now = after[table] ?? new Map<string, Row>();
    for (const [key, row] of now) {
      if (!old.has(key)) changes.push({ table, change: "added", before: null, after: row });
      else if (!isDeepStrictEqual(old.get(key), row))
        changes.push({ table, change: "changed", before: old.get(key)!, after: row });
    }
    for (const [key, row] of old) if (!now.has(key)) changes.push({ table, change: "removed", before: row, after: null });
  }
  return changes;
}

function matches(expected: ExpectedChange, change: RowChange): boolean {
  if (expected.table !== change.table) return false;
  const kindMatches = expected.change === "added or changed" ? change.change !== "removed" : expected.change === change.change;
  return kindMatches && expected.where((change.after ?? change.before)!);
}

/**
 * Takes a second snapshot and asserts that no row's values differ from `before`, apart from exactly
 * the writes named in `except` (each of which must have happened `count` times).
 */
export async function expectRowsUnchanged(
  before: Snapshot,
  { except = [] }: { except?: ExpectedChange[] } = {},
): Promise<RowChange[]> {
  const changes = diffSnapshots(before, await snapshotRows());
  const unexpected = changes.filter((change) => !except.some((expected) => matches(expected, change)));
  expect(unexpected, "rows changed by a call that should have changed nothing").toEqual([]);
  for (const expected of except) {
    if (expected.count === "any") continue;
    const found = changes.filter((change) => matches(expected, change));
    expect(found.length, `expected ${expected.count ?? 1} × ${expected.change} in ${expected.table}: ${expected.why}`).toBe(
      expected.count ?? 1,
    );
  }
  return changes;
}

/** Runs `call` between two snapshots and asserts it changed nothing (but `except`); returns its result. */
export async function expectNoChangeFrom<T>(call: () => Promise<T>, options: { except?: ExpectedChange[] } = {}): Promise<T> {
  const before = await snapshotRows();
  const result = await call();
  await expectRowsUnchanged(before, options);
  return result;
}

/**
 * The one write a call refused for the caller's role makes: an "access.refused" audit event naming them
 * (lib/use-cases/run.ts), and, when `useCase` is given, naming what they asked for.
 */
export function refusalAudited(actorId: string, useCase?: string): ExpectedChange {
  return {
    table: "audit_events",
    change: "added",
    why: "a call refused for the caller's role is audited",
    where: (row) =>
      row.action === "access.refused" &&
      row.actor_id === actorId &&
      (useCase === undefined || (row.details as { useCase?: string }).useCase === useCase),
  };
}

/** What a refused call may write: the refusal's audit event when a signed-in person was refused for their role. */
export function refusalWrites(code: string, actor: { id: string } | null | undefined, useCase?: string): ExpectedChange[] {
  return code === "forbidden" && actor ? [refusalAudited(actor.id, useCase)] : [];
}

/** The one write a failed invitation acceptance makes: its audit event, with the error's code. */
export function acceptFailureAudited(reason: string): ExpectedChange {
  return {
    table: "audit_events",
    change: "added",
    why: "a failed invitation acceptance is audited",
    where: (row) => row.action === "invitations.accept.failed" && (row.details as { reason?: string }).reason === reason,
  };
}
