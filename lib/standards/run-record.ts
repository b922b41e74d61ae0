/**
 * A run's record: everything needed to trace, show and reproduce one evaluation of a published version, as one
 * JSON document in its canonical form (RFC 8785), stored as the very text that was hashed. Who ran what, where
 * and when; the version by id, number and content hash; the engine, evaluation and bundle that produced it;
 * the inputs as typed and in SI; derived values, extracts, checks, assumptions and the equilibrium residual;
 * the model and the engine's result (so diagrams are drawn again from the record alone, restoreResult); the
 * library entries used with their hashes. A run that failed keeps its failure instead of results.
 */
import canonicalize from "canonicalize";
import type { EngineError, Json } from "@/lib/engine";
import type { Evaluation, EvaluationFailure } from "./evaluate";

/**
 * The format new runs are written in. gusset-run/2 keeps the engine's result without its diagram extremes (the largest
 * and smallest N, V, M and deflection along each member, per case and per envelope): they are drawn again from the
 * end forces and the model (restoreResult, memberDiagram), like the diagrams themselves, and were two thirds of a
 * large frame's record. gusset-run/1 records hold them; they are read as written, and reproduced as written.
 */
export const RUN_RECORD_FORMAT = "gusset-run/2";
/** Every format a stored record may be in, oldest first. */
export const RUN_RECORD_FORMATS = ["gusset-run/1", RUN_RECORD_FORMAT] as const;
export type RunRecordFormat = (typeof RUN_RECORD_FORMATS)[number];

export interface RunRecordIdentity {
  readonly engine: string;
  readonly engineSourceHash: string;
  readonly evaluation: string;
  /** sha256 of the evaluation bundle that ran it: the bytes a reproduction "as issued" runs again. */
  readonly bundleSha256: string;
}

export interface RunRecordEntry {
  readonly input: string;
  readonly library: string;
  readonly version: number;
  readonly contentHash: string;
  readonly key: string;
  readonly entryId: string;
  readonly entryHash: string;
}

interface RunRecordBase {
  readonly format: RunRecordFormat;
  readonly id: string;
  readonly createdAt: string;
  readonly createdBy: { readonly id: string; readonly name: string };
  readonly job: { readonly id: string; readonly number: string; readonly name: string };
  readonly standard: {
    readonly slug: string;
    readonly title: string;
    readonly versionId: string;
    readonly number: number;
    readonly contentHash: string;
  };
  readonly purpose: "design" | "remediation";
  readonly parentRunId: string | null;
  readonly unitSystem: "si" | "us";
  /** The inputs the person gave, as typed; the others took the version's defaults (see evaluation.inputs). */
  readonly typed: Readonly<Record<string, string | number>>;
  readonly identity: RunRecordIdentity;
  readonly libraries: ReadonlyArray<RunRecordEntry>;
  /** The order the version's definition lists them in (canonical JSON sorts object keys), for showing them. */
  readonly order: {
    readonly inputs: ReadonlyArray<string>;
    readonly derived: ReadonlyArray<string>;
    readonly extracts: ReadonlyArray<string>;
    readonly checks: ReadonlyArray<string>;
  };
}

export type RunRecord =
  | (RunRecordBase & { readonly outcome: "succeeded"; readonly evaluation: Evaluation; readonly analysis: Json })
  | (RunRecordBase & { readonly outcome: "failed"; readonly failure: RunFailure });

/** A failure as a person reads it: which stage, one sentence, and the engine's or the definition's details. */
export interface RunFailure {
  readonly stage: "engine" | "definition";
  readonly message: string;
  /** The engine's errors as it gave them (an unstable node names its node and direction), or where in the definition. */
  readonly details: ReadonlyArray<EngineError | { readonly kind: "definition"; readonly path: string; readonly message: string }>;
}

/** The failure of an evaluation that got past its inputs, in the record's words. */
export function runFailureOf(failure: Exclude<EvaluationFailure, { stage: "inputs" }>): RunFailure {
  if (failure.stage === "definition")
    return {
      stage: "definition",
      message: `The standard could not be evaluated with these inputs: ${failure.message}`,
      details: [{ kind: "definition", path: failure.path, message: failure.message }],
    };
  return {
    stage: "engine",
    message: `The frame engine could not analyse the model: ${failure.errors[0]?.message ?? "no reason given"}`,
    details: failure.errors,
  };
}

