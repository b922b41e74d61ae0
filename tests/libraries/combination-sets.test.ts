/**
 * expandCombinationSet: a set and a model's load-case kinds into the engine's combinations — alternatives,
 * cases that add, kinds the model lacks, leading actions, duplicates, the leave-out option and the refusals —
 * with exact factor tables; then a beam run through the engine with the expanded combinations.
 */
import { describe, expect, it } from "vitest";
import { memberDiagram, nodeReaction } from "@/lib/engine";
import {
  checkLibraryDocument,
  expandCombinationSet,
  expandCombinationSetOrThrow,
  findEntry,
  MAX_EXPANDED_COMBINATIONS,
  type CombinationSetEntry,
  type ExpandCombinationSetResult,
} from "@/lib/libraries";
import { startingLibraries } from "@/scripts/lib/starting-libraries";
import { A, E, I, analyzeOrThrow, expectClose } from "../engine/helpers";

const sets = startingLibraries().find((l) => l.document.kind === "combinations")!.document;
const set = (key: string) => findEntry(sets, key) as CombinationSetEntry;
const ASCE_STRENGTH = set("ASCE/SEI 7-16 strength design (§2.3.1)");
const ASCE_ASD = set("ASCE/SEI 7-16 allowable stress design (§2.4.1)");
const EN_610 = set("EN 1990 STR by 6.10: A/B imposed, snow ≤ 1000 m, wind");
const EN_610AB = set("EN 1990 STR by 6.10a/6.10b: A/B imposed, snow ≤ 1000 m, wind");

/** A set of our own, for the rules alone (factors invented for the test, common practice). */
function customSet(combinations: unknown[], extraKinds: unknown[] = []): CombinationSetEntry {
  const checked = checkLibraryDocument({
    kind: "combinations",
    title: "Test sets",
    entries: [
      {
        key: "Test set",
        reference: "common practice (a test's own set)",
        purpose: "strength",
        loadKinds: [
          { id: "D", name: "Dead", action: "permanent" },
          { id: "L", name: "Live", action: "variable" },
          { id: "S", name: "Snow", action: "variable", cases: "alternatives" },
          { id: "W", name: "Wind", action: "variable", cases: "alternatives" },
          ...extraKinds,
        ],
        combinations,
      },
    ],
  });
  if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
  return checked.document.entries[0] as CombinationSetEntry;
}

function ok(result: ExpandCombinationSetResult) {
  if (!result.ok) throw new Error(result.problems.map((p) => p.message).join("\n"));
  return result;
}

/** One factor table: the same load cases in the same order, each factor within 1e-12 relative. */
function expectFactors(actual: Record<string, number> | undefined, want: Record<string, number>) {
  expect(Object.keys(actual ?? {})).toEqual(Object.keys(want));
  for (const [loadCase, factor] of Object.entries(want)) expectClose(actual?.[loadCase], factor, 1e-12);
}

/** Ids and factor tables, each factor compared within 1e-12 relative. */
function expectCombinations(result: ExpandCombinationSetResult, expected: [string, Record<string, number>][]) {
  const { combinations } = ok(result);
  expect(combinations.map((c) => c.id)).toEqual(expected.map(([id]) => id));
  combinations.forEach((combination, i) => {
    const want = expected[i][1];
    expect(Object.keys(combination.factors), combination.id).toEqual(Object.keys(want));
    for (const [loadCase, factor] of Object.entries(want)) expectClose(combination.factors[loadCase], factor, 1e-12);
  });
}

