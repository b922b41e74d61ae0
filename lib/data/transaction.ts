import "server-only";
// One transaction per use case. The runner (lib/use-cases/run.ts) opens it and hands it to the work;
// queries below pick it up through currentDb() too, and nested runInTransaction() calls become
// savepoints, so a change, its audit event and its queued jobs commit together or not at all.
import { AsyncLocalStorage } from "node:async_hooks";
import { db } from "@/db";

export type Transaction = Parameters<Parameters<typeof db.transaction>[0]>[0];
export type Executor = typeof db | Transaction;
type AfterCommitTask = () => Promise<unknown>;
type Scope = { tx: Transaction; afterCommit: AfterCommitTask[] };

const scopes = new AsyncLocalStorage<Scope>();

/** The open transaction of this request, or the pool when there is none. */
export function currentDb(): Executor {
  return scopes.getStore()?.tx ?? db;
}

export async function runInTransaction<T>(work: (tx: Transaction) => Promise<T>): Promise<T> {
  const outer = scopes.getStore();
  const afterCommit: AfterCommitTask[] = [];
  const run = (tx: Transaction) => scopes.run({ tx, afterCommit }, () => work(tx));
  if (outer) {
    // A savepoint: its after-commit tasks join the outer list only if the savepoint succeeded.
    const result = await outer.tx.transaction(run);
    outer.afterCommit.push(...afterCommit);
    return result;
  }
  const result = await db.transaction(run);
  for (const task of afterCommit) await task();
  return result;
}

/** Runs the task once the outermost transaction has committed (at once when there is none). */
export async function runAfterCommit(task: AfterCommitTask): Promise<void> {
  const scope = scopes.getStore();
  if (scope) scope.afterCommit.push(task);
  else await task();
}