/** The record's canonical text (RFC 8785): the bytes stored and hashed. Refuses anything JSON cannot hold exactly. */
export function runRecordText(record: RunRecord): string {
  const text = canonicalize(record);
  if (text === undefined) throw new Error("runRecordText: the record has no JSON form");
  // canonicalize writes NaN and ±Infinity as null; a record must never carry one silently.
  if (containsNonFinite(record)) throw new Error("runRecordText: the record holds a number that is not finite");
  return text;
}

/**
 * As runRecordText, for a record that succeeded whose evaluation and engine result are already canonical JSON text
 * (the evaluation bundle writes both so): each text is spliced into its place instead of being parsed and written
 * again, which for a large frame is most of the record's bytes. Gives exactly runRecordText of the record with
 * `evaluation: JSON.parse(evaluationJson), analysis: JSON.parse(analysisJson)`. `evaluation` is the same evaluation
 * as an object (as the worker handed it over, non-finite numbers included), checked for numbers JSON cannot hold:
 * canonical JSON would have written them as null.
 */
export function runRecordTextOfParts(
  record: Omit<Extract<RunRecord, { outcome: "succeeded" }>, "analysis" | "evaluation">,
  parts: { evaluation: Evaluation; evaluationJson: string; analysisJson: string },
): string {
  if (containsNonFinite(parts.evaluation)) throw new Error("runRecordText: the record holds a number that is not finite");
  // Placeholders no record can hold otherwise (a NUL can never come from a person's input through the schemas, and
  // the nonce differs per call); canonicalize writes each as a JSON string, found once and replaced.
  const nonce = `${Math.random().toString(36).slice(2)}:${Date.now().toString(36)}`;
  const evaluation = `\u0000evaluation:${nonce}`;
  const analysis = `\u0000analysis:${nonce}`;
  let text = runRecordText({ ...record, evaluation, analysis } as unknown as RunRecord);
  for (const [placeholder, json] of [
    [evaluation, parts.evaluationJson],
    [analysis, parts.analysisJson],
  ] as const) {
    const quoted = JSON.stringify(placeholder);
    const at = text.indexOf(quoted);
    if (at < 0 || text.indexOf(quoted, at + quoted.length) >= 0)
      throw new Error("runRecordTextOfParts: a placeholder was not found exactly once");
    text = `${text.slice(0, at)}${json}${text.slice(at + quoted.length)}`;
  }
  return text;
}

function containsNonFinite(value: unknown): boolean {
  if (typeof value === "number") return !Number.isFinite(value);
  if (Array.isArray(value)) return value.some(containsNonFinite);
  if (value && typeof value === "object") return Object.values(value).some(containsNonFinite);
  return false;
}

/** A stored record read back. Checks the format only; the text is what was hashed, so it is trusted as written. */
export function readRunRecord(text: string): RunRecord {
  const parsed = JSON.parse(text) as { format?: unknown };
  if (!(RUN_RECORD_FORMATS as ReadonlyArray<unknown>).includes(parsed.format))
    throw new Error(`readRunRecord: not a run record (formats ${RUN_RECORD_FORMATS.join(", ")})`);
  return parsed as RunRecord;
}

/** A record's entries in the definition's order (any the order does not name follow, as stored). */
export function inOrder<T>(values: Readonly<Record<string, T>>, order: ReadonlyArray<string> | undefined): [string, T][] {
  const keys = [...(order ?? []).filter((key) => Object.hasOwn(values, key))];
  for (const key of Object.keys(values)) if (!keys.includes(key)) keys.push(key);
  return keys.map((key) => [key, values[key]]);
}

/** The largest utilisation among the checks, or null when there are none. */
export function maxUtilisationOf(evaluation: Evaluation): number | null {
  const values = Object.values(evaluation.checks).map((check) => check.utilisation);
  return values.length > 0 ? Math.max(...values) : null;
}
