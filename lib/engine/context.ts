/**
 * What on-demand work (diagrams along members) needs besides a result: the members prepared, the loads of every
 * case resolved onto them, and the id lookups. All of it follows from the validated model alone
 * (`modelContext`), so a result read back from storage together with its model (`restoreResult`) gets the very
 * same context and draws the same diagrams as the process that analysed it. It is kept in a WeakMap keyed by
 * the result, so the result itself stays plain, immutable data.
 */
import type { Model } from "./model";
import type { IdLookup } from "./id-index";
import { prepareMembers, type PreparedMember } from "./members";
import { resolveCaseLoads, type CaseLoads } from "./loads";
import type { ValidModel } from "./validate";
import type { AnalysisResult } from "./analysis-types";

export interface AnalysisContext {
  readonly model: Model;
  readonly members: ReadonlyArray<PreparedMember>;
  readonly memberIndex: IdLookup;
  readonly nodeIndex: IdLookup;
  readonly caseLoads: ReadonlyArray<CaseLoads>;
}

/** Members prepared and loads resolved, from the validated model and nothing else. */
export function modelContext(valid: ValidModel): AnalysisContext {
  const { model } = valid;
  const members = prepareMembers(valid);
  const frames = members.map((p) => p.frame);
  const index = { node: valid.nodeIndex, member: valid.memberIndex };
  const caseLoads = model.loadCases.map((_, c) => resolveCaseLoads(model, c, frames, index));
  return { model, members, memberIndex: valid.memberIndex, nodeIndex: valid.nodeIndex, caseLoads };
}

const contexts = new WeakMap<AnalysisResult, AnalysisContext>();

export function attachContext(result: AnalysisResult, context: AnalysisContext): void {
  contexts.set(result, context);
}

export function contextOf(result: AnalysisResult): AnalysisContext {
  const c = contexts.get(result);
  if (!c)
    throw new Error(
      "contextOf: not a result returned by analyze() or restoreResult() (a stored result needs restoreResult(model, json) first)",
    );
  return c;
}
