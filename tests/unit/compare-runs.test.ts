// Two runs' records side by side: each value's relative difference (b − a) / |a|, values only one run has, text
// values (a choice, a library entry), failed runs, and the order the definitions list them in.
import { describe, expect, it } from "vitest";
import { compareRuns, formatRelative } from "@/lib/standards/compare-runs";
import type { RunRecord } from "@/lib/standards/run-record";

type Values = Record<string, number | string>;

function record(
  inputs: Values,
  utilisations: Record<string, number>,
  extras: { extracts?: Values; order?: string[]; failed?: boolean } = {},
): RunRecord {
  const shown = (values: Values) =>
    Object.fromEntries(Object.entries(values).map(([key, si]) => [key, { si, display: `${si} (shown)`, typed: si }]));
  const base = {
    format: "gusset-run/1",
    typed: Object.fromEntries(Object.entries(inputs).map(([key, value]) => [key, `${value} typed`])),
    order: { inputs: extras.order ?? Object.keys(inputs), derived: [], extracts: Object.keys(extras.extracts ?? {}), checks: [] },
  };
  if (extras.failed) return { ...base, outcome: "failed", failure: { stage: "engine", message: "free", details: [] } } as never;
  return {
    ...base,
    outcome: "succeeded",
    evaluation: {
      inputs: shown(inputs),
      derived: {},
      extracts: shown(extras.extracts ?? {}),
      checks: Object.fromEntries(
        Object.entries(utilisations).map(([key, utilisation]) => [
          key,
          { label: `Check ${key}`, utilisation, utilisationShown: utilisation.toFixed(2), pass: utilisation <= 1 },
        ]),
      ),
      pass: Object.values(utilisations).every((u) => u <= 1),
    },
  } as never;
}

describe("compareRuns", () => {
  it("gives each number's relative difference from the first run, and marks equal values the same", () => {
    const a = record({ L: 6, w: 10, steel: "S355" }, { bending: 0.5 }, { extracts: { M_max: 45_000 } });
    const b = record({ L: 6, w: 12.5, steel: "S275" }, { bending: 0.625 }, { extracts: { M_max: 56_250 } });
    const { inputs, utilisations, extracts, pass } = compareRuns(a, b);
    expect(inputs).toEqual([
      { key: "L", label: "L", a: "6 (shown)", b: "6 (shown)", relative: 0, changed: false },
      { key: "w", label: "w", a: "10 (shown)", b: "12.5 (shown)", relative: 0.25, changed: true },
      { key: "steel", label: "steel", a: "S355 (shown)", b: "S275 (shown)", relative: null, changed: true },
    ]);
    // (0.625 − 0.5) / 0.5 = 0.25, exact in binary.
    expect(utilisations).toEqual([
      { key: "bending", label: "Check bending", a: "0.50", b: "0.63", relative: 0.25, changed: true },
    ]);
    expect(extracts.map((row) => row.relative)).toEqual([0.25]);
    expect(pass).toEqual({ a: true, b: true });
  });

  it("lists a value only one run has beside an empty cell, in the first run's order then the second's", () => {
    const a = record({ L: 6, w: 10 }, { bending: 0.5 }, { order: ["w", "L"] });
    const b = record({ L: 3, h: 0.3 }, { bending: 0.25, shear: 0.1 });
    const { inputs, utilisations } = compareRuns(a, b);
    expect(inputs.map((row) => [row.key, row.a, row.b, row.relative, row.changed])).toEqual([
      ["w", "10 (shown)", null, null, true],
      ["L", "6 (shown)", "3 (shown)", -0.5, true],
      ["h", null, "0.3 (shown)", null, true],
    ]);
    expect(utilisations.map((row) => [row.key, row.relative])).toEqual([
      ["bending", -0.5],
      ["shear", null],
    ]);
  });

  it("has no relative difference from zero, and compares a failed run's typed inputs as text", () => {
    const a = record({ w: 0 }, {});
    const b = record({ w: 5 }, {}, { failed: true });
    const { inputs, utilisations, pass } = compareRuns(a, b);
    expect(inputs).toEqual([{ key: "w", label: "w", a: "0 (shown)", b: "5 typed", relative: null, changed: true }]);
    expect(utilisations).toEqual([]);
    expect(pass).toEqual({ a: true, b: null });
  });
});

describe("formatRelative", () => {
  it("writes a signed percentage with a true minus sign, and says when there is none", () => {
    expect(formatRelative(0.25)).toBe("+25.0 %");
    expect(formatRelative(-0.031)).toBe("−3.10 %");
    expect(formatRelative(0.0004)).toBe("+0.040 %");
    expect(formatRelative(-1e-9)).toBe("−<0.001 %");
    expect(formatRelative(0)).toBe("0 %");
    expect(formatRelative(null)).toBe("—");
  });
});
