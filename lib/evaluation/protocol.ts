/**
 * The messages between a caller and the evaluation bundle (entry.ts), whether it runs in a Node worker thread
 * (pool.ts) or a browser module Worker. Plain data only, so structured clone carries them unchanged.
 */
import type { EvaluationOutcome, SourceProblem } from "@/lib/standards";
import type { LibraryEntries } from "@/lib/standards/library-inputs";
import type { VerificationResult } from "@/lib/standards/verify";

/** `libraries`: the entries the standard's section and material inputs may name (library-inputs.ts). */
export type EvaluationRequest =
  | { readonly id: number; readonly task: "compile"; readonly source: string; readonly libraries?: LibraryEntries }
  | {
      readonly id: number;
      readonly task: "evaluate";
      readonly source: string;
      readonly inputs?: Readonly<Record<string, string | number>>;
      readonly libraries?: LibraryEntries;
    }
  | { readonly id: number; readonly task: "verify"; readonly source: string; readonly libraries?: LibraryEntries }
  | {
      readonly id: number;
      readonly task: "run";
      readonly source: string;
      readonly inputs?: Readonly<Record<string, string | number>>;
      readonly libraries?: LibraryEntries;
    };

export type EvaluationTask = EvaluationRequest["task"];

/**
 * A task that only exists to test how the pool handles a worker that dies under a task (timeouts and memory are
 * tested with real standards). The bundle answers them only when the
 * worker was started with `workerData.testHooks === true`, which nothing but a test sets (a browser Worker has
 * no workerData at all), so no production message can reach them.
 */
export type TestHookRequest = { readonly id: number; readonly task: "test-exit" };

/** What a standard's definition says about itself, for lists and forms, without the whole definition. */
export interface DefinitionSummary {
  readonly title: string;
  readonly category: string;
  readonly tags: ReadonlyArray<string>;
  readonly summary: string;
  readonly inputs: ReadonlyArray<{
    readonly key: string;
    readonly label: string;
    readonly quantity: string;
    readonly unit?: string;
  }>;
  readonly derived: ReadonlyArray<string>;
  readonly extracts: ReadonlyArray<string>;
  readonly checks: ReadonlyArray<string>;
  readonly verificationCases: number;
}

export type CompileResult =
  { readonly ok: true; readonly summary: DefinitionSummary } | { readonly ok: false; readonly problems: SourceProblem[] };

export type EvaluateResult =
  | { readonly ok: true; readonly outcome: EvaluationOutcome; readonly canonicalJson: string | null }
  | { readonly ok: false; readonly problems: SourceProblem[] };

/**
 * A run's evaluation, as a run's record keeps it: the evaluation's canonical text and the engine's result as
 * canonical JSON (resultToJson), from which the run's diagrams are drawn again later (restoreResult).
 */
export type RunResult =
  | {
      readonly ok: true;
      readonly outcome: EvaluationOutcome;
      readonly evaluationJson: string | null;
      readonly analysisJson: string | null;
    }
  | { readonly ok: false; readonly problems: SourceProblem[] };

export type VerifyResult =
  | { readonly ok: true; readonly results: ReadonlyArray<VerificationResult> }
  | { readonly ok: false; readonly problems: SourceProblem[] };

export interface TaskResults {
  readonly compile: CompileResult;
  readonly evaluate: EvaluateResult;
  readonly verify: VerifyResult;
  readonly run: RunResult;
}

/** The bundle's answer: `ok: false` only when the task itself threw (a bug, not a problem in the standard). */
export type EvaluationResponse =
  | { readonly id: number; readonly ok: true; readonly result: TaskResults[EvaluationTask] }
  | { readonly id: number; readonly ok: false; readonly error: string };

/** Sent once by a Node worker when the bundle has loaded, so a task's timeout does not include the start-up. */
export const READY_MESSAGE = "evaluation-worker-ready";
