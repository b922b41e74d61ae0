// Two runs' records side by side: each value's relative difference (b − a) / |a|, values only one run has, text
// values (a choice, a library entry), failed runs, and the order the definitions list them in; and the rows in a person's
// display units, converted from the SI values as the run's page converts them, with the same differences.
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

describe("compareRuns in a person's display units", () => {
  // Values as a standard records them: the SI value and the display string in the unit the standard chose.
  function withDisplays(
    inputs: Record<string, [number | string, string]>,
    extracts: Record<string, [number, string]>,
    bending: number,
  ) {
    const base = record(
      Object.fromEntries(Object.entries(inputs).map(([key, [si]]) => [key, si])),
      { bending },
      { extracts: Object.fromEntries(Object.entries(extracts).map(([key, [si]]) => [key, si])) },
    ) as Extract<RunRecord, { outcome: "succeeded" }>;
    const displayed = <V extends object>(values: Readonly<Record<string, V>>, displays: Record<string, [unknown, string]>) =>
      Object.fromEntries(Object.entries(values).map(([key, value]) => [key, { ...value, display: displays[key][1] }]));
    const { inputs: shownInputs, extracts: shownExtracts } = base.evaluation;
    return {
      ...base,
      evaluation: { ...base.evaluation, inputs: displayed(shownInputs, inputs), extracts: displayed(shownExtracts, extracts) },
    } as RunRecord;
  }
  const a = withDisplays(
    { L: [6, "6.00 m"], w: [10_000, "10.0 kN/m"], steel: ["S355", "S355"] },
    { M_max: [45_000, "45.0 kN·m"] },
    0.5,
  );
  const b = withDisplays(
    { L: [7.5, "7.50 m"], w: [10_000, "10.0 kN/m"], steel: ["S275", "S275"] },
    { M_max: [70_312.5, "70.3 kN·m"] },
    0.78,
  );

  it("shows SI values as the standard wrote them, and US customary values converted from SI to the same digits", () => {
    const si = compareRuns(a, b, "si");
    const us = compareRuns(a, b);
    expect(us).toEqual(si);
    expect(si.inputs.map((row) => [row.key, row.a, row.b])).toEqual([
      ["L", "6.00 m", "7.50 m"],
      ["w", "10.0 kN/m", "10.0 kN/m"],
      ["steel", "S355", "S275"],
    ]);
    // 1 ft = 0.3048 m, 1 kip = 4448.2216152605 N (NIST Special Publication 811, 2008 ed., Appendix B):
    // 6 m = 19.685 ft; 7.5 m = 24.606 ft; 10 kN/m = 0.68522 kip/ft; 45 kN·m = 33.190 kip·ft; 70.3125 kN·m = 51.860 kip·ft.
    const customary = compareRuns(a, b, "us");
    expect(customary.inputs.map((row) => [row.key, row.a, row.b])).toEqual([
      ["L", "19.7 ft", "24.6 ft"],
      ["w", "0.685 kip/ft", "0.685 kip/ft"],
      ["steel", "S355", "S275"],
    ]);
    expect(customary.extracts.map((row) => [row.key, row.a, row.b])).toEqual([["M_max", "33.2 kip·ft", "51.9 kip·ft"]]);
    // A utilisation has no unit: the same in either system.
    expect(customary.utilisations.map((row) => [row.a, row.b])).toEqual([["0.50", "0.78"]]);
  });

  it("computes every difference from the SI values, whatever the units shown", () => {
    const si = compareRuns(a, b, "si");
    const customary = compareRuns(a, b, "us");
    for (const group of ["inputs", "derived", "extracts", "utilisations"] as const)
      expect(customary[group].map(({ key, relative, changed }) => ({ key, relative, changed }))).toEqual(
        si[group].map(({ key, relative, changed }) => ({ key, relative, changed })),
      );
    // (7.5 − 6) / 6 = 0.25 and (70 312.5 − 45 000) / 45 000 = 0.5625, exact in binary; the rounded feet would give 0.2487.
    expect(customary.inputs.find((row) => row.key === "L")?.relative).toBe(0.25);
    expect(customary.extracts[0].relative).toBe(0.5625);
    // Equal SI values are the same in either system.
    expect(customary.inputs.find((row) => row.key === "w")?.changed).toBe(false);
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
