/**
 * A stored run evaluated again, compared with its record. The record's output parts — the evaluation and the
 * engine's result (each without the identity it names), or a failed run's failure — are compared byte for byte as
 * canonical JSON (RFC 8785), which is how they were stored; the identity (engine, evaluation) is compared on its own.
 * Each output a person reads (derived values, extracts, check utilisations) is listed with the stored and the
 * new value and their relative difference, so a reproduction with today's bundle shows what moved and by how much.
 */
import canonicalize from "canonicalize";
import { compareRuns, type ComparedValue } from "./compare-runs";
import { runFailureOf, type RunRecord } from "./run-record";
import type { Evaluation, EvaluationOutcome } from "./evaluate";
import type { Json } from "@/lib/engine";

/** What evaluating the record's version and inputs again gave (the bundle's `run` task, protocol.ts). */
export type Reevaluation =
  | {
      readonly ok: true;
      readonly outcome: EvaluationOutcome;
      readonly evaluationJson: string | null;
      readonly analysisJson: string | null;
    }
  /** The version did not compile: a problem per line, as the bundle reports them. */
  | { readonly ok: false; readonly problems: ReadonlyArray<{ readonly message: string }> };

export type ReproducedOutput = ComparedValue & { readonly group: "derived" | "extract" | "utilisation" };

export type ReproductionComparison = {
  /** Every output part came out byte for byte as stored, and so did the identity. */
  readonly identical: boolean;
  /** The output parts, each byte-identical or not (the identity is not an output). */
  readonly parts: ReadonlyArray<{ readonly part: "evaluation" | "analysis" | "failure"; readonly identical: boolean }>;
  /** The engine and evaluation that made the new outputs, and whether they are the record's. */
  readonly identity: { readonly engine: string; readonly evaluation: string; readonly same: boolean } | null;
  readonly outputs: ReadonlyArray<ReproducedOutput>;
  /** How many of `outputs` differ. */
  readonly differing: number;
  /** Set when the evaluation itself went otherwise than the record's (failed where it succeeded, or did not compile). */
  readonly note: string | null;
};

const canonical = (value: unknown): string => {
  const text = canonicalize(value);
  if (text === undefined) throw new Error("reproduction: a part has no JSON form");
  return text;
};

/** The evaluation without its identity: what the numbers are, whoever computed them. */
const withoutIdentity = (evaluation: Evaluation) => ({ ...evaluation, identity: null });

const isObject = (value: unknown): value is Record<string, Json> =>
  typeof value === "object" && value !== null && !Array.isArray(value);

/** The engine's result without the engine's version and source hash it carries (the identity is compared on its own). */
const withoutEngineIdentity = (analysis: Json): Json =>
  isObject(analysis) ? { ...analysis, engineVersion: null, engineSourceHash: null } : analysis;

/** The outputs of two records of one run, listed for the page (inputs are the same by construction). */
function outputsOf(stored: RunRecord, again: RunRecord): ReproducedOutput[] {
  const compared = compareRuns(stored, again);
  return [
    ...compared.derived.map((value) => ({ ...value, group: "derived" as const })),
    ...compared.extracts.map((value) => ({ ...value, group: "extract" as const })),
    ...compared.utilisations.map((value) => ({ ...value, group: "utilisation" as const })),
  ];
}

