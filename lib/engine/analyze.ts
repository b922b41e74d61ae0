/**
 * The pipeline: validate → prepare members, DOFs and loads → assemble K once → factor once → for each load case:
 * right-hand side, solve, recover → combinations → envelopes. Returns data, never throws for a bad model, and
 * never lets NaN or Infinity out. Stage times come back beside the result (`timings`), never inside it.
 */
import { validateModel, type ValidModel } from "./validate";
import type { CaseLoads } from "./loads";
import { rotationalStiffness } from "./members";
import { assembleStiffness } from "./stiffness";
import { appliedNodalLoads, caseFixedEndForces, casePrescribed, caseRhs } from "./load-vector";
import { buildDofMap, DofKind, globalDof, RZ, type DofMap } from "./dofs";
import { factorStiffness, relativeResidual } from "./solve";
import { rigidBodyMotions } from "./rigid-body";
import { equilibriumResidual, fullDisplacements, recoverForces, type CaseResult, type CaseVectors } from "./results";
import { combineCases, envelopeResults, type EnvelopeResult } from "./combinations";
import { unstableError, type EngineError, type EngineWarning } from "./diagnostics";
import { attachContext, modelContext, type AnalysisContext } from "./context";
import { deepFreeze } from "./freeze";
import { ENGINE_IDENTITY } from "./version";
import type { AnalysisOutcome, AnalysisResult } from "./analysis-types";
import type { Model } from "./model";
import type { CholeskyFactor, SymmetricCsc } from "./sparse";

/** Relative solver residual above which a result is flagged as ill-conditioned. */
const RESIDUAL_WARNING = 1e-6;