describe("ASCE/SEI 7-16 strength set on dead, live and two wind directions", () => {
  // Factors: ASCE/SEI 7-16 §2.3.1 (from memory; check-values.md [ASCE7-16])
  const result = expandCombinationSet(ASCE_STRENGTH, { G1: "D", G2: "D", Q1: "L", W1: "W", W2: "W" });

  it("two dead-load cases add; the wind directions are alternatives, one combination each", () => {
    expectCombinations(result, [
      ["1", { G1: 1.4, G2: 1.4 }], // 1.4D
      ["2-Lr", { G1: 1.2, G2: 1.2, Q1: 1.6 }], // 1.2D + 1.6L + 0.5Lr, no roof load in the model
      ["4-Lr:W1", { G1: 1.2, G2: 1.2, Q1: 1.0, W1: 1.0 }], // 1.2D + 1.0W + L + 0.5Lr, wind W1
      ["4-Lr:W2", { G1: 1.2, G2: 1.2, Q1: 1.0, W2: 1.0 }],
      ["5:W1", { G1: 0.9, G2: 0.9, W1: 1.0 }], // 0.9D + 1.0W
      ["5:W2", { G1: 0.9, G2: 0.9, W2: 1.0 }],
    ]);
  });

  it("names each combination as the standard writes it, with the wind case", () => {
    expect(ok(result).combinations.map((c) => c.name)).toEqual([
      "1.4D",
      "1.2D + 1.6L + 0.5Lr",
      "1.2D + 1.0W + L + 0.5Lr (W1)",
      "1.2D + 1.0W + L + 0.5Lr (W2)",
      "0.9D + 1.0W (W1)",
      "0.9D + 1.0W (W2)",
    ]);
    expect(ok(result).origins[2]).toEqual({
      id: "4-Lr:W1",
      combination: "4-Lr",
      alternatives: { W: "W1" },
      absent: ["Lr"],
      leftOut: [],
    });
  });

  it("says what it left out and why: roof loads absent, so combination 3 (led by them) goes and 2 and 4 repeat", () => {
    const { dropped, absentKinds } = ok(result);
    expect(absentKinds).toEqual(["Lr", "S", "R"]);
    expect(dropped.map((d) => [d.id, d.reason, d.duplicateOf])).toEqual([
      ["2-S", "duplicate", "2-Lr"],
      ["2-R", "duplicate", "2-Lr"],
      ["3-Lr-L", "leading-absent", undefined],
      ["3-Lr-W", "leading-absent", undefined],
      ["3-S-L", "leading-absent", undefined],
      ["3-S-W", "leading-absent", undefined],
      ["3-R-L", "leading-absent", undefined],
      ["3-R-W", "leading-absent", undefined],
      ["4-S:W1", "duplicate", "4-Lr:W1"],
      ["4-S:W2", "duplicate", "4-Lr:W2"],
      ["4-R:W1", "duplicate", "4-Lr:W1"],
      ["4-R:W2", "duplicate", "4-Lr:W2"],
    ]);
    expect(dropped[0].message).toBe("2-S (1.2D + 1.6L + 0.5S) is left out: for these load cases it is the same as 2-Lr.");
    expect(dropped[2].message).toBe("3-Lr-L (1.2D + 1.6Lr + L) is left out: it is led by Lr, and the model has no Lr case.");
  });

  it("a kind with a single case keeps the set's id, without the case", () => {
    expectCombinations(expandCombinationSet(ASCE_STRENGTH, { DL: "D", WL: "W" }), [
      ["1", { DL: 1.4 }],
      ["4-Lr", { DL: 1.2, WL: 1.0 }], // 1.2D + 1.0W (no live or roof load)
      ["5", { DL: 0.9, WL: 1.0 }],
    ]);
  });

  it("a snow case and a roof live case give each roof alternative its own combinations", () => {
    const { combinations } = expandCombinationSetOrThrow(ASCE_STRENGTH, { D: "D", L: "L", Lr: "Lr", S: "S" });
    expect(combinations.map((c) => c.id)).toEqual(["1", "2-Lr", "2-S", "2-R", "3-Lr-L", "3-Lr-W", "3-S-L", "3-S-W"]);
    // 2-R with no rain is 1.2D + 1.6L, the roof loads not acting (§2.3.1), which no other combination repeats
    expectFactors(combinations.find((c) => c.id === "2-R")?.factors, { D: 1.2, L: 1.6 });
    // 3-Lr-W is 1.2D + 1.6Lr + 0.5W with no wind: 1.2D + 1.6Lr, kept (led by Lr, present)
    expectFactors(combinations.find((c) => c.id === "3-Lr-W")?.factors, { D: 1.2, Lr: 1.6 });
  });
});

