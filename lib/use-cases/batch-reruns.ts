import "server-only";
// Batch re-runs after a withdrawal. A lead starts one from the impact report: one queued job per affected run
// (closed jobs too: the re-run is a remediation run), each re-run by a worker through the same evaluation and store
// as any run (./run-store.ts), on the successor version with the inputs mapped as declared, or, after a library
// withdrawal, on the run's own version with the replacement entry. Each re-run is a new run whose parent is its
// original and which waits for its own check like any run. pg-boss delivers at least once: the (batch, original run)
// row is unique and written in the re-run's own transaction, under a lock on that pair, so a delivery after a worker
// died mid-way either finds it done or does it once.
import { AppError } from "@/lib/domain/errors";
import { z } from "@/lib/domain/zod";
import type { Actor } from "@/lib/domain/actor";
import { batchStalledFor } from "@/lib/domain/batch-stall";
import { batchProgressSchema, startBatchSchema } from "@/lib/domain/schemas/withdrawals";
import type { CheckDelta } from "@/db/schema";
import { enqueueJobs } from "@/lib/jobs/enqueue";
import type { JobPayloads } from "@/lib/jobs/queues";
import { readRunRecord } from "@/lib/standards/run-record";
import type { Evaluation } from "@/lib/standards/evaluate";
import { getJob, lockJobForRun } from "@/lib/data/jobs";
import { getRun } from "@/lib/data/runs";
import { getVersion, getVersionStatus, type VersionDto } from "@/lib/data/standards";
import { getUserOrThrow } from "@/lib/data/users";
import {
  batchItemExists,
  batchOfMapping,
  countBatchItems,
  getBatch,
  getLatestBatch,
  getLatestMapping,
  getWithdrawal,
  insertBatch,
  insertBatchItem,
  listAffectedRuns,
  listBatchDeltas,
  listWithdrawnInputsOfRun,
  lockBatchItem,
  type BatchItemDto,
} from "@/lib/data/withdrawals";
import { runUseCase } from "./run";
import { defineUseCase } from "./use-case";
import { definitionOf, evaluateRun, storeRun, type EvaluatedRun } from "./run-store";
import { mapRunInputs } from "./withdrawal-mapping";

export const startBatch = defineUseCase({
  name: "withdrawals.batch.start",
  permission: "withdrawals.rerun",
  input: startBatchSchema,
  run: async ({ withdrawalId }, { actor }) => {
    const withdrawal = await getWithdrawal(withdrawalId);
    if (!withdrawal) throw new AppError("not-found", "There is no withdrawal with that id.");
    const mapping = await getLatestMapping(withdrawalId);
    if (!mapping)
      throw new AppError("conflict", `No successor was named for ${withdrawal.label}: there is nothing to re-run it on.`);
    let successor = "each run's own version";
    if (mapping.successorVersionId) {
      if ((await getVersionStatus(mapping.successorVersionId)) === "withdrawn")
        throw new AppError(
          "conflict",
          `Version ${mapping.successorNumber} has been withdrawn since it was named; it cannot be run.`,
        );
      successor = `${withdrawal.slug} v${mapping.successorNumber}`;
    } else if (mapping.replacementEntryKey) successor = `${withdrawal.slug} with ${mapping.replacementEntryKey}`;
    if (await batchOfMapping(mapping.id))
      throw new AppError("conflict", `A batch re-run on this mapping was started already; its progress is on the impact report.`);
    const runs = await listAffectedRuns(withdrawal);
    const { id: batchId } = await insertBatch({ withdrawalId, mappingId: mapping.id, total: runs.length, startedById: actor.id });
    await enqueueJobs(
      "rerun.item",
      runs.map((run) => ({ batchId, originalRunId: run.id })),
    );
    return { withdrawalId, batchId, runs: runs.length, successor };
  },
  audit: ({ result }) => ({
    action: "withdrawals.batch.start",
    subject: `withdrawal:${result.withdrawalId}`,
    details: { batchId: result.batchId, runs: result.runs, successor: result.successor },
  }),
});

