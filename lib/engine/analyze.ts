/**
 * The pipeline: validate → prepare members and DOFs → assemble K once → factor once → for each load case:
 * loads, right-hand side, solve, recover → combinations → envelopes. Returns data, never throws for a bad
 * model, and never lets NaN or Infinity out.
 */
import { validateModel } from "./validate";
import { resolveCaseLoads, type CaseLoads } from "./loads";
import { assembleStiffness, caseFixedEndForces, casePrescribed, caseRhs, prepareMembers, rotationalStiffness, type PreparedMember } from "./assembly";
import { buildDofMap, DofKind, globalDof, RZ, type DofMap } from "./dofs";
import { factorStiffness, relativeResidual } from "./solve";
import { appliedNodalLoads, equilibriumResidual, fullDisplacements, recoverForces, type CaseResult, type CaseVectors } from "./results";
import { combineCases, envelopeResults, type EnvelopeResult } from "./combinations";
import { unstableError, type EngineError, type EngineWarning } from "./diagnostics";
import { attachContext } from "./context";
import { ENGINE_VERSION } from "./version";
import type { AnalysisOutcome, AnalysisResult } from "./analysis-types";
import type { Model } from "./model";
import type { CholeskyFactor, SymmetricCsc } from "./sparse";

/** Relative solver residual above which a result is flagged as ill-conditioned. */
const RESIDUAL_WARNING = 1e-6;

function allFinite(v: ArrayLike<number>): boolean {
  for (let i = 0; i < v.length; i++) if (!Number.isFinite(v[i])) return false;
  return true;
}

function deepFreeze<T>(value: T): T {
  if (value && typeof value === "object" && !ArrayBuffer.isView(value) && !Object.isFrozen(value)) {
    Object.freeze(value);
    for (const v of Object.values(value)) deepFreeze(v);
  }
  return value;
}

interface SolvedCase {
  readonly u: Float64Array;
  readonly D2: Float64Array | null;
  readonly residual: number;
  readonly vectors: CaseVectors;
}

/**
 * Right-hand sides, solutions and solver residuals of every load case. The factor is shared, and all cases
 * are solved in one pass over it.
 */
function solveCases(model: Model, members: ReadonlyArray<PreparedMember>, dofs: DofMap, caseLoads: ReadonlyArray<CaseLoads>, K: SymmetricCsc | null, factor: CholeskyFactor | null): SolvedCase[] | EngineError {
  const parts = [];
  for (let c = 0; c < model.loadCases.length; c++) {
    const id = model.loadCases[c].id;
    const loads = caseLoads[c];
    const fef = caseFixedEndForces(members, loads);
    const D2 = casePrescribed(model, dofs, id);
    const applied = appliedNodalLoads(members, loads, fef);
    const rhs = caseRhs(members, dofs, applied, D2);
    if (!allFinite(rhs) || !allFinite(fef)) {
      return { kind: "numerical", message: `Load case ${id}: the loads overflow; check their magnitudes (SI units: N, N/m, N·m)` };
    }
    parts.push({ id, fef, D2, rhs, applied });
  }
  const us = factor ? factor.solveMany(parts.map((p) => p.rhs)) : parts.map(() => new Float64Array(0));
  const solved: SolvedCase[] = [];
  for (let c = 0; c < parts.length; c++) {
    const { id, fef, D2, rhs, applied } = parts[c];
    const u = us[c];
    if (!allFinite(u)) return { kind: "numerical", message: `Load case ${id}: the solution is not finite; check for extreme stiffness ratios` };
    const residual = K ? relativeResidual(K, u, rhs) : 0;
    solved.push({ u, D2, residual, vectors: { applied, fef, rhs } });
  }
  return solved;
}

/** Displacements, end forces, reactions and checks of one solved load case. */
function recoverCase(model: Model, c: number, members: ReadonlyArray<PreparedMember>, dofs: DofMap, loads: CaseLoads, solved: SolvedCase): CaseResult {
  const id = model.loadCases[c].id;
  const D = fullDisplacements(dofs, solved.u, solved.D2);
  const { endForces, reactions } = recoverForces(members, dofs, D, solved.vectors.fef, loads.nodal);
  return {
    id,
    kind: "load-case",
    sources: [{ caseIndex: c, caseId: id, factor: 1 }],
    displacements: D,
    reactions,
    endForces,
    equilibrium: equilibriumResidual(model, solved.vectors.applied, reactions),
    relativeResidual: solved.residual,
  };
}