describe("ASCE/SEI 7-16 allowable stress set", () => {
  it("on dead and live only: D and D + L; combination 4 (led by a roof load) is left out", () => {
    // ASCE/SEI 7-16 §2.4.1 combinations 1 and 2 (from memory)
    const result = expandCombinationSet(ASCE_ASD, { D: "D", L: "L" });
    expectCombinations(result, [
      ["1", { D: 1 }],
      ["2", { D: 1, L: 1 }],
    ]);
    expect(ok(result).dropped.map((d) => d.reason)).toEqual(Array(11).fill("leading-absent"));
  });

  it("combination 6 without roof loads keeps D + 0.75L + 0.45W, one per wind direction", () => {
    const result = expandCombinationSet(ASCE_ASD, { D: "D", L: "L", Wx: "W", Wy: "W" });
    expectCombinations(result, [
      ["1", { D: 1 }],
      ["2", { D: 1, L: 1 }],
      ["5:Wx", { D: 1, Wx: 0.6 }],
      ["5:Wy", { D: 1, Wy: 0.6 }],
      ["6-Lr:Wx", { D: 1, L: 0.75, Wx: 0.45 }], // D + 0.75L + 0.75(0.6W)
      ["6-Lr:Wy", { D: 1, L: 0.75, Wy: 0.45 }],
      ["7:Wx", { D: 0.6, Wx: 0.6 }],
      ["7:Wy", { D: 0.6, Wy: 0.6 }],
    ]);
  });
});

describe("EN 1990 sets", () => {
  it("6.10 with snow and wind as alternatives: every pairing, snow before wind as the set lists its kinds", () => {
    const result = ok(expandCombinationSet(EN_610, { G: "G", Q: "Q", S1: "S", S2: "S", W1: "W", W2: "W" }));
    expect(result.combinations).toHaveLength(1 + 6 * 4);
    expect(result.combinations.slice(0, 5).map((c) => c.id)).toEqual([
      "6.10-G",
      "6.10-Q:S1:W1",
      "6.10-Q:S1:W2",
      "6.10-Q:S2:W1",
      "6.10-Q:S2:W2",
    ]);
    // EN 1990 (6.10), Tables A1.1 and A1.2(B): 1.35G + 1.5Q + 1.5·0.5S + 1.5·0.6W (from memory)
    expectCombinations({ ...result, combinations: [result.combinations[3]] }, [
      ["6.10-Q:S2:W1", { G: 1.35, Q: 1.5, S2: 0.75, W1: 0.9 }],
    ]);
    expect(result.combinations[3].name).toBe("1.35G + 1.5Q + 1.5·0.5S + 1.5·0.6W (S2, W1)");
  });

  it("6.10 with accompanying actions left out on request gives the uplift combination 1.00G + 1.5W", () => {
    // EN 1990 6.4.3.2 and Table A1.2(B): favourable variable actions taken as zero, γG,inf = 1.00 (from memory)
    const result = expandCombinationSet(EN_610, { G: "G", Q1: "Q", W1: "W" }, { leaveOutAccompanying: true });
    expectCombinations(result, [
      ["6.10-G", { G: 1.35 }],
      ["6.10-Q", { G: 1.35, Q1: 1.5, W1: 0.9 }],
      ["6.10-Q:no-W", { G: 1.35, Q1: 1.5 }],
      ["6.10-W", { G: 1.35, Q1: 1.05, W1: 1.5 }],
      ["6.10-W:no-Q", { G: 1.35, W1: 1.5 }],
      ["6.10-Q-inf", { G: 1.0, Q1: 1.5, W1: 0.9 }],
      ["6.10-Q-inf:no-W", { G: 1.0, Q1: 1.5 }],
      ["6.10-W-inf", { G: 1.0, Q1: 1.05, W1: 1.5 }],
      ["6.10-W-inf:no-Q", { G: 1.0, W1: 1.5 }],
    ]);
    const { combinations, origins } = ok(result);
    expect(combinations[8].name).toBe("1.00G + 1.5W + 1.5·0.7Q + 1.5·0.5S (without Q)");
    expect(origins[8].leftOut).toEqual(["Q"]);
  });

  it("without the option, the same model gives the combinations as the standard writes them", () => {
    const { combinations } = expandCombinationSetOrThrow(EN_610, { G: "G", Q1: "Q", W1: "W" });
    expect(combinations.map((c) => c.id)).toEqual(["6.10-G", "6.10-Q", "6.10-W", "6.10-Q-inf", "6.10-W-inf"]);
  });

  it("6.10a/6.10b on permanent actions alone keeps 6.10a at 1.35G and 1.00G (no leading action to lose)", () => {
    const result = expandCombinationSet(EN_610AB, { G1: "G", G2: "G" });
    expectCombinations(result, [
      ["6.10a", { G1: 1.35, G2: 1.35 }],
      ["6.10a-inf", { G1: 1.0, G2: 1.0 }],
    ]);
  });
});