function allFinite(v: ArrayLike<number>): boolean {
  for (let i = 0; i < v.length; i++) if (!Number.isFinite(v[i])) return false;
  return true;
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

interface Stiffness {
  readonly ctx: AnalysisContext;
  readonly dofs: DofMap;
  /** K over the free equations; null when nothing is free. */
  readonly K: SymmetricCsc | null;
}

/** Members, DOF numbering, loads and K of a valid model. */
function stiffnessOf(valid: ValidModel): Stiffness | EngineError {
  const ctx = modelContext(valid);
  const { model, members } = ctx;
  const dofs = buildDofMap(model, rotationalStiffness(model, members));
  const pinnedMoment = momentOnPinnedNode(model, dofs, ctx.caseLoads);
  if (pinnedMoment) return pinnedMoment;
  const K = dofs.nFree > 0 ? assembleStiffness(members, dofs) : null;
  // Finite inputs can still overflow (E = 1e300): stop here with a message rather than let NaN spread.
  if (K && !allFinite(K.values)) {
    return {
      kind: "numerical",
      message: "The stiffness matrix overflows; check the magnitudes of E, A, I and spring stiffnesses (SI units: Pa, m², m⁴)",
    };
  }
  return { ctx, dofs, K };
}

interface CaseSystem {
  readonly id: string;
  readonly D2: Float64Array | null;
  readonly vectors: CaseVectors;
}

/** Fixed-end forces, prescribed displacements, applied loads and right-hand side of every load case. */
function caseSystems({ ctx, dofs }: Stiffness): CaseSystem[] | EngineError {
  const { model, members, caseLoads } = ctx;
  const out: CaseSystem[] = [];
  for (let c = 0; c < model.loadCases.length; c++) {
    const id = model.loadCases[c].id;
    const loads = caseLoads[c];
    const fef = caseFixedEndForces(members, loads);
    const D2 = casePrescribed(model, dofs, id);
    const applied = appliedNodalLoads(members, loads, fef);
    const rhs = caseRhs(members, dofs, applied, D2);
    if (!allFinite(rhs) || !allFinite(fef)) {
      return {
        kind: "numerical",
        message: `Load case ${id}: the loads overflow; check their magnitudes (SI units: N, N/m, N·m)`,
      };
    }
    out.push({ id, D2, vectors: { applied, fef, rhs } });
  }
  return out;
}

interface SolvedCase {
  readonly u: Float64Array;
  readonly D2: Float64Array | null;
  readonly residual: number;
  readonly vectors: CaseVectors;
}

/** Solutions and solver residuals of every load case: the factor is shared, and all cases are solved in one pass over it. */
function solveCases(
  systems: ReadonlyArray<CaseSystem>,
  K: SymmetricCsc | null,
  factor: CholeskyFactor | null,
): SolvedCase[] | EngineError {
  const us = factor ? factor.solveMany(systems.map((p) => p.vectors.rhs)) : systems.map(() => new Float64Array(0));
  const solved: SolvedCase[] = [];
  for (let c = 0; c < systems.length; c++) {
    const { id, D2, vectors } = systems[c];
    const u = us[c];
    if (!allFinite(u))
      return { kind: "numerical", message: `Load case ${id}: the solution is not finite; check for extreme stiffness ratios` };
    const residual = K ? relativeResidual(K, u, vectors.rhs) : 0;
    solved.push({ u, D2, residual, vectors });
  }
  return solved;
}

/** Displacements, end forces, reactions and checks of one solved load case. */
function recoverCase(ctx: AnalysisContext, c: number, dofs: DofMap, solved: SolvedCase): CaseResult {
  const { model, members } = ctx;
  const id = model.loadCases[c].id;
  const D = fullDisplacements(dofs, solved.u, solved.D2);
  const { endForces, reactions } = recoverForces(members, dofs, D, solved.vectors.fef, ctx.caseLoads[c].nodal);
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

export function analyze(input: unknown): AnalysisOutcome {
  const t0 = performance.now();
  const valid = validateModel(input);
  if (!valid.ok) return { ok: false, errors: valid.errors };
  const tValidated = performance.now();

  const stiffness = stiffnessOf(valid);
  if ("kind" in stiffness) return { ok: false, errors: [stiffness] };
  const { ctx, dofs, K } = stiffness;
  const { model } = ctx;
  const tAssembled = performance.now();

  // A structure the supports let move as a whole is said to be so, before a pivot fails at some node.
  const rigid = rigidBodyMotions(model, ctx.members);
  if (rigid.length > 0) return { ok: false, errors: rigid };

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

  const systems = caseSystems(stiffness);
  if (!Array.isArray(systems)) return { ok: false, errors: [systems] };
  const solved = solveCases(systems, K, factor);
  if (!Array.isArray(solved)) return { ok: false, errors: [solved] };
  const tSolved = performance.now();

  const cases = solved.map((s, c) => recoverCase(ctx, c, dofs, s));
  const warnings: EngineWarning[] = cases
    .filter((r) => r.relativeResidual > RESIDUAL_WARNING)
    .map((r) => ({
      kind: "ill-conditioned",
      loadCase: r.id,
      relativeResidual: r.relativeResidual,
      message: `Load case ${r.id}: relative residual ${r.relativeResidual.toExponential(2)}; the structure may be nearly a mechanism`,
    }));
  const vectors = solved.map((s) => s.vectors);
  const combos = model.combinations.map((combo) => combineCases(model, combo, cases, vectors, K, dofs));
  const byId = new Map([...cases, ...combos].map((r) => [r.id, r]));
  const envelopes: Record<string, EnvelopeResult> = {};
  for (const env of model.envelopes) envelopes[env.id] = envelopeResults(env, byId);
  for (const r of byId.values()) {
    if (!allFinite(r.displacements) || !allFinite(r.reactions) || !allFinite(r.endForces)) {
      return {
        ok: false,
        errors: [{ kind: "numerical", message: `Result ${r.id} is not finite; check for extreme stiffness ratios` }],
      };
    }
  }
  const tDone = performance.now();

  const result: AnalysisResult = {
    engineVersion: ENGINE_IDENTITY.version,
    engineSourceHash: ENGINE_IDENTITY.sourceHash,
    analysis: model.analysis,
    nodeIds: model.nodes.map((n) => n.id),
    memberIds: model.members.map((m) => m.id),
    loadCases: Object.fromEntries(cases.map((r) => [r.id, r])),
    combinations: Object.fromEntries(combos.map((r) => [r.id, r])),
    envelopes,
    warnings,
    stats: { nodes: model.nodes.length, members: model.members.length, equations: dofs.nFree, nnzL: factorStats.nnzL },
  };
  deepFreeze(result);
  attachContext(result, ctx);
  const timings = {
    validationMs: tValidated - t0,
    assemblyMs: tAssembled - tValidated,
    orderingMs: factorStats.orderingMs,
    symbolicMs: factorStats.symbolicMs,
    factorMs: factorStats.numericMs,
    solveMs: tSolved - tFactored,
    recoveryMs: tDone - tSolved,
    totalMs: tDone - t0,
  };
  return { ok: true, result, timings };
}

/** The assembled equations of a model: K over the free equations and one right-hand side per load case. */
export interface LinearSystem {
  /** Lower triangle of K in compressed columns; null when no equation is free. */
  readonly K: SymmetricCsc | null;
  /** P1 − FEF1 − K12·D2 of each load case, in model order. */
  readonly rhs: ReadonlyArray<Float64Array>;
  /** Free equations per node when uniform (the solver's block size), else 1. */
  readonly blockSize: number;
}

/**
 * The first stages of `analyze` alone (validate, prepare, assemble, right-hand sides), for benchmarks and
 * solver checks that want the equations without solving them. The same errors as `analyze` up to that point.
 */
export function linearSystem(
  input: unknown,
): { readonly ok: true; readonly system: LinearSystem } | { readonly ok: false; readonly errors: ReadonlyArray<EngineError> } {
  const valid = validateModel(input);
  if (!valid.ok) return { ok: false, errors: valid.errors };
  const stiffness = stiffnessOf(valid);
  if ("kind" in stiffness) return { ok: false, errors: [stiffness] };
  const systems = caseSystems(stiffness);
  if (!Array.isArray(systems)) return { ok: false, errors: [systems] };
  return { ok: true, system: { K: stiffness.K, rhs: systems.map((s) => s.vectors.rhs), blockSize: stiffness.dofs.blockSize } };
}