/** A moment applied where nothing resists rotation cannot be carried: name the node. */
function momentOnPinnedNode(model: Model, dofs: DofMap, caseLoads: ReadonlyArray<CaseLoads>): EngineError | null {
  for (const loads of caseLoads) {
    for (let n = 0; n < model.nodes.length; n++) {
      const g = globalDof(n, RZ);
      if (dofs.kind[g] === DofKind.NoStiffness && loads.nodal[g] !== 0) return unstableError(model.nodes[n].id, "rz");
    }
  }
  return null;
}

export function analyze(input: unknown): AnalysisOutcome {
  const t0 = performance.now();
  const valid = validateModel(input);
  if (!valid.ok) return { ok: false, errors: valid.errors };
  const model = valid.model;
  const tValidated = performance.now();

  const index = { node: valid.nodeIndex, member: valid.memberIndex };
  const members = prepareMembers(valid);
  const dofs = buildDofMap(model, rotationalStiffness(model, members));
  const frames = members.map((p) => p.frame);
  const caseLoads: CaseLoads[] = model.loadCases.map((_, c) => resolveCaseLoads(model, c, frames, index));
  const pinnedMoment = momentOnPinnedNode(model, dofs, caseLoads);
  if (pinnedMoment) return { ok: false, errors: [pinnedMoment] };
  const K: SymmetricCsc | null = dofs.nFree > 0 ? assembleStiffness(members, dofs) : null;
  // Finite inputs can still overflow (E = 1e300): stop here with a message rather than let NaN spread.
  if (K && !allFinite(K.values)) {
    return { ok: false, errors: [{ kind: "numerical", message: "The stiffness matrix overflows; check the magnitudes of E, A, I and spring stiffnesses (SI units: Pa, m², m⁴)" }] };
  }
  const tAssembled = performance.now();

  // K is factored once; every load case reuses the factor.
  let factor: CholeskyFactor | null = null;
  let factorStats = { orderingMs: 0, symbolicMs: 0, numericMs: 0, nnzL: 0 };
  if (K) {
    const f = factorStiffness(model, K, dofs);
    if (!f.ok) return { ok: false, errors: [f.error] };
    factor = f.factor;
    factorStats = f.stats;
  }
  const tFactored = performance.now();

  const solved = solveCases(model, members, dofs, caseLoads, K, factor);
  if (!Array.isArray(solved)) return { ok: false, errors: [solved] };
  const tSolved = performance.now();

  const cases = solved.map((s, c) => recoverCase(model, c, members, dofs, caseLoads[c], s));
  const warnings: EngineWarning[] = cases
    .filter((r) => r.relativeResidual > RESIDUAL_WARNING)
    .map((r) => ({ kind: "ill-conditioned", loadCase: r.id, relativeResidual: r.relativeResidual, message: `Load case ${r.id}: relative residual ${r.relativeResidual.toExponential(2)}; the structure may be nearly a mechanism` }));
  const vectors = solved.map((s) => s.vectors);
  const combos = model.combinations.map((combo) => combineCases(model, combo, cases, vectors, K, dofs));
  const byId = new Map([...cases, ...combos].map((r) => [r.id, r]));
  const envelopes: Record<string, EnvelopeResult> = {};
  for (const env of model.envelopes) envelopes[env.id] = envelopeResults(env, byId);
  for (const r of byId.values()) {
    if (!allFinite(r.displacements) || !allFinite(r.reactions) || !allFinite(r.endForces)) {
      return { ok: false, errors: [{ kind: "numerical", message: `Result ${r.id} is not finite; check for extreme stiffness ratios` }] };
    }
  }
  const tDone = performance.now();

  const result: AnalysisResult = {
    engineVersion: ENGINE_VERSION,
    analysis: model.analysis,
    nodeIds: model.nodes.map((n) => n.id),
    memberIds: model.members.map((m) => m.id),
    loadCases: Object.fromEntries(cases.map((r) => [r.id, r])),
    combinations: Object.fromEntries(combos.map((r) => [r.id, r])),
    envelopes,
    warnings,
    stats: {
      nodes: model.nodes.length,
      members: model.members.length,
      equations: dofs.nFree,
      nnzL: factorStats.nnzL,
      validationMs: tValidated - t0,
      assemblyMs: tAssembled - tValidated,
      orderingMs: factorStats.orderingMs,
      symbolicMs: factorStats.symbolicMs,
      factorMs: factorStats.numericMs,
      solveMs: tSolved - tFactored,
      recoveryMs: tDone - tSolved,
      totalMs: tDone - t0,
    },
  };
  deepFreeze(result);
  attachContext(result, { model, members, memberIndex: index.member, nodeIndex: index.node, caseLoads });
  return { ok: true, result };
}