export function compareReproduction(stored: RunRecord, again: Reevaluation): ReproductionComparison {
  const differing = (outputs: ReproducedOutput[]) => outputs.filter((output) => output.changed).length;
  if (!again.ok) {
    const outputs = stored.outcome === "succeeded" ? outputsOf(stored, { ...stored, outcome: "failed", failure: noResult }) : [];
    return {
      identical: false,
      parts: [{ part: stored.outcome === "succeeded" ? "evaluation" : "failure", identical: false }],
      identity: null,
      outputs,
      differing: differing(outputs),
      note: `The version did not compile: ${again.problems[0]?.message ?? "no reason given"}.`,
    };
  }
  const { outcome } = again;
  if (stored.outcome === "failed") {
    if (outcome.ok)
      return {
        identical: false,
        parts: [{ part: "failure", identical: false }],
        identity: identityOf(stored, outcome.evaluation.identity),
        outputs: [],
        differing: 0,
        note: "The run failed when it was made; evaluated again, it succeeds.",
      };
    const same = outcome.stage !== "inputs" && canonical(runFailureOf(outcome)) === canonical(stored.failure);
    return {
      identical: same,
      parts: [{ part: "failure", identical: same }],
      identity: null,
      outputs: [],
      differing: 0,
      note: same ? null : "The run failed when it was made; evaluated again, it fails otherwise.",
    };
  }
  if (!outcome.ok || again.evaluationJson === null || again.analysisJson === null) {
    const outputs = outputsOf(stored, { ...stored, outcome: "failed", failure: noResult });
    return {
      identical: false,
      parts: [
        { part: "evaluation", identical: false },
        { part: "analysis", identical: false },
      ],
      identity: null,
      outputs,
      differing: differing(outputs),
      note: `The run succeeded when it was made; evaluated again, it fails${outcome.ok ? "" : ` (${outcome.stage})`}.`,
    };
  }
  const evaluation = JSON.parse(again.evaluationJson) as Evaluation;
  // A gusset-run/1 record holds the diagram extremes, which today's bundle no longer writes (run-record.ts): the
  // engine's result is then compared on what both hold, and the page says so. The bundle that made the record
  // writes them, so a reproduction as issued still compares every byte.
  const analysis = JSON.parse(again.analysisJson) as Json;
  const narrower = holdsDiagramExtremes(stored.analysis) && !holdsDiagramExtremes(analysis);
  const storedAnalysis = narrower ? withoutDiagramExtremes(stored.analysis) : stored.analysis;
  const parts = [
    {
      part: "evaluation" as const,
      identical: canonical(withoutIdentity(evaluation)) === canonical(withoutIdentity(stored.evaluation)),
    },
    // The engine's result names the engine that made it, like the evaluation: compared without it, byte for byte.
    {
      part: "analysis" as const,
      identical: canonical(withoutEngineIdentity(analysis)) === canonical(withoutEngineIdentity(storedAnalysis)),
    },
  ];
  const identity = identityOf(stored, evaluation.identity);
  const outputs = outputsOf(stored, { ...stored, evaluation });
  return {
    identical: parts.every((p) => p.identical) && identity.same,
    parts,
    identity,
    outputs,
    differing: differing(outputs),
    note: narrower
      ? "The record also holds each member's diagram extremes, which this bundle no longer stores (they are drawn again from the end forces); the engine's result is compared without them."
      : null,
  };
}

const CASE_GROUPS = ["loadCases", "combinations", "envelopes"] as const;

/** Does a stored engine result (resultToJson) hold diagram extremes for any case, combination or envelope? */
export function holdsDiagramExtremes(analysis: Json): boolean {
  if (!isObject(analysis)) return false;
  return CASE_GROUPS.some((group) => {
    const cases = analysis[group];
    return isObject(cases) && Object.values(cases).some((c) => isObject(c) && Object.hasOwn(c, "diagramExtremes"));
  });
}

/** The engine's result without its diagram extremes: what a gusset-run/2 record keeps of it. */
export function withoutDiagramExtremes(analysis: Json): Json {
  if (!isObject(analysis)) return analysis;
  const out: Record<string, Json> = { ...analysis };
  for (const group of CASE_GROUPS) {
    const cases = analysis[group];
    if (!isObject(cases)) continue;
    out[group] = Object.fromEntries(
      Object.entries(cases).map(([id, c]) => {
        if (!isObject(c)) return [id, c];
        const { diagramExtremes: _dropped, ...rest } = c;
        return [id, rest];
      }),
    );
  }
  return out;
}

/** A stand-in record failure for a reproduction that gave no results: every output of the stored run differs. */
const noResult = { stage: "definition", message: "no result", details: [] } as const;

function identityOf(stored: RunRecord, found: Evaluation["identity"]): { engine: string; evaluation: string; same: boolean } {
  const recorded = stored.identity;
  return {
    engine: `${found.engine}+${found.engineSourceHash.slice(0, 12)}`,
    evaluation: found.evaluation,
    same:
      found.engine === recorded.engine &&
      found.engineSourceHash === recorded.engineSourceHash &&
      found.evaluation === recorded.evaluation,
  };
}
