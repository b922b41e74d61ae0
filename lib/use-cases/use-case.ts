// A use case is declared once: who may run it, the input it takes (a zod schema shared with the form),
// the work, and the audit event it writes. lib/use-cases/run.ts runs it for server actions, route
// handlers, pages and scripts alike; nothing else checks permissions or writes change events.
import type { z } from "zod";
import type { Actor } from "@/lib/domain/actor";
import type { AuditEventInput } from "@/lib/domain/audit-actions";
import type { Permission } from "@/lib/domain/permissions";
import type { Transaction } from "@/lib/data/transaction";
import type { AppError } from "@/lib/domain/errors";

/** A use case that requires a permission always sees a signed-in actor; a public one may see none. */
export type ActorFor<P extends Permission> = P extends "public" ? Actor | null : Actor;

export type UseCaseContext<P extends Permission, R = undefined> = {
  actor: ActorFor<P>;
  /** The transaction the work, its audit event and any queued job share. */
  tx: Transaction;
  /** What `prepare` computed before the transaction opened (undefined without one). */
  prepared: R;
};

/** For the few use cases that touch no data at all (liveness): no transaction is opened. */
export type DatabaseFreeContext<P extends Permission> = { actor: ActorFor<P> };

/**
 * For a use case whose work is one SQL statement (`database: "one-statement"`): no transaction is opened, and the
 * statement writes the change and its audit event together, which PostgreSQL makes atomic by itself.
 */
export type OneStatementContext<P extends Permission, R, T> = {
  actor: ActorFor<P>;
  prepared: R;
  /**
   * The audit event of `result` as the use case's `audit` declares it, with the actor and the client address filled
   * in: the work writes it in its statement. The runner checks that the work asked for the event of the result it
   * returns (a work that forgot its event fails loudly, in tests, and not in silence).
   */
  auditEventOf: (result: T) => AuditEventInput | null;
};

/**
 * The audit event of a refused or failed call (bad input, a link that is no longer valid), written outside
 * the rolled-back transaction. Refusals for lack of permission are audited by the runner for every use case.
 */
export type AuditFailure = (args: { error: AppError; actor: Actor | null }) => AuditEventInput | null;

/** The audit event of a change; actor fields default to the actor who ran it. */
export type AuditFor<P extends Permission, I, T> = (args: { input: I; result: T; actor: ActorFor<P> }) => AuditEventInput | null;

export type UseCase<P extends Permission, S extends z.ZodType, T, R = undefined> =
  | {
      /** For logs and error messages, e.g. "users.invite". */
      name: string;
      permission: P;
      input: S;
      /**
       * Slow pure work (compiling and verifying a standard in the evaluation pool) done after the permission
       * and input checks but before the transaction opens, so no connection is held while it runs. It may
       * read (outside the transaction); `run` must re-check under its locks that what was prepared still holds.
       */
      prepare?: (input: z.infer<S>, context: DatabaseFreeContext<P>) => Promise<R>;
      run: (input: z.infer<S>, context: UseCaseContext<P, R>) => Promise<T>;
      /** null for reads: they change nothing, so they write no event. */
      audit: AuditFor<P, z.infer<S>, T> | null;
      auditFailure?: AuditFailure;
      database?: true;
    }
  | {
      name: string;
      permission: P;
      input: S;
      prepare?: (input: z.infer<S>, context: DatabaseFreeContext<P>) => Promise<R>;
      /**
       * The change and its audit event written in one statement (a hot path: every run), saving the round trips of
       * BEGIN and COMMIT. Work that needs more than one statement belongs in a transaction, the default.
       */
      run: (input: z.infer<S>, context: OneStatementContext<P, R, T>) => Promise<T>;
      audit: AuditFor<P, z.infer<S>, T>;
      auditFailure?: AuditFailure;
      database: "one-statement";
    }
  | {
      name: string;
      permission: P;
      input: S;
      prepare?: undefined;
      run: (input: z.infer<S>, context: DatabaseFreeContext<P>) => Promise<T>;
      audit: null;
      auditFailure?: undefined;
      /** false: the work reads and writes nothing in the database, so no transaction is opened. */
      database: false;
    };

/** Declares a use case (an identity function that lets TypeScript infer the types). */
export function defineUseCase<P extends Permission, S extends z.ZodType, T, R = undefined>(
  useCase: UseCase<P, S, T, R>,
): UseCase<P, S, T, R> {
  return useCase;
}
