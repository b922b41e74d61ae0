import "server-only";
// Runs: an engineer or lead runs a published version of a standard inside a job. The inputs are checked and the
// standard evaluated in the evaluation pool before any transaction opens (prepare); then, under the job's lock,
// the run is stored as its canonical record with its sha256, with one row per library entry it used, in one
// transaction with its audit event. Bad inputs store nothing (a 422 with a message per input). A model the engine
// cannot analyse (an unstable structure names its node and direction) is stored as a failed run, so that the
// attempt is on record too. The evaluation bundle that made a run is kept in object storage by its sha256 before the
// run is stored (evaluation-bundles.ts), for reproducing it "as issued". Runs are append-only; everyone but admins reads them.
import { createHash, randomUUID } from "node:crypto";
import { AppError } from "@/lib/domain/errors";
import { compareRunsSchema, createRunSchema, listRunsSchema, runRefSchema } from "@/lib/domain/schemas/jobs";
import { compareRuns as compareRecords, type RunComparison } from "@/lib/standards/compare-runs";
import { parseSource } from "@/lib/standards/source";
import { DefinitionSchema, type Definition } from "@/lib/standards/definition";
import { isLibraryInput, normaliseEntryKey } from "@/lib/standards/library-inputs";
import {
  maxUtilisationOf,
  readRunRecord,
  RUN_RECORD_FORMAT,
  runFailureOf,
  runRecordText,
  runRecordTextWithAnalysis,
  type RunRecord,
  type RunRecordEntry,
} from "@/lib/standards/run-record";
import type { Evaluation } from "@/lib/standards/evaluate";

import { evaluationPool } from "@/lib/evaluation/pool";
import { getJob, lockJob, type JobDto } from "@/lib/data/jobs";
import { getVersion, getVersionStatus, type VersionDto } from "@/lib/data/standards";
import { definitionOfSource } from "@/lib/standards/read-definition";
import {
  findLibraryEntryRow,
  getRun,
  getRunSummary,
  insertRun,
  insertRunLibraryEntries,
  type RunDto,
  type RunSummaryDto,
} from "@/lib/data/runs";
import { getFirmName } from "@/lib/data/firm";
import { libraryEntriesFor } from "./library-resolution";
import { keepCurrentEvaluationBundle } from "./evaluation-bundles";
import { pageOfRuns, type RunPage } from "./run-log";
import { defineUseCase } from "./use-case";

type Prepared = {
  job: JobDto;
  version: VersionDto;
  order: RunRecord["order"];
  identity: { engine: string; engineSourceHash: string; evaluation: string; bundleSha256: string };
} & (
  | { outcome: "succeeded"; evaluation: Evaluation; analysisJson: string }
  | { outcome: "failed"; failure: ReturnType<typeof runFailureOf> }
);

function definitionOf(version: VersionDto): Definition {
  const definition = definitionOfSource(version.source);
  if (!definition)
    throw new AppError("conflict", `Version ${version.number} of ${version.slug} no longer reads with this release of Gusset.`);
  return definition;
}

/** The entries each library input was given, by library slug: what the evaluation needs bound besides defaults. */
function picksOf(definition: Definition, inputs: Readonly<Record<string, string | number>>): Record<string, string[]> {
  const picks: Record<string, string[]> = {};
  for (const [key, input] of Object.entries(definition.inputs)) {
    const given = inputs[key];
    if (!isLibraryInput(input) || typeof given !== "string") continue;
    (picks[input.library] ??= []).push(given);
  }
  return picks;
}

const unknownInputs = (definition: Definition, inputs: Readonly<Record<string, unknown>>) =>
  Object.keys(inputs).filter((key) => !Object.hasOwn(definition.inputs, key));

