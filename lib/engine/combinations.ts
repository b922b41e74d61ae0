/**
 * Load combinations (named factor tables) and envelopes. The analysis is linear, so a combination is the
 * factored sum of its load cases' results: displacements, reactions and end forces are summed here, and
 * along members the diagrams sum the scaled span loads of each case (see diagrams.ts), so extremes of a
 * combination are found on the combined diagram, not by adding the cases' extremes.
 */
import type { Combination, Envelope, Model } from "./model";
import {
  equilibriumResidual,
  linearCombination,
  type CaseResult,
  type CaseVectors,
  type LoadSource,
  type ReadonlyVector,
} from "./results";
import { relativeResidual } from "./solve";
import type { DofMap } from "./dofs";
import type { SymmetricCsc } from "./sparse";

export function combineCases(
  model: Model,
  combo: Combination,
  cases: ReadonlyArray<CaseResult>,
  vectors: ReadonlyArray<CaseVectors>,
  K: SymmetricCsc | null,
  dofs: DofMap,
): CaseResult {
  const caseIndex = new Map(model.loadCases.map((c, i) => [c.id, i]));
  const sources: LoadSource[] = Object.entries(combo.factors).map(([id, factor]) => ({
    caseIndex: caseIndex.get(id)!,
    caseId: id,
    factor,
  }));
  const factors = sources.map((s) => s.factor);
  const pick = <T>(f: (i: number) => T) => sources.map((s) => f(s.caseIndex));
  const first = cases[0];
  const displacements = linearCombination(
    pick((i) => cases[i].displacements),
    factors,
    first?.displacements.length ?? 0,
  );
  const reactions = linearCombination(
    pick((i) => cases[i].reactions),
    factors,
    first?.reactions.length ?? 0,
  );
  const endForces = linearCombination(
    pick((i) => cases[i].endForces),
    factors,
    first?.endForces.length ?? 0,
  );
  const applied = linearCombination(
    pick((i) => vectors[i].applied),
    factors,
    displacements.length,
  );
  let residual = 0;
  if (K && dofs.nFree > 0) {
    const rhs = linearCombination(
      pick((i) => vectors[i].rhs),
      factors,
      dofs.nFree,
    );
    const u = new Float64Array(dofs.nFree);
    for (let e = 0; e < dofs.nFree; e++) u[e] = displacements[dofs.freeToGlobal[e]];
    residual = relativeResidual(K, u, rhs);
  }
  return {
    id: combo.id,
    kind: "combination",
    sources,
    displacements,
    reactions,
    endForces,
    equilibrium: equilibriumResidual(model, applied, reactions),
    relativeResidual: residual,
  };
}

export interface VectorEnvelope {
  readonly max: ReadonlyVector;
  readonly min: ReadonlyVector;
  /** Index into `of` of the result that governs each max / min. */
  readonly maxFrom: Readonly<Uint16Array>;
  readonly minFrom: Readonly<Uint16Array>;
}

export interface EnvelopeResult {
  readonly id: string;
  /** Ids of the load cases and combinations enveloped. */
  readonly of: ReadonlyArray<string>;
  readonly displacements: VectorEnvelope;
  readonly reactions: VectorEnvelope;
  readonly endForces: VectorEnvelope;
}

export function envelopeVectors(vectors: ReadonlyArray<ReadonlyVector>): VectorEnvelope {
  const n = vectors[0].length;
  const max = Float64Array.from(vectors[0]);
  const min = Float64Array.from(vectors[0]);
  const maxFrom = new Uint16Array(n);
  const minFrom = new Uint16Array(n);
  for (let r = 1; r < vectors.length; r++) {
    const v = vectors[r];
    for (let i = 0; i < n; i++) {
      if (v[i] > max[i]) {
        max[i] = v[i];
        maxFrom[i] = r;
      }
      if (v[i] < min[i]) {
        min[i] = v[i];
        minFrom[i] = r;
      }
    }
  }
  return { max, min, maxFrom, minFrom };
}

export function envelopeResults(envelope: Envelope, byId: ReadonlyMap<string, CaseResult>): EnvelopeResult {
  const results = envelope.of.map((id) => byId.get(id)!);
  return {
    id: envelope.id,
    of: envelope.of,
    displacements: envelopeVectors(results.map((r) => r.displacements)),
    reactions: envelopeVectors(results.map((r) => r.reactions)),
    endForces: envelopeVectors(results.map((r) => r.endForces)),
  };
}