describe("the rules on a set of our own", () => {
  it("a combination that loses every variable action and repeats another is left out; one that repeats none is kept", () => {
    const own = customSet([
      { id: "a", label: "1.2D + 1.6L", factors: { D: 1.2, L: 1.6 } },
      { id: "b", label: "1.2D + 1.6S", factors: { D: 1.2, S: 1.6 } },
      { id: "c", label: "0.9D + W", factors: { D: 0.9, W: 1 } },
    ]);
    const result = expandCombinationSet(own, { D1: "D" });
    expectCombinations(result, [
      ["a", { D1: 1.2 }],
      ["c", { D1: 0.9 }],
    ]);
    expect(ok(result).dropped).toEqual([
      {
        id: "b",
        combination: "b",
        reason: "duplicate",
        duplicateOf: "a",
        message: "b (1.2D + 1.6S) is left out: for these load cases it is the same as a.",
      },
    ]);
  });

  it("a combination with no case of any of its kinds is left out, said so", () => {
    const own = customSet([
      { id: "dead", label: "1.4D", factors: { D: 1.4 } },
      { id: "live", label: "1.6L", factors: { L: 1.6 } },
    ]);
    const result = ok(expandCombinationSet(own, { L1: "L" }));
    expect(result.combinations.map((c) => c.id)).toEqual(["live"]);
    expect(result.dropped[0]).toMatchObject({ id: "dead", reason: "no-cases" });
    expect(result.dropped[0].message).toBe("dead (1.4D) is left out: the model has no case of any of its load kinds.");
  });

  it("refuses a case of a kind the set does not know, naming the case and the set's kinds, every one", () => {
    const result = expandCombinationSet(ASCE_STRENGTH, { G1: "D", Q1: "Q", E1: "E", N: 5 as unknown as string });
    expect(result).toEqual({
      ok: false,
      problems: [
        {
          loadCase: "Q1",
          message:
            "Load case “Q1” is of kind “Q”, which the set “ASCE/SEI 7-16 strength design (§2.3.1)” does not know; its load kinds are D, L, Lr, S, R and W.",
        },
        {
          loadCase: "E1",
          message:
            "Load case “E1” is of kind “E”, which the set “ASCE/SEI 7-16 strength design (§2.3.1)” does not know; its load kinds are D, L, Lr, S, R and W.",
        },
        {
          loadCase: "N",
          message:
            "Load case “N” is of kind “5”, which the set “ASCE/SEI 7-16 strength design (§2.3.1)” does not know; its load kinds are D, L, Lr, S, R and W.",
        },
      ],
    });
    expect(() => expandCombinationSetOrThrow(ASCE_STRENGTH, { Q1: "Q" })).toThrow(/Load case “Q1” is of kind “Q”/);
  });

  it("refuses a model with no load cases, and one none of whose cases any combination applies to", () => {
    expect(expandCombinationSet(ASCE_STRENGTH, {})).toEqual({
      ok: false,
      problems: [{ loadCase: null, message: "The model has no load cases to combine." }],
    });
    const own = customSet([{ id: "w", label: "0.9D + 1.0W", factors: { D: 0.9, W: 1 }, leading: "W" }]);
    expect(expandCombinationSet(own, { D: "D" })).toEqual({
      ok: false,
      problems: [{ loadCase: null, message: "None of the combinations of “Test set” applies to these load cases." }],
    });
  });

  it("takes any load case id, even one an object would mistake for its prototype", () => {
    const kinds = JSON.parse('{"__proto__": "D", "constructor": "L"}') as Record<string, string>;
    expectCombinations(expandCombinationSet(ASCE_ASD, kinds), [
      ["1", JSON.parse('{"__proto__": 1}') as Record<string, number>],
      ["2", JSON.parse('{"__proto__": 1, "constructor": 1}') as Record<string, number>],
    ]);
  });

  it(`refuses more than ${MAX_EXPANDED_COMBINATIONS} combinations from one set`, () => {
    const own = customSet(
      [{ id: "x", label: "S + W + E", factors: { S: 1, W: 1, E: 1 } }],
      [{ id: "E", name: "Seismic", action: "accidental", cases: "alternatives" }],
    );
    const kinds: Record<string, string> = {};
    for (let i = 0; i < 13; i++) Object.assign(kinds, { [`S${i}`]: "S", [`W${i}`]: "W", [`E${i}`]: "E" }); // 13³ = 2197
    const result = expandCombinationSet(own, kinds);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.problems[0].message).toMatch(/would give more than 2000 combinations/);
  });

  it("never leaves out the leading action or a permanent one, nor an accidental action", () => {
    const own = customSet(
      [{ id: "x", label: "D + L + 0.5S + E", factors: { D: 1, L: 1, S: 0.5, E: 1 }, leading: "L" }],
      [{ id: "E", name: "Accidental", action: "accidental" }],
    );
    const { combinations } = expandCombinationSetOrThrow(own, { D: "D", L: "L", S: "S", E: "E" }, { leaveOutAccompanying: true });
    expect(combinations.map((c) => [c.id, Object.keys(c.factors)])).toEqual([
      ["x", ["D", "L", "S", "E"]],
      ["x:no-S", ["D", "L", "E"]],
    ]);
  });
});

