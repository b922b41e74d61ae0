import "server-only";
// One transaction per use case. The runner (lib/use-cases/run.ts) opens it and hands it to the work;
// queries below pick it up through currentDb() too, and nested runInTransaction() calls become
// savepoints, so a change, its audit event and its queued jobs commit together or not at all.
import { AsyncLocalStorage } from "node:async_hooks";
import { db } from "@/db";

export type Transaction = Parameters<Parameters<typeof db.transaction>[0]>[0];
export type Executor = typeof db | Transaction;

const scopes = new AsyncLocalStorage<Transaction>();

/** The open transaction of this use case, or the pool when there is none. */
export function currentDb(): Executor {
  return scopes.getStore() ?? db;
}

export async function runInTransaction<T>(work: (tx: Transaction) => Promise<T>): Promise<T> {
  const outer = scopes.getStore();
  const run = (tx: Transaction) => scopes.run(tx, () => work(tx));
  // Inside an open transaction this is a savepoint: it rolls back alone, or commits with the outer one.
  return outer ? outer.transaction(run) : db.transaction(run);
}

/**
 * Runs `work` on the pool, outside the open transaction: for the one kind of write that must outlast a
 * rollback, a counter of failed attempts (a wrong current password is refused, and still counted).
 */
export function outsideTransaction<T>(work: () => Promise<T>): Promise<T> {
  return scopes.exit(work);
}
