import "server-only";
// Statements on a hot path (every signed-in request, every run) built once. Drizzle builds a statement's SQL text from
// its builder at every call, which for a select with joins costs more of the server's CPU than the round trip to
// PostgreSQL itself. A prepared statement keeps the text, the placeholders and how to map its rows, and only binds the
// values; PostgreSQL keeps the parsed statement of each connection by its name. On the pool it is drizzle's own
// prepared statement; inside a transaction the same text runs on the transaction's connection, so that it sees (and
// is part of) what the transaction wrote.
import type { SQL } from "drizzle-orm";
import { PgDialect, type PgSession } from "drizzle-orm/pg-core";
import { db } from "@/db";
import { currentDb, type Executor } from "./transaction";

type Values = Record<string, unknown>;

/** What a drizzle select, insert, update or delete offers: prepare by name. */
type Preparable<R> = { prepare(name: string): { execute(placeholders?: Values): Promise<R> } };

/**
 * The parts of drizzle's node-postgres prepared statement (drizzle-orm/node-postgres/session.js, NodePgPreparedQuery,
 * drizzle-orm 0.45) that make it again on another connection: read, never changed. tests/integration/prepared.test.ts
 * runs each kind in and out of a transaction, so a drizzle release that renames them fails there, not in production.
 */
type PreparedParts = {
  queryString: string;
  params: unknown[];
  fields?: unknown;
  _isResponseInArrayMode: boolean;
  customResultMapper?: unknown;
  joinsNotNullableMap?: Record<string, boolean>;
};

const names = new Set<string>();

/**
 * A statement whose builder takes the executor and names its values with `sql.placeholder(key)`. `name` is the
 * statement's name in PostgreSQL, unique among prepared statements (a name taken twice throws as the module loads).
 */
export function prepared<P extends Values, R>(
  name: string,
  build: (executor: Executor) => Preparable<R>,
): (values: P) => Promise<R> {
  if (names.has(name)) throw new Error(`prepared: the statement name ${name} is taken`);
  names.add(name);
  let onPool: ReturnType<Preparable<R>["prepare"]> | undefined;
  return (values) => {
    onPool ??= build(db).prepare(name);
    const executor = currentDb();
    if (executor === db) return onPool.execute(values);
    const parts = onPool as unknown as PreparedParts;
    if (typeof parts.queryString !== "string" || !Array.isArray(parts.params))
      throw new Error("prepared: this drizzle release keeps its prepared statements differently (lib/data/prepared.ts)");
    const session = (executor as unknown as { _: { session: PgSession } })._.session;
    const again = session.prepareQuery(
      { sql: parts.queryString, params: parts.params },
      parts.fields as Parameters<PgSession["prepareQuery"]>[1],
      name,
      parts._isResponseInArrayMode,
      parts.customResultMapper as Parameters<PgSession["prepareQuery"]>[4],
    );
    if (parts.joinsNotNullableMap) (again as unknown as PreparedParts).joinsNotNullableMap = parts.joinsNotNullableMap;
    return again.execute(values) as Promise<R>;
  };
}

const dialect = new PgDialect({ casing: "snake_case" });

/**
 * A statement drizzle's builders cannot say (data-modifying WITH queries), written with drizzle's `sql` template so
 * that tables and columns are named from the schema, prepared like the others. Its rows come back as node-postgres
 * reads them: keyed by the names the statement gives its columns, timestamps as text.
 */
export function preparedSql<P extends Values, Row extends Values>(name: string, statement: SQL): (values: P) => Promise<Row[]> {
  const query = dialect.sqlToQuery(statement);
  const run = prepared<P, { rows: Row[] }>(name, (executor) => ({
    prepare: (as) => {
      const session = (executor as unknown as { _: { session: PgSession } })._.session;
      return session.prepareQuery(query, undefined, as, false) as unknown as {
        execute(values?: Values): Promise<{ rows: Row[] }>;
      };
    },
  }));
  return async (values) => (await run(values)).rows;
}