describe("a beam through the engine with the expanded combinations", () => {
  // Simply supported 6 m span, D = 10 kN/m, L = 15 kN/m (uniform, downwards).
  const span = 6;
  const wD = 10e3;
  const wL = 15e3;
  const udl = (w: number) => ({ kind: "distributed" as const, member: "m1", direction: "global-y" as const, wStart: -w });
  const model = (combinations: unknown[], caseIds: [string, string]) => ({
    nodes: [
      { id: "n0", x: 0, y: 0, support: { ux: "fixed", uy: "fixed" } },
      { id: "n1", x: span, y: 0, support: { uy: "fixed" } },
    ],
    members: [{ id: "m1", start: "n0", end: "n1", E, A, I }],
    loadCases: [
      { id: caseIds[0], loads: [udl(wD)] },
      { id: caseIds[1], loads: [udl(wL)] },
    ],
    combinations,
  });
  /** The combination with the largest sagging moment, and that moment. */
  function governing(result: ReturnType<typeof analyzeOrThrow>, ids: string[]) {
    return ids
      .map((id) => ({ id, M: memberDiagram(result, "m1", id).extremes.M!.max.value }))
      .reduce((a, b) => (b.M > a.M ? b : a));
  }

  it("ASCE 7-16 strength: 1.2D + 1.6L governs, wu = 36 kN/m, Mu = wu L²/8 = 162 kN·m", () => {
    const { combinations } = expandCombinationSetOrThrow(ASCE_STRENGTH, { D: "D", L: "L" });
    expect(combinations.map((c) => c.id)).toEqual(["1", "2-Lr"]);
    const result = analyzeOrThrow(model(combinations, ["D", "L"]));
    const top = governing(result, ["1", "2-Lr"]);
    expect(top.id).toBe("2-Lr");
    // ASCE/SEI 7-16 §2.3.1 combination 2: wu = 1.2(10) + 1.6(15) = 36 kN/m (from memory)
    const wu = 1.2 * wD + 1.6 * wL;
    expectClose(wu, 36e3);
    // AISC Steel Construction Manual, 15th ed., Table 3-23 case 1: M = wL²/8, R = wL/2
    expectClose(top.M, (wu * span ** 2) / 8);
    expectClose(top.M, 162e3);
    expectClose(nodeReaction(result, "n0", "2-Lr").fy, (wu * span) / 2);
    // combination 1, 1.4D: 1.4(10) × 6²/8 = 63 kN·m
    expectClose(memberDiagram(result, "m1", "1").extremes.M!.max.value, (1.4 * wD * span ** 2) / 8);
  });

  it("ASCE 7-16 allowable stress with wind up and down as alternatives: one engine combination per direction", () => {
    // Roof beam: D = 10 kN/m down; wind W1 = 20 kN/m up (suction), W2 = 5 kN/m down (pressure).
    const caseKinds = { D: "D", W1: "W", W2: "W" };
    const { combinations } = expandCombinationSetOrThrow(ASCE_ASD, caseKinds);
    expect(combinations.map((c) => c.id)).toEqual(["1", "5:W1", "5:W2", "6-Lr:W1", "6-Lr:W2", "7:W1", "7:W2"]);
    const result = analyzeOrThrow({
      nodes: [
        { id: "n0", x: 0, y: 0, support: { ux: "fixed", uy: "fixed" } },
        { id: "n1", x: span, y: 0, support: { uy: "fixed" } },
      ],
      members: [{ id: "m1", start: "n0", end: "n1", E, A, I }],
      loadCases: [
        { id: "D", loads: [udl(wD)] },
        { id: "W1", loads: [udl(-20e3)] },
        { id: "W2", loads: [udl(5e3)] },
      ],
      combinations,
    });
    const midspan = (id: string) => memberDiagram(result, "m1", id).valueAt(span / 2).M;
    // ASCE/SEI 7-16 §2.4.1 combination 7, 0.6D + 0.6W (from memory), wind up: w = 0.6(10) − 0.6(20) = −6 kN/m, so
    // M = wL²/8 = −27 kN·m, hogging (AISC Steel Construction Manual, 15th ed., Table 3-23 case 1)
    expectClose(midspan("7:W1"), ((0.6 * wD - 0.6 * 20e3) * span ** 2) / 8);
    expectClose(midspan("7:W1"), -27e3);
    // combination 5, D + 0.6W, wind down: w = 10 + 0.6(5) = 13 kN/m, M = 58.5 kN·m
    expectClose(midspan("5:W2"), ((wD + 0.6 * 5e3) * span ** 2) / 8);
    // combination 6 without live or roof load: D + 0.75(0.6W), wind down: w = 10 + 0.45(5) = 12.25 kN/m
    expectClose(midspan("6-Lr:W2"), ((wD + 0.45 * 5e3) * span ** 2) / 8);
  });

  it("EN 1990: 6.10 gives 1.35G + 1.5Q = 36 kN/m too; by 6.10a/b, 6.10b-Q governs at 0.85·1.35G + 1.5Q", () => {
    const by610 = expandCombinationSetOrThrow(EN_610, { G: "G", Q: "Q" }).combinations;
    const by610ab = expandCombinationSetOrThrow(EN_610AB, { G: "G", Q: "Q" }).combinations;
    expect(by610.map((c) => c.id)).toEqual(["6.10-G", "6.10-Q", "6.10-Q-inf"]);
    expect(by610ab.map((c) => c.id)).toEqual(["6.10a", "6.10a-inf", "6.10b-Q", "6.10b-Q-inf"]);
    const ab = by610ab.map((c) => ({ ...c, id: `ab ${c.id}` }));
    const result = analyzeOrThrow(model([...by610, ...ab], ["G", "Q"]));
    // EN 1990 (6.10), Table A1.2(B): 1.35·10 + 1.5·15 = 36 kN/m; AISC Manual Table 3-23 case 1: wL²/8 = 162 kN·m
    const top610 = governing(
      result,
      by610.map((c) => c.id),
    );
    expect(top610.id).toBe("6.10-Q");
    expectClose(top610.M, ((1.35 * wD + 1.5 * wL) * span ** 2) / 8);
    // EN 1990 (6.10a) 1.35·10 + 1.05·15 = 29.25 kN/m; (6.10b) 0.85·1.35·10 + 1.5·15 = 33.975 kN/m, the larger
    const topAb = governing(
      result,
      ab.map((c) => c.id),
    );
    expect(topAb.id).toBe("ab 6.10b-Q");
    expectClose(topAb.M, (33.975e3 * span ** 2) / 8);
    expectClose(memberDiagram(result, "m1", "ab 6.10a").extremes.M!.max.value, (29.25e3 * span ** 2) / 8);
  });
});

