import "server-only";
// Runs: an engineer or lead runs a published version of a standard inside a job. The inputs are checked, the standard
// evaluated in the evaluation pool and the canonical record made with its sha256 (prepare); then one statement locks
// the job and stores the run, one row per library entry it used and its audit event, atomically. Bad inputs store
// nothing (a 422 with a message per input). A model the engine cannot analyse (an unstable structure names its node and
// direction) is stored as a failed run, so that the attempt is on record too. The evaluation bundle that made a run is
// kept in object storage by its sha256 before the run is stored (run-store.ts, evaluation-bundles.ts), for reproducing
// it "as issued". Runs are append-only; everyone but admins reads them.
import { AppError } from "@/lib/domain/errors";
import { compareRunsSchema, createRunSchema, listRunsSchema, runRefSchema } from "@/lib/domain/schemas/jobs";
import { compareRuns as compareRecords, type RunComparison } from "@/lib/standards/compare-runs";
import { parseSource } from "@/lib/standards/source";
import { DefinitionSchema, type Definition } from "@/lib/standards/definition";
import { readRunRecord } from "@/lib/standards/run-record";
import { getJobToRun } from "@/lib/data/jobs";
import { getVersion, getVersionWithJob } from "@/lib/data/standards";
import { definitionOfSource } from "@/lib/standards/read-definition";
import { getRun, getRunRecord, getRunSummary, storeRunUnderJobLock, type RunDto, type RunSummaryDto } from "@/lib/data/runs";
import { revisionsOfRun } from "@/lib/data/calcs";
import { getFirmName } from "@/lib/data/firm";
import { listWithdrawalsOfRun } from "@/lib/data/withdrawals";
import { defineUseCase } from "./use-case";
import { pageOfRuns, type RunPage } from "./run-log";
import { runSealOf, type RunSeal } from "./log";
import { sheetKeyOf } from "./sheet-key";
import { entriesOfRun, evaluateRun, runToStore, type RunToStore, type StoredRun } from "./run-store";

export const createRun = defineUseCase({
  name: "runs.create",
  permission: "runs.create",
  input: createRunSchema,
  database: "one-statement",
  prepare: async ({ jobId, versionId, inputs, unitSystem, parentRunId }, { actor }): Promise<RunToStore> => {
    // The version and the job in one round trip; the job alone when there is no such version, to say which is missing.
    const target = await getVersionWithJob(versionId, jobId);
    const job = target ? target.job : await getJobToRun(jobId);
    if (!job)
      throw new AppError("not-found", "That job does not exist.", { fieldErrors: { jobId: ["Choose a job of the firm."] } });
    if (job.status === "closed")
      throw new AppError("conflict", `Job ${job.jobNumber} is closed: it takes no new design runs. Reopen it to run in it.`);
    const version = target?.version;
    if (!version)
      throw new AppError("not-found", "That is not a published version of a standard. Drafts cannot be run.", {
        fieldErrors: { versionId: ["Choose a published version."] },
      });
    if (version.status === "withdrawn")
      throw new AppError(
        "conflict",
        `Version ${version.number} of ${version.title} is withdrawn and cannot be run. Run the version that replaces it.`,
      );
    // Runs never change, nor move between jobs: the run this one re-runs is checked before the lock.
    if (parentRunId) {
      const parent = await getRunSummary(parentRunId);
      if (!parent || parent.jobId !== job.id)
        throw new AppError("invalid-input", "The run this one re-runs is not a run of this job.", {
          fieldErrors: { parentRunId: ["Re-run a run of the same job."] },
        });
    }
    const evaluated = await evaluateRun(job, version, inputs);
    return runToStore(evaluated, await entriesOfRun(evaluated), {
      actor,
      jobNumber: job.jobNumber,
      inputs,
      unitSystem,
      parentRunId: parentRunId ?? null,
      purpose: "design",
    });
  },
  run: async (_input, { prepared: { row, entries, stored, title }, auditEventOf }): Promise<StoredRun> => {
    // Under the job's lock, in the statement that stores the run: a job closed or renumbered, or a version withdrawn,
    // since the job and the version were read refuses the run, and nothing is written.
    const locked = await storeRunUnderJobLock(row, stored.jobNumber, entries, auditEventOf(stored)!);
    if (!locked) throw new AppError("not-found", "That job does not exist.");
    if (locked.stored) return stored;
    if (locked.status === "closed")
      throw new AppError("conflict", `Job ${locked.jobNumber} was closed while the run was evaluated.`);
    if (locked.versionStatus === "withdrawn")
      throw new AppError("conflict", `Version ${stored.number} of ${title} was withdrawn while the run was evaluated.`);
    throw new AppError(
      "conflict",
      `Job ${stored.jobNumber} was renumbered ${locked.jobNumber} while the run was evaluated. Run it again to record it under its new number.`,
    );
  },
  audit: ({ result }) => ({
    action: "runs.create",
    subject: `run:${result.id}`,
    details: {
      jobNumber: result.jobNumber,
      slug: result.slug,
      number: result.number,
      outcome: result.outcome,
      pass: result.pass,
      sha256: result.sha256,
      purpose: "design",
    },
  }),
});

export type RunView = RunDto & { withdrawals: RunWithdrawal[] };

export const readRun = defineUseCase({
  name: "runs.read",
  permission: "runs.read",
  input: runRefSchema,
  run: async ({ id }): Promise<RunView> => {
    const run = await getRun(id);
    if (!run) throw new AppError("not-found", "There is no run with that id.");
    return { ...run, withdrawals: run.withdrawn ? await withdrawalsOf(id) : [] };
  },
  audit: null,
});