export type BatchProgress = {
  batch: {
    id: string;
    /** The mapping it re-ran on: a newer mapping may be re-run as a batch of its own. */
    mappingId: string;
    total: number;
    done: number;
    succeeded: number;
    failed: number;
    passToFail: number;
    startedByName: string;
    startedAt: string;
    lastFinishedAt: string | null;
    /** Milliseconds it has finished nothing with runs still to do, once that is long enough to say (else null). */
    stalledForMs: number | null;
  } | null;
  /** Checks that went from pass to fail first, then failed re-runs, then the largest changes of utilisation. */
  deltas: BatchItemDto[];
};

/** The latest batch of a withdrawal: how far it has come and its delta table (what the progress bar polls). */
export const readBatchProgress = defineUseCase({
  name: "withdrawals.batch.progress",
  permission: "runs.read",
  input: batchProgressSchema,
  run: async ({ id }): Promise<BatchProgress> => {
    if (!(await getWithdrawal(id))) throw new AppError("not-found", "There is no withdrawal with that id.");
    const batch = await getLatestBatch(id);
    if (!batch) return { batch: null, deltas: [] };
    const counts = await countBatchItems(batch.id);
    return {
      batch: {
        id: batch.id,
        mappingId: batch.mappingId,
        total: batch.total,
        ...counts,
        startedByName: batch.startedByName,
        startedAt: batch.startedAt,
        stalledForMs: batchStalledFor({ ...counts, total: batch.total, startedAt: batch.startedAt }, new Date()),
      },
      deltas: await listBatchDeltas(batch.id, 50),
    };
  },
  audit: null,
});

const itemSchema = z.object({ batchId: z.uuid(), originalRunId: z.uuid() });

type PreparedRerun =
  | {
      evaluated: EvaluatedRun;
      inputs: Record<string, string | number>;
      originalId: string;
      unitSystem: "si" | "us";
      before: Evaluation | null;
      passBefore: boolean | null;
      utilisationBefore: number | null;
    }
  | { done: true };

/** Each check of either side, matched by key: the before and after of its utilisation and pass. */
export function checkDeltas(before: Evaluation | null, after: Evaluation | null): CheckDelta[] {
  const keys = [...new Set([...Object.keys(before?.checks ?? {}), ...Object.keys(after?.checks ?? {})])];
  return keys.map((key) => {
    const a = before?.checks[key];
    const b = after?.checks[key];
    return {
      key,
      label: b?.label ?? a?.label ?? key,
      before: a ? { utilisation: a.utilisation, pass: a.pass } : null,
      after: b ? { utilisation: b.utilisation, pass: b.pass } : null,
    };
  });
}

/** The version a re-run runs on: the named successor, or (after a library withdrawal) the run's own version. */
async function targetVersionOrThrow(successorVersionId: string | null, ownVersionId: string): Promise<VersionDto> {
  const version = (await getVersion({ id: successorVersionId ?? ownVersionId }))!;
  if (version.status === "withdrawn")
    throw new AppError("conflict", `Version ${version.number} of ${version.title} is withdrawn and cannot be run.`);
  return version;
}

