import "server-only";
// The one way a run is evaluated and stored, shared by a person's run (runs.ts, createRun) and a batch re-run after a
// withdrawal (batch-reruns.ts): the inputs checked and the standard evaluated in the evaluation pool before any
// transaction opens (`evaluateRun`, called from a use case's prepare), then the canonical record made with its sha256
// and the library entries it used (`runToStore`), and written under the job's lock: in one statement for a person's run
// (runs.ts), in the batch's transaction for a re-run (`storeRun`).
import { createHash, randomUUID } from "node:crypto";
import { AppError } from "@/lib/domain/errors";
import type { Actor } from "@/lib/domain/actor";
import type { Definition } from "@/lib/standards/definition";
import { isLibraryInput, normaliseEntryKey } from "@/lib/standards/library-inputs";
import {
  maxUtilisationOf,
  RUN_RECORD_FORMAT,
  runFailureOf,
  runRecordText,
  runRecordTextOfParts,
  type RunRecord,
  type RunRecordEntry,
} from "@/lib/standards/run-record";
import type { Evaluation } from "@/lib/standards/evaluate";
import { definitionOfSource } from "@/lib/standards/read-definition";
import { evaluationPool } from "@/lib/evaluation/pool";
import type { JobToRun } from "@/lib/data/jobs";
import type { VersionDto } from "@/lib/data/standards";
import { findLibraryEntryRow, insertRun, insertRunLibraryEntries, type NewRun, type RunEntryRow } from "@/lib/data/runs";
import type { RunPurpose, UnitSystem } from "@/db/schema";
import { publishedLibraryEntries } from "./library-resolution";
import { keepCurrentEvaluationBundle } from "./evaluation-bundles";

export type RunInputs = Readonly<Record<string, string | number>>;

export type EvaluatedRun = {
  job: JobToRun;
  version: VersionDto;
  order: RunRecord["order"];
  identity: { engine: string; engineSourceHash: string; evaluation: string; bundleSha256: string };
} & (
  | { outcome: "succeeded"; evaluation: Evaluation; evaluationJson: string; analysisJson: string }
  | { outcome: "failed"; failure: ReturnType<typeof runFailureOf> }
);

export function definitionOf(version: VersionDto): Definition {
  const definition = definitionOfSource(version.source);
  if (!definition)
    throw new AppError("conflict", `Version ${version.number} of ${version.slug} no longer reads with this release of Gusset.`);
  return definition;
}

/** The entries each library input was given, by library slug: what the evaluation needs bound besides defaults. */
function picksOf(definition: Definition, inputs: RunInputs): Record<string, string[]> {
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

/**
 * Checks the inputs against the version and evaluates it in the pool. Bad inputs throw "invalid-input" with a message
 * per input; a model the engine cannot analyse comes back as a failed evaluation, to be stored as a failed run.
 */
export async function evaluateRun(job: JobToRun, version: VersionDto, inputs: RunInputs): Promise<EvaluatedRun> {
  const definition = definitionOf(version);
  const unknown = unknownInputs(definition, inputs);
  if (unknown.length > 0)
    throw new AppError("invalid-input", `This standard has no input ${unknown.map((k) => `“${k}”`).join(", ")}.`, {
      fieldErrors: Object.fromEntries(unknown.map((key) => [`inputs.${key}`, [`There is no input “${key}” in this standard.`]])),
    });

  const pool = evaluationPool();
  // `latest` reads the library version pinned when this version was published.
  const { entries: libraries } = await publishedLibraryEntries(version, picksOf(definition, inputs), { forRun: true });
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
    // The evaluation as the worker handed it over, for what storing needs (entries, pass, utilisation); its canonical
    // text and the engine's result are spliced into the record as they are (runRecordTextOfParts), never parsed here.
    evaluation: outcome.evaluation,
    evaluationJson: answer.result.evaluationJson,
    analysisJson: answer.result.analysisJson,
  };
}