/** A withdrawal that touches a run, as its banner says it. */
export type RunWithdrawal = { id: string; label: string; reason: string; actorName: string | null; occurredAt: string };

/** The withdrawals that touch a run (its version, a library version or entry it used), for its banner. */
async function withdrawalsOf(runId: string): Promise<RunWithdrawal[]> {
  return (await listWithdrawalsOfRun(runId)).map(({ id, label, reason, actorName, occurredAt }) => ({
    id,
    label,
    reason,
    actorName,
    occurredAt,
  }));
}

/**
 * Everything a run's calc sheet shows from the database but the run's record and its version (both append-only,
 * named here by the record's sha256 and the version's id): its key is the sheet's key (lib/use-cases/sheet-key.ts).
 */
export type SheetFacts = {
  run: RunSummaryDto & { withdrawals: RunWithdrawal[] };
  firmName: string;
  /** The revisions that issue the run, with each sign-off event, for the sheet's header and sign-off block. */
  revisions: Awaited<ReturnType<typeof revisionsOfRun>>;
  /** Its seal in the verifiable log (or why there is none yet), printed for a check without the server. */
  seal: RunSeal;
};

/** A calc sheet's facts, read as the sheet page reads them; null when there is no such run. */
export async function sheetFactsOf(id: string): Promise<SheetFacts | null> {
  const run = await getRunSummary(id);
  if (!run) return null;
  const [withdrawals, firmName, revisions, seal] = await Promise.all([
    withdrawalsOf(id),
    getFirmName(),
    revisionsOfRun(id),
    runSealOf(id),
  ]);
  return { run: { ...run, withdrawals }, firmName: firmName ?? "", revisions, seal };
}

export type RunSheet = {
  /** What the sheet shows from the database besides the record and the version; `sheetKey` is their key. */
  facts: SheetFacts;
  /** The canonical record as stored, named by facts.run.recordSha256. */
  record: string;
  /** The version's definition and narrative, for the sheet's scope, limitations and worked narrative. */
  definition: Definition | null;
  narrative: string;
  /** The key of this state of the sheet, computed from `facts`; null when the app's build is not known. */
  sheetKey: string | null;
};

/**
 * What a run's calc sheet prints: its facts, its record and its version's definition and narrative — all the sheet
 * page reads, so that the key computed from the facts here is the key of what the page draws.
 */
export const readRunSheet = defineUseCase({
  name: "runs.sheet",
  permission: "runs.read",
  input: runRefSchema,
  run: async ({ id }): Promise<RunSheet> => {
    const facts = await sheetFactsOf(id);
    if (!facts) throw new AppError("not-found", "There is no run with that id.");
    const [record, version] = await Promise.all([getRunRecord(id), getVersion({ id: facts.run.versionId })]);
    const read = parseSource(version!.source);
    const parsed = read.ok ? DefinitionSchema.safeParse(read.parsed.data) : null;
    return {
      facts,
      record: record!,
      definition: parsed?.success ? parsed.data : null,
      narrative: read.ok ? read.parsed.narrative : "",
      sheetKey: sheetKeyOf(facts),
    };
  },
  audit: null,
});

/** GET /api/runs: a page of runs, filtered and sorted (lib/domain/schemas/run-log.ts), for whoever reads runs. */
export const readRuns = defineUseCase({
  name: "runs.list",
  permission: "runs.read",
  input: listRunsSchema,
  run: async (query): Promise<RunPage> => pageOfRuns(query),
  audit: null,
});

export type RunsCompared = {
  a: RunSummaryDto;
  b: RunSummaryDto;
  comparison: RunComparison;
  /** Labels from the runs' definitions (the first run's where both have one), by key. */
  labels: Record<string, string>;
};

/**
 * Two runs of the same standard side by side, from their records, their values in the units asked for (the person's
 * display units). Runs of different standards are refused.
 */
export const compareRuns = defineUseCase({
  name: "runs.compare",
  permission: "runs.read",
  input: compareRunsSchema,
  run: async ({ a, b, units }): Promise<RunsCompared> => {
    const [runA, runB] = await Promise.all([getRun(a), getRun(b)]);
    if (!runA || !runB)
      throw new AppError("not-found", "There is no run with that id.", {
        fieldErrors: !runA ? { a: ["There is no run with that id."] } : { b: ["There is no run with that id."] },
      });
    if (runA.slug !== runB.slug)
      throw new AppError(
        "invalid-input",
        `Only runs of the same standard compare: the first is ${runA.title} (${runA.slug}), the second ${runB.title} (${runB.slug}).`,
        { fieldErrors: { b: [`Choose a run of ${runA.title}.`] } },
      );
    const labels: Record<string, string> = {};
    // The second run's version first, so the first run's labels win where both have one; one read when they share it.
    const versionIds = [...new Set([runB.versionId, runA.versionId])];
    for (const version of await Promise.all(versionIds.map((id) => getVersion({ id })))) {
      const definition = version ? definitionOfSource(version.source) : null;
      if (!definition) continue;
      const { inputs, derived, extracts, checks } = definition;
      for (const group of [inputs, derived, extracts, checks] as Record<string, { label?: string }>[])
        for (const [key, item] of Object.entries(group)) if (item.label) labels[key] = item.label;
    }
    const { record: recordA, ...a_ } = runA;
    const { record: recordB, ...b_ } = runB;
    return { a: a_, b: b_, comparison: compareRecords(readRunRecord(recordA), readRunRecord(recordB), units), labels };
  },
  audit: null,
});