export const createRun = defineUseCase({
  name: "runs.create",
  permission: "runs.create",
  input: createRunSchema,
  prepare: async ({ jobId, versionId, inputs }): Promise<Prepared> => {
    const job = await getJob({ id: jobId });
    if (!job)
      throw new AppError("not-found", "That job does not exist.", { fieldErrors: { jobId: ["Choose a job of the firm."] } });
    if (job.status === "closed")
      throw new AppError("conflict", `Job ${job.jobNumber} is closed: it takes no new design runs. Reopen it to run in it.`);
    const version = await getVersion({ id: versionId });
    if (!version)
      throw new AppError("not-found", "That is not a published version of a standard. Drafts cannot be run.", {
        fieldErrors: { versionId: ["Choose a published version."] },
      });
    if (version.status === "withdrawn")
      throw new AppError(
        "conflict",
        `Version ${version.number} of ${version.title} is withdrawn and cannot be run. Run the version that replaces it.`,
      );
    const definition = definitionOf(version);
    const unknown = unknownInputs(definition, inputs);
    if (unknown.length > 0)
      throw new AppError("invalid-input", `This standard has no input ${unknown.map((k) => `“${k}”`).join(", ")}.`, {
        fieldErrors: Object.fromEntries(
          unknown.map((key) => [`inputs.${key}`, [`There is no input “${key}” in this standard.`]]),
        ),
      });

    const pool = evaluationPool();
    const libraries = await libraryEntriesFor(version.source, picksOf(definition, inputs));
    const answer = await pool.run(version.source, inputs, libraries);
    if (!answer.ok)
      throw new AppError(
        answer.reason === "timeout" || answer.reason === "out-of-memory" ? "invalid-input" : "unavailable",
        answer.message,
      );
    if (!answer.result.ok)
      throw new AppError(
        "conflict",
        `Version ${version.number} of ${version.title} no longer compiles with this release of Gusset.`,
      );
    const { outcome } = answer.result;
    const manifest = pool.bundle();
    // The bundle that made the run is kept before the run is, so the run can always be reproduced "as issued".
    await keepCurrentEvaluationBundle().catch((error: unknown) => {
      console.error("[gusset] could not keep the evaluation bundle in object storage:", error);
      throw new AppError(
        "unavailable",
        "The run was not stored: the evaluation bundle that made it could not be kept in file storage, so it could not be " +
          "reproduced later. Try again in a minute; if it keeps happening, tell your admin.",
      );
    });
    const identity = {
      engine: manifest.builtFrom.engine ?? "",
      engineSourceHash: manifest.builtFrom.engineSourceHash ?? "",
      evaluation: manifest.builtFrom.evaluation ?? "",
      bundleSha256: manifest.sha256,
    };
    if (!outcome.ok && outcome.stage === "inputs")
      throw new AppError("invalid-input", "Some inputs need attention.", {
        fieldErrors: outcome.problems.reduce<Record<string, string[]>>((errors, problem) => {
          (errors[`inputs.${problem.input}`] ??= []).push(problem.message);
          return errors;
        }, {}),
      });
    const order = {
      inputs: Object.keys(definition.inputs),
      derived: Object.keys(definition.derived),
      extracts: Object.keys(definition.extracts),
      checks: Object.keys(definition.checks),
    };
    if (!outcome.ok) return { job, version, order, identity, outcome: "failed", failure: runFailureOf(outcome) };
    if (answer.result.analysisJson === null || answer.result.evaluationJson === null)
      throw new Error("runs.create: the evaluation bundle gave no result text for a run that succeeded");
    return {
      job,
      version,
      order,
      // The identity the evaluation itself reports is the authority; the bundle's hash comes from its manifest.
      identity: { ...outcome.evaluation.identity, bundleSha256: manifest.sha256 },
      outcome: "succeeded",
      evaluation: JSON.parse(answer.result.evaluationJson) as Evaluation,
      // Already canonical: spliced into the record as it is (runRecordTextWithAnalysis), never parsed here.
      analysisJson: answer.result.analysisJson,
    };
  },
  run: async ({ inputs, unitSystem, parentRunId }, { actor, prepared }) => {
    const { job, version } = prepared;
    // Under the job's lock: a job closed, or a version withdrawn, since the evaluation began refuses the run.
    const locked = await lockJob(job.id);
    if (!locked) throw new AppError("not-found", "That job does not exist.");
    if (locked.status === "closed")
      throw new AppError("conflict", `Job ${locked.jobNumber} was closed while the run was evaluated.`);
    if ((await getVersionStatus(version.id)) === "withdrawn")
      throw new AppError("conflict", `Version ${version.number} of ${version.title} was withdrawn while the run was evaluated.`);
    if (parentRunId) {
      const parent = await getRunSummary(parentRunId);
      if (!parent || parent.jobId !== job.id)
        throw new AppError("invalid-input", "The run this one re-runs is not a run of this job.", {
          fieldErrors: { parentRunId: ["Re-run a run of the same job."] },
        });
    }

    const entries: RunRecordEntry[] = [];
    if (prepared.outcome === "succeeded")
      for (const [input, evaluated] of Object.entries(prepared.evaluation.inputs)) {
        const used = evaluated.entry;
        if (!used) continue;
        const row = await findLibraryEntryRow(used.library, used.version, normaliseEntryKey(used.key));
        if (!row || row.entryHash !== used.hash)
          throw new AppError(
            "conflict",
            `The library entry ${used.key} (${used.library} v${used.version}) is not the one published.`,
          );
        entries.push({
          input,
          library: used.library,
          version: used.version,
          contentHash: used.contentHash,
          key: used.key,
          entryId: row.id,
          entryHash: row.entryHash,
        });
      }

    const id = randomUUID();
    const createdAt = new Date();
    const base = {
      format: RUN_RECORD_FORMAT,
      id,
      createdAt: createdAt.toISOString(),
      createdBy: { id: actor.id, name: actor.name },
      job: { id: job.id, number: locked.jobNumber, name: job.name },
      standard: {
        slug: version.slug,
        title: version.title,
        versionId: version.id,
        number: version.number,
        contentHash: version.contentHash,
      },
      purpose: "design",
      parentRunId: parentRunId ?? null,
      unitSystem,
      typed: inputs,
      identity: prepared.identity,
      libraries: entries,
      order: prepared.order,
    } as const;
    const record =
      prepared.outcome === "succeeded"
        ? ({ ...base, outcome: "succeeded", evaluation: prepared.evaluation } as const)
        : ({ ...base, outcome: "failed", failure: prepared.failure } as const);
    const text =
      prepared.outcome === "succeeded" && record.outcome === "succeeded"
        ? runRecordTextWithAnalysis(record, prepared.analysisJson)
        : runRecordText(record as RunRecord);
    const sha256 = createHash("sha256").update(text, "utf8").digest("hex");
    const pass = record.outcome === "succeeded" ? record.evaluation.pass : null;
    await insertRun({
      id,
      jobId: job.id,
      versionId: version.id,
      outcome: record.outcome,
      pass,
      maxUtilisation: record.outcome === "succeeded" ? maxUtilisationOf(record.evaluation) : null,
      purpose: "design",
      parentRunId: parentRunId ?? null,
      unitSystem,
      record: text,
      recordSha256: sha256,
      recordBytes: Buffer.byteLength(text, "utf8"),
      createdById: actor.id,
      createdAt,
    });
    await insertRunLibraryEntries(
      entries.map((e) => ({ runId: id, inputKey: e.input, entryId: e.entryId, entryHash: e.entryHash })),
    );
    return {
      id,
      outcome: record.outcome,
      pass,
      sha256,
      jobNumber: locked.jobNumber,
      slug: version.slug,
      number: version.number,
      ...(record.outcome === "failed" ? { message: record.failure.message } : {}),
    };
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

export type RunView = RunDto;

export const readRun = defineUseCase({
  name: "runs.read",
  permission: "runs.read",
  input: runRefSchema,
  run: async ({ id }): Promise<RunView> => {
    const run = await getRun(id);
    if (!run) throw new AppError("not-found", "There is no run with that id.");
    return run;
  },
  audit: null,
});

/** The withdrawal of a version, when it has been withdrawn. */
export function withdrawalOf(version: { status: string; events: VersionDto["events"] }): RunSheet["withdrawal"] {
  if (version.status !== "withdrawn") return null;
  const event = version.events.findLast((e) => e.kind === "withdrawn");
  return { at: event?.occurredAt ?? "", by: event?.actorName ?? null, reason: event?.reason ?? null };
}

export type RunSheet = {
  run: RunView;
  firmName: string;
  /** The version's definition and narrative, for the sheet's scope, limitations and worked narrative. */
  definition: Definition | null;
  narrative: string;
  /** Set when the run's version has been withdrawn since: the sheet and the run page say so in a banner. */
  withdrawal: { at: string; by: string | null; reason: string | null } | null;
};

/** What a run's calc sheet prints: the run, the firm, and its version's definition and narrative. */
export const readRunSheet = defineUseCase({
  name: "runs.sheet",
  permission: "runs.read",
  input: runRefSchema,
  run: async ({ id }): Promise<RunSheet> => {
    const run = await getRun(id);
    if (!run) throw new AppError("not-found", "There is no run with that id.");
    const version = (await getVersion({ id: run.versionId }))!;
    const read = parseSource(version.source);
    const parsed = read.ok ? DefinitionSchema.safeParse(read.parsed.data) : null;
    return {
      run,
      firmName: (await getFirmName()) ?? "",
      definition: parsed?.success ? parsed.data : null,
      narrative: read.ok ? read.parsed.narrative : "",
      withdrawal: withdrawalOf(version),
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

/** Two runs of the same standard side by side, from their records. Runs of different standards are refused. */
export const compareRuns = defineUseCase({
  name: "runs.compare",
  permission: "runs.read",
  input: compareRunsSchema,
  run: async ({ a, b }): Promise<RunsCompared> => {
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
    return { a: a_, b: b_, comparison: compareRecords(readRunRecord(recordA), readRunRecord(recordB)), labels };
  },
  audit: null,
});
