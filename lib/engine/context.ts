/**
 * What an analysis keeps behind its result for on-demand work (diagrams along members). Held in a WeakMap
 * keyed by the result so the result itself stays plain, immutable data.
 */
import type { Model } from "./model";
import type { IdLookup } from "./id-index";
import type { PreparedMember } from "./assembly";
import type { CaseLoads } from "./loads";
import type { AnalysisResult } from "./analysis-types";

export interface AnalysisContext {
  readonly model: Model;
  readonly members: ReadonlyArray<PreparedMember>;
  readonly memberIndex: IdLookup;
  readonly nodeIndex: IdLookup;
  readonly caseLoads: ReadonlyArray<CaseLoads>;
}

const contexts = new WeakMap<AnalysisResult, AnalysisContext>();

export function attachContext(result: AnalysisResult, context: AnalysisContext): void {
  contexts.set(result, context);
}

export function contextOf(result: AnalysisResult): AnalysisContext {
  const c = contexts.get(result);
  if (!c) throw new Error("contextOf: not a result returned by analyze()");
  return c;
}
