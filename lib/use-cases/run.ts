import "server-only";
// The one runner: checks the actor's permission, parses the input with the use case's schema, and runs the work and
// its audit event in one transaction (jobs queued by the work join it too), or, for work that is one statement, hands
// the work its audit event to write in that statement. A refused or invalid call touches nothing. Slow work (e-mail,
// PDF, object storage) never happens here: the work queues a job (lib/jobs/enqueue.ts), which a worker picks up once
// the transaction has committed.
import type { z } from "zod";
import type { Actor } from "@/lib/domain/actor";
import { AppError, DEFAULT_MESSAGES, type FieldErrors } from "@/lib/domain/errors";
import { can, type Permission } from "@/lib/domain/permissions";
import { recordAuditEvent } from "@/lib/data/audit";
import { runInTransaction } from "@/lib/data/transaction";
import type { AuditEventInput } from "@/lib/domain/audit-actions";
import type { ActorFor, UseCase } from "./use-case";

/** Who asks, with what, and from which client address (recorded with every audit event the call writes). */
export type UseCaseRequest = { actor: Actor | null; input: unknown; ipAddress?: string | null };

/** Writes the audit event of a refusal; a failure to write it is logged and does not hide the refusal. */
async function recordRefusal(event: AuditEventInput): Promise<void> {
  await recordAuditEvent(event).catch((error: unknown) => console.error("[gusset] could not audit a refused call:", error));
}

/** Throws "unauthenticated" or "forbidden"; returns the actor typed for the permission. */
function authorizeOrThrow<P extends Permission>(actor: Actor | null, permission: P): ActorFor<P> {
  if (permission === "public") return actor as ActorFor<P>;
  if (!actor) throw new AppError("unauthenticated");
  if (permission !== "signed-in" && !can(actor.role, permission)) throw new AppError("forbidden");
  return actor as ActorFor<P>;
}

/** Parses with the schema; a failure becomes "invalid-input" with messages per field. */
function parseOrThrow<S extends z.ZodType>(schema: S, raw: unknown): z.infer<S> {
  const parsed = schema.safeParse(raw);
  if (parsed.success) return parsed.data;
  const fieldErrors: FieldErrors = {};
  const formErrors: string[] = [];
  for (const issue of parsed.error.issues) {
    if (issue.path.length === 0) formErrors.push(issue.message);
    else (fieldErrors[issue.path.join(".")] ??= []).push(issue.message);
  }
  throw new AppError("invalid-input", formErrors[0] ?? DEFAULT_MESSAGES["invalid-input"], { fieldErrors });
}

/**
 * Runs a use case as `actor` with raw (unparsed) input. Resolves once the transaction has committed;
 * throws AppError for refusals and bad input, and rolls everything back on any error.
 */
export async function runUseCase<P extends Permission, S extends z.ZodType, T, R>(
  useCase: UseCase<P, S, T, R>,
  request: UseCaseRequest,
): Promise<T> {
  return (await executeUseCase(useCase, request)).result;
}

/** runUseCase, also handing back the parsed input (for adapters that act on it after the commit). */
export async function executeUseCase<P extends Permission, S extends z.ZodType, T, R>(
  useCase: UseCase<P, S, T, R>,
  { actor, input: raw, ipAddress = null }: UseCaseRequest,
): Promise<{ input: z.infer<S>; result: T }> {
  let allowed: ActorFor<P>;
  try {
    allowed = authorizeOrThrow(actor, useCase.permission);
  } catch (error) {
    if (actor && error instanceof AppError && error.code === "forbidden") {
      await recordRefusal({
        action: "access.refused",
        actorId: actor.id,
        actorEmail: actor.email,
        subject: null,
        details: { useCase: useCase.name, permission: useCase.permission },
        ipAddress,
      });
    }
    throw error;
  }
  try {
    const input = parseOrThrow(useCase.input, raw);
    if (useCase.database === false) return { input, result: await useCase.run(input, { actor: allowed }) };
    const prepared = (useCase.prepare ? await useCase.prepare(input, { actor: allowed }) : undefined) as R;
    if (useCase.database === "one-statement") {
      const audit = useCase.audit;
      const asked = new Set<T>();
      const result = await useCase.run(input, {
        actor: allowed,
        prepared,
        auditEventOf: (value) => {
          asked.add(value);
          const event = audit({ input, result: value, actor: allowed });
          return event && { actorId: allowed?.id ?? null, actorEmail: allowed?.email ?? null, ipAddress, ...event };
        },
      });
      if (!asked.has(result)) throw new Error(`${useCase.name}: the work stored its change without asking for its audit event`);
      return { input, result };
    }
    const work = useCase.run;
    const audit = useCase.audit;
    const result = await runInTransaction(async (tx) => {
      const value = await work(input, { actor: allowed, tx, prepared });
      const event = audit?.({ input, result: value, actor: allowed });
      if (event)
        await recordAuditEvent({ actorId: allowed?.id ?? null, actorEmail: allowed?.email ?? null, ipAddress, ...event });
      return value;
    });
    return { input, result };
  } catch (error) {
    const event = useCase.auditFailure && error instanceof AppError ? useCase.auditFailure({ error, actor: allowed }) : null;
    if (event) await recordRefusal({ actorId: allowed?.id ?? null, actorEmail: allowed?.email ?? null, ipAddress, ...event });
    throw error;
  }
}
