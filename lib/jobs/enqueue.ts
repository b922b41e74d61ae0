import "server-only";
// Queues a background job in the caller's transaction (or on its own when there is none). The job row
// is written by the same connection as the change it belongs to, so it becomes visible to workers when,
// and only when, that change commits: a rolled-back invitation never e-mails anyone.
import PgBoss from "pg-boss";
import type { PoolClient } from "pg";
import { pool } from "@/db";
import { currentDb } from "@/lib/data/transaction";
import { JOB_SCHEMA, QUEUES, type JobPayloads, type QueueName } from "./queues";

type Sql = { executeSql(text: string, values: unknown[]): Promise<{ rows: unknown[] }> };

let sender: PgBoss | null = null;

/**
 * A pg-boss instance used only to insert jobs: never started, so it polls nothing, migrates nothing and
 * opens no pool of its own.
 */
function getSender(): PgBoss {
  sender ??= new PgBoss({
    db: { executeSql: (text: string, values: unknown[]) => pool.query(text, values) },
    schema: JOB_SCHEMA,
    migrate: false,
    supervise: false,
    schedule: false,
  });
  return sender;
}

/**
 * The pg client behind the current drizzle transaction. Drizzle keeps it on the transaction's session,
 * which its types mark internal; pg-boss needs the client itself to write in the same transaction.
 */
function currentSql(): Sql {
  const executor = currentDb() as unknown as { session?: { client?: PoolClient } };
  const client = executor.session?.client;
  if (!client || typeof (client as Partial<PoolClient>).release !== "function") {
    return { executeSql: (text, values) => pool.query(text, values) };
  }
  return { executeSql: (text, values) => client.query(text, values) };
}

export async function enqueueJob<Q extends QueueName>(name: Q, data: JobPayloads[Q]): Promise<string> {
  const { retryLimit, retryDelay, retryBackoff, expireInSeconds } = QUEUES[name];
  const id = await getSender().send(name, data as object, {
    retryLimit,
    retryDelay,
    retryBackoff,
    expireInSeconds,
    db: currentSql(),
  });
  if (!id) throw new Error(`The job queue "${name}" does not exist: run the migrations (npm run db:migrate).`);
  return id;
}

/** Many jobs of one queue in one statement, in the caller's transaction (a batch re-run queues hundreds). */
export async function enqueueJobs<Q extends QueueName>(name: Q, items: JobPayloads[Q][]): Promise<number> {
  if (items.length === 0) return 0;
  const { retryLimit, retryDelay, retryBackoff, expireInSeconds } = QUEUES[name];
  const jobs = items.map((data) => ({ name, data: data as object, retryLimit, retryDelay, retryBackoff, expireInSeconds }));
  // pg-boss 10 inserts each job with the policy given here (its own defaults otherwise), in the open transaction.
  await getSender().insert(jobs, { db: currentSql() });
  return items.length;
}
