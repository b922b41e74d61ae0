/**
 * The pipeline: validate → prepare members and DOFs → assemble K once → factor once → for each load case:
 * loads, right-hand side, solve, recover → combinations → envelopes. Returns data, never throws for a bad
 * model, and never lets NaN or Infinity out.
 */
import { validateModel } from "./validate";
import { resolveCaseLoads, type CaseLoads } from "./loads";
import { assembleStiffness, caseFixedEndForces, casePrescribed, caseRhs, prepareMembers, rotationalStiffness } from "./assembly";
import { buildDofMap, DofKind, globalDof, RZ } from "./dofs";
import { factorStiffness, relativeResidual } from "./solve";
import { appliedNodalLoads, equilibriumResidual, fullDisplacements, recoverForces, type CaseResult, type CaseVectors } from "./results";
import { combineCases, envelopeResults, type EnvelopeResult } from "./combinations";
import { unstableError, type EngineError, type EngineWarning } from "./diagnostics";
import { attachContext } from "./context";
import { ENGINE_VERSION } from "./version";
import type { AnalysisOutcome, AnalysisResult } from "./analysis-types";
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
  // A moment applied where nothing resists rotation cannot be carried: name the node.
  for (const loads of caseLoads) {
    for (let n = 0; n < model.nodes.length; n++) {
      if (dofs.kind[globalDof(n, RZ)] === DofKind.NoStiffness && loads.nodal[globalDof(n, RZ)] !== 0) {
        return { ok: false, errors: [unstableError(model.nodes[n].id, "rz")] };
      }
    }
  }
  const K: SymmetricCsc | null = dofs.nFree > 0 ? assembleStiffness(members, dofs) : null;
  // Finite inputs can still overflow (E = 1e300): stop here with a message rather than let NaN spread.
  if (K && !allFinite(K.values)) {
    return { ok: false, errors: [{ kind: "numerical", message: "The stiffness matrix overflows; check the magnitudes of E, A, I and spring stiffnesses (SI units: Pa, m², m⁴)" }] };
  }
  const tAssembled = performance.now();

  let factor: CholeskyFactor | null = null;
  let factorStats = { orderingMs: 0, symbolicMs: 0, numericMs: 0, nnzL: 0 };
  if (K) {
    const f = factorStiffness(model, K, dofs);
    if (!f.ok) return { ok: false, errors: [f.error] };
    factor = f.factor;
    factorStats = f.stats;
  }
  const tFactored = performance.now();

  const vectors: CaseVectors[] = [];
  const solutions: { u: Float64Array; D2: Float64Array | null; residual: number }[] = [];
  const errors: EngineError[] = [];
  model.loadCases.forEach((lc, c) => {
    const fef = caseFixedEndForces(members, caseLoads[c]);
    const D2 = casePrescribed(model, dofs, lc.id);
    const rhs = caseRhs(members, dofs, caseLoads[c], fef, D2);
    if (!allFinite(rhs) || !allFinite(fef)) {
      errors.push({ kind: "numerical", message: `Load case ${lc.id}: the loads overflow; check their magnitudes (SI units: N, N/m, N·m)` });
      return;
    }
    const u = factor ? factor.solve(rhs) : new Float64Array(0);
    if (!allFinite(u)) errors.push({ kind: "numerical", message: `Load case ${lc.id}: the solution is not finite; check for extreme stiffness ratios` });
    const residual = K ? relativeResidual(K, u, rhs) : 0;
    vectors.push({ applied: appliedNodalLoads(members, caseLoads[c].nodal, fef, caseLoads[c].span.keys()), fef, rhs });
    solutions.push({ u, D2, residual });
  });
  if (errors.length > 0) return { ok: false, errors };
  const tSolved = performance.now();

  const warnings: EngineWarning[] = [];
  const cases: CaseResult[] = model.loadCases.map((lc, c) => {
    const { u, D2, residual } = solutions[c];
    const D = fullDisplacements(dofs, u, D2);
    const { endForces, reactions } = recoverForces(members, dofs, D, vectors[c].fef, caseLoads[c].nodal);
    if (residual > RESIDUAL_WARNING) {
      warnings.push({ kind: "ill-conditioned", loadCase: lc.id, relativeResidual: residual, message: `Load case ${lc.id}: relative residual ${residual.toExponential(2)}; the structure may be nearly a mechanism` });
    }
    return {
      id: lc.id,
      kind: "load-case",
      sources: [{ caseIndex: c, caseId: lc.id, factor: 1 }],
      displacements: D,
      reactions,
      endForces,
      equilibrium: equilibriumResidual(model, vectors[c].applied, reactions),
      relativeResidual: residual,
    };
  });
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
  attachContext(result, {
    model,
    members,
    memberIndex: index.member,
    nodeIndex: index.node,
    caseLoads,
    caseFef: vectors.map((v) => v.fef),
  });
  return { ok: true, result };
}