/** One re-run of a batch, as the lead who started the batch: evaluated in prepare, stored with its batch row. */
export const rerunInBatch = defineUseCase({
  name: "withdrawals.batch.rerun",
  permission: "withdrawals.rerun",
  input: itemSchema,
  prepare: async ({ batchId, originalRunId }): Promise<PreparedRerun> => {
    if (await batchItemExists(batchId, originalRunId)) return { done: true };
    const batch = await getBatch(batchId);
    if (!batch) throw new AppError("not-found", "There is no such batch.");
    const mapping = (await getLatestMapping(batch.withdrawalId))!;
    const original = await getRun(originalRunId);
    if (!original) throw new AppError("not-found", "The run to re-run does not exist.");
    const record = readRunRecord(original.record);
    const own = (await getVersion({ id: original.versionId }))!;
    const version = await targetVersionOrThrow(mapping.successorVersionId, original.versionId);
    let inputs: Record<string, string | number>;
    if (mapping.successorVersionId) inputs = mapRunInputs(definitionOf(own), record.typed, mapping.mapping);
    else {
      inputs = { ...record.typed };
      if (mapping.replacementEntryKey) {
        const withdrawal = (await getWithdrawal(batch.withdrawalId))!;
        for (const key of await listWithdrawnInputsOfRun(originalRunId, withdrawal)) inputs[key] = mapping.replacementEntryKey;
      }
    }
    const job = (await getJob({ id: original.jobId }))!;
    const evaluated = await evaluateRun(job, version, inputs);
    const before = record.outcome === "succeeded" ? record.evaluation : null;
    return {
      evaluated,
      inputs,
      originalId: original.id,
      unitSystem: record.unitSystem,
      before,
      passBefore: original.pass,
      utilisationBefore: original.maxUtilisation,
    };
  },
  run: async ({ batchId, originalRunId }, { actor, prepared }) => {
    await lockBatchItem(batchId, originalRunId);
    if ("done" in prepared || (await batchItemExists(batchId, originalRunId))) return { skipped: true as const };
    const { evaluated } = prepared;
    // A remediation run goes into the job whatever its status: a closed job's calcs are fixed too.
    const locked = await lockJobForRun(evaluated.job.id, evaluated.version.id);
    if (!locked) throw new AppError("not-found", "The job of the run to re-run does not exist.");
    if (locked.versionStatus === "withdrawn")
      throw new AppError("conflict", `Version ${evaluated.version.number} was withdrawn while the re-run was evaluated.`);
    const stored = await storeRun(evaluated, {
      actor,
      jobNumber: locked.jobNumber,
      inputs: prepared.inputs,
      unitSystem: prepared.unitSystem,
      parentRunId: prepared.originalId,
      purpose: "remediation",
    });
    const after = evaluated.outcome === "succeeded" ? evaluated.evaluation : null;
    const checks = checkDeltas(prepared.before, after);
    await insertBatchItem({
      batchId,
      originalRunId,
      newRunId: stored.id,
      status: stored.outcome,
      message: stored.message ?? null,
      passBefore: prepared.passBefore,
      passAfter: stored.pass,
      utilisationBefore: prepared.utilisationBefore,
      utilisationAfter: after ? Math.max(...Object.values(after.checks).map((c) => c.utilisation), 0) : null,
      newlyFailing: checks.filter((c) => c.before?.pass && c.after && !c.after.pass).length,
      checks,
    });
    return { skipped: false as const, ...stored };
  },
  audit: ({ result }) =>
    result.skipped
      ? null
      : {
          action: "runs.create",
          subject: `run:${result.id}`,
          details: {
            jobNumber: result.jobNumber,
            slug: result.slug,
            number: result.number,
            outcome: result.outcome,
            pass: result.pass,
            sha256: result.sha256,
            purpose: "remediation",
          },
        },
});

/** A re-run that could not be made (its mapped inputs refused, its version gone): counted in the batch as failed. */
export const recordRerunFailure = defineUseCase({
  name: "withdrawals.batch.rerun-failed",
  permission: "withdrawals.rerun",
  input: itemSchema.extend({ message: z.string().max(4000) }),
  run: async ({ batchId, originalRunId, message }) => {
    await lockBatchItem(batchId, originalRunId);
    if (await batchItemExists(batchId, originalRunId)) return { recorded: false };
    const original = (await getRun(originalRunId))!;
    await insertBatchItem({
      batchId,
      originalRunId,
      newRunId: null,
      status: "failed",
      message,
      passBefore: original.pass,
      utilisationBefore: original.maxUtilisation,
      checks: [],
    });
    return { recorded: true };
  },
  audit: null,
});

/** Refusals that are the re-run's own answer (stored as a failed item); anything else is retried by the queue. */
const FINAL = new Set(["invalid-input", "conflict", "not-found", "bad-request"]);

/** The worker's handler for a `rerun.item` job: the re-run, or its failure recorded; safe to deliver twice. */
export async function processRerunJob({ batchId, originalRunId }: JobPayloads["rerun.item"]): Promise<void> {
  const batch = await getBatch(batchId);
  if (!batch) return; // its transaction rolled back: nothing to do
  const starter = await getUserOrThrow(batch.startedById);
  const actor: Actor = { id: starter.id, name: starter.name, email: starter.email, role: starter.role };
  try {
    await runUseCase(rerunInBatch, { actor, input: { batchId, originalRunId } });
  } catch (error) {
    if (!(error instanceof AppError) || !FINAL.has(error.code)) throw error;
    const details = Object.values(error.fieldErrors ?? {}).flat();
    const message = [error.message, ...details].join(" ").slice(0, 4000);
    await runUseCase(recordRerunFailure, { actor, input: { batchId, originalRunId, message } });
  }
}