export type StoredRun = {
  id: string;
  outcome: "succeeded" | "failed";
  pass: boolean | null;
  sha256: string;
  jobNumber: string;
  slug: string;
  number: number;
  message?: string;
};

/** The options of a run's record besides its evaluation: who, in which job, with what, and why. */
export type RunRowOptions = {
  actor: Actor;
  /** The job's number as the record names it: read under the job's lock, or checked under it (storeRunUnderJobLock). */
  jobNumber: string;
  inputs: RunInputs;
  unitSystem: UnitSystem;
  parentRunId: string | null;
  purpose: RunPurpose;
};

/**
 * The library entries the evaluation used, each checked against its published row. Published entries never change
 * (the table refuses UPDATE and DELETE), so this may read before any lock is taken.
 */
export async function entriesOfRun(prepared: EvaluatedRun): Promise<RunRecordEntry[]> {
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
  return entries;
}

/**
 * The run as it is to be stored: its row (the canonical record and its sha256), its entries' rows, its answer, and
 * the standard's title for messages.
 */
export type RunToStore = { row: NewRun; entries: RunEntryRow[]; stored: StoredRun; title: string };

/** Makes the run's canonical record, its sha256 and its row: pure, so it may be done before any lock is taken. */
export function runToStore(
  prepared: EvaluatedRun,
  entries: readonly RunRecordEntry[],
  { actor, jobNumber, inputs, unitSystem, parentRunId, purpose }: RunRowOptions,
): RunToStore {
  const { job, version } = prepared;
  const id = randomUUID();
  const createdAt = new Date();
  const base = {
    format: RUN_RECORD_FORMAT,
    id,
    createdAt: createdAt.toISOString(),
    createdBy: { id: actor.id, name: actor.name },
    job: { id: job.id, number: jobNumber, name: job.name },
    standard: {
      slug: version.slug,
      title: version.title,
      versionId: version.id,
      number: version.number,
      contentHash: version.contentHash,
    },
    purpose,
    parentRunId,
    unitSystem,
    typed: inputs,
    identity: prepared.identity,
    libraries: entries,
    order: prepared.order,
  } as const;
  const text =
    prepared.outcome === "succeeded"
      ? runRecordTextOfParts({ ...base, outcome: "succeeded" }, prepared)
      : runRecordText({ ...base, outcome: "failed", failure: prepared.failure });
  const sha256 = createHash("sha256").update(text, "utf8").digest("hex");
  const pass = prepared.outcome === "succeeded" ? prepared.evaluation.pass : null;
  return {
    row: {
      id,
      jobId: job.id,
      versionId: version.id,
      outcome: prepared.outcome,
      pass,
      maxUtilisation: prepared.outcome === "succeeded" ? maxUtilisationOf(prepared.evaluation) : null,
      purpose,
      parentRunId,
      unitSystem,
      record: text,
      recordSha256: sha256,
      recordBytes: Buffer.byteLength(text, "utf8"),
      createdById: actor.id,
      createdAt,
    },
    entries: entries.map((e) => ({ inputKey: e.input, entryId: e.entryId, entryHash: e.entryHash })),
    title: version.title,
    stored: {
      id,
      outcome: prepared.outcome,
      pass,
      sha256,
      jobNumber,
      slug: version.slug,
      number: version.number,
      ...(prepared.outcome === "failed" ? { message: prepared.failure.message } : {}),
    },
  };
}

/**
 * Writes the run's record and its library entries, in the caller's transaction (a batch re-run). The caller holds the
 * job's lock and has re-checked what may have changed since the evaluation (job closed, version withdrawn).
 */
export async function storeRun(prepared: EvaluatedRun, options: RunRowOptions): Promise<StoredRun> {
  const { row, entries, stored } = runToStore(prepared, await entriesOfRun(prepared), options);
  await insertRun(row);
  await insertRunLibraryEntries(entries.map((e) => ({ runId: row.id, ...e })));
  return stored;
}