describe("ids", () => {
  it("a prefix lets two sets share a model; a load case with a combination's id is refused", () => {
    const strength = expandCombinationSetOrThrow(ASCE_STRENGTH, { D: "D", L: "L" }, { idPrefix: "LRFD " });
    const asd = expandCombinationSetOrThrow(ASCE_ASD, { D: "D", L: "L" }, { idPrefix: "ASD " });
    expect([...strength.combinations, ...asd.combinations].map((c) => c.id)).toEqual(["LRFD 1", "LRFD 2-Lr", "ASD 1", "ASD 2"]);
    expect(strength.origins.map((o) => o.combination)).toEqual(["1", "2-Lr"]);
    expect(expandCombinationSet(ASCE_ASD, { "1": "D", L: "L" })).toEqual({
      ok: false,
      problems: [
        {
          loadCase: "1",
          message:
            "Load case “1” has the id of one of the set's combinations; rename the load case, or give the combinations a prefix.",
        },
      ],
    });
    // The same cases with a prefix are fine: ASCE/SEI 7-16 §2.4.1 combination 1, D
    expectCombinations(expandCombinationSet(ASCE_ASD, { "1": "D", L: "L" }, { idPrefix: "ASD " }), [
      ["ASD 1", { "1": 1 }],
      ["ASD 2", { "1": 1, L: 1 }],
    ]);
  });
});
