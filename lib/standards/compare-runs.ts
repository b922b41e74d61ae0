/**
 * Two runs of the same standard side by side: each input, derived value, extract and check utilisation of
 * either record, with both values as shown and the relative difference of their SI values ((b − a) / |a|).
 * Read from the two stored records alone. A value only one of the runs has (another version added or dropped
 * it) is listed with the other side empty; a value that is text (a choice, a library entry's name) is compared
 * as text. Numbers are shown in the person's display units (SI as the standard wrote them, or US customary
 * converted from the SI value, as the run's page shows them); the difference is always that of the SI values.
 */
import { showValue, type DisplayUnits } from "./display-units";
import { inOrder, type RunRecord } from "./run-record";

export type ComparedValue = {
  key: string;
  label: string;
  a: string | null;
  b: string | null;
  /** (b − a) / |a| of the SI values; null when either side is missing or text, or a is 0 and b is not. */
  relative: number | null;
  /** The two differ: by any amount for numbers, or as text. */
  changed: boolean;
};

export type RunComparison = {
  inputs: ComparedValue[];
  derived: ComparedValue[];
  extracts: ComparedValue[];
  /** Each check's utilisation (demand over capacity), as shown to two decimals, compared unrounded. */
  utilisations: ComparedValue[];
  /** Pass or fail of each run as a whole; null for a run that failed in the engine. */
  pass: { a: boolean | null; b: boolean | null };
};

type Side = { si: number | string; display: string; label?: string };

/** A side as the person reads it: a number in their display units, text as it is. */
const shownIn = (side: Side | undefined, units: DisplayUnits): string | null =>
  !side ? null : typeof side.si === "number" ? showValue(side.si, side.display, units) : side.display;

function compareValue(key: string, a: Side | undefined, b: Side | undefined, units: DisplayUnits): ComparedValue {
  const label = a?.label ?? b?.label ?? key;
  const shown = { key, label, a: shownIn(a, units), b: shownIn(b, units) };
  if (!a || !b) return { ...shown, relative: null, changed: true };
  if (typeof a.si !== "number" || typeof b.si !== "number") return { ...shown, relative: null, changed: a.si !== b.si };
  const relative = a.si === b.si ? 0 : a.si === 0 ? null : (b.si - a.si) / Math.abs(a.si);
  return { ...shown, relative, changed: a.si !== b.si };
}

function compareGroup(
  a: Readonly<Record<string, Side>>,
  b: Readonly<Record<string, Side>>,
  orderA: ReadonlyArray<string>,
  orderB: ReadonlyArray<string>,
  units: DisplayUnits,
): ComparedValue[] {
  const keys = inOrder({ ...b, ...a }, [...orderA, ...orderB.filter((key) => !orderA.includes(key))]).map(([key]) => key);
  return keys.map((key) => compareValue(key, a[key], b[key], units));
}

const evaluationOf = (record: RunRecord) => (record.outcome === "succeeded" ? record.evaluation : null);

/** The two records' values side by side, shown in `units` (SI unless asked); differences of the SI values. */
export function compareRuns(a: RunRecord, b: RunRecord, units: DisplayUnits = "si"): RunComparison {
  const ea = evaluationOf(a);
  const eb = evaluationOf(b);
  const inputsOf = (record: RunRecord, evaluation: ReturnType<typeof evaluationOf>): Record<string, Side> =>
    evaluation
      ? evaluation.inputs
      : Object.fromEntries(
          Object.entries(record.typed).map(([key, typed]) => [key, { si: String(typed), display: String(typed) }]),
        );
  const utilisationsOf = (evaluation: ReturnType<typeof evaluationOf>): Record<string, Side> =>
    Object.fromEntries(
      Object.entries(evaluation?.checks ?? {}).map(([key, check]) => [
        key,
        { si: check.utilisation, display: check.utilisationShown, label: check.label },
      ]),
    );
  return {
    inputs: compareGroup(inputsOf(a, ea), inputsOf(b, eb), a.order.inputs, b.order.inputs, units),
    derived: compareGroup(ea?.derived ?? {}, eb?.derived ?? {}, a.order.derived, b.order.derived, units),
    extracts: compareGroup(ea?.extracts ?? {}, eb?.extracts ?? {}, a.order.extracts, b.order.extracts, units),
    utilisations: compareGroup(utilisationsOf(ea), utilisationsOf(eb), a.order.checks, b.order.checks, units),
    pass: { a: ea?.pass ?? null, b: eb?.pass ?? null },
  };
}

/** "+12.5 %", "−3.1 %", "0 %"; "—" when there is no relative difference to show. */
export function formatRelative(relative: number | null): string {
  if (relative === null) return "—";
  if (relative === 0) return "0 %";
  const percent = relative * 100;
  if (Math.abs(percent) < 0.001) return `${percent > 0 ? "+" : "−"}<0.001 %`;
  const digits = Math.abs(percent) >= 10 ? 1 : Math.abs(percent) >= 0.1 ? 2 : 3;
  const text = Math.abs(percent).toFixed(digits);
  return `${percent > 0 ? "+" : "−"}${text} %`;
}
