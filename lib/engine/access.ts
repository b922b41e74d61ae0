/**
 * Reading results by id. Vectors in a result are indexed by model order; these helpers look ids up so
 * callers (templates, the CLI) never do index arithmetic themselves.
 */
import type { AnalysisResult } from "./analysis-types";
import type { CaseResult } from "./results";
import { globalDof } from "./dofs";

export interface NodeVector {
  readonly ux: number;
  readonly uy: number;
  readonly rz: number;
}

export interface NodeForce {
  readonly fx: number;
  readonly fy: number;
  readonly mz: number;
}

/** Local end forces in the stiffness convention (forces the nodes apply to the member). */
export interface MemberEndForces {
  readonly start: NodeForce;
  readonly end: NodeForce;
}

/** A load case or combination by id; throws for an unknown id (a programming error, not a model error). */
export function resultFor(result: AnalysisResult, id: string): CaseResult {
  const r = result.loadCases[id] ?? result.combinations[id];
  if (!r) throw new Error(`resultFor: no load case or combination "${id}"`);
  return r;
}

function indexOrThrow(ids: ReadonlyArray<string>, id: string, what: string): number {
  const i = ids.indexOf(id);
  if (i < 0) throw new Error(`no ${what} "${id}"`);
  return i;
}

export function nodeDisplacement(result: AnalysisResult, nodeId: string, caseOrCombo: string): NodeVector {
  const o = globalDof(indexOrThrow(result.nodeIds, nodeId, "node"), 0);
  const d = resultFor(result, caseOrCombo).displacements;
  return { ux: d[o], uy: d[o + 1], rz: d[o + 2] };
}

export function nodeReaction(result: AnalysisResult, nodeId: string, caseOrCombo: string): NodeForce {
  const o = globalDof(indexOrThrow(result.nodeIds, nodeId, "node"), 0);
  const r = resultFor(result, caseOrCombo).reactions;
  return { fx: r[o], fy: r[o + 1], mz: r[o + 2] };
}

export function memberEndForces(result: AnalysisResult, memberId: string, caseOrCombo: string): MemberEndForces {
  const o = 6 * indexOrThrow(result.memberIds, memberId, "member");
  const f = resultFor(result, caseOrCombo).endForces;
  return { start: { fx: f[o], fy: f[o + 1], mz: f[o + 2] }, end: { fx: f[o + 3], fy: f[o + 4], mz: f[o + 5] } };
}
