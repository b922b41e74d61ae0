/**
 * Every factor of the starting load-combination sets (content/libraries/load-combinations.json) against the
 * standards, the source beside each check. Each set's combinations are compared in order, id by id, with the
 * same load kinds and factors within 1e-12 relative, and their leading actions.
 */
import { describe, expect, it } from "vitest";
import { findEntry, type CombinationSetEntry } from "@/lib/libraries";
import { startingLibraries } from "@/scripts/lib/starting-libraries";
import { expectClose } from "../engine/helpers";

const sets = startingLibraries().find((l) => l.document.kind === "combinations")!.document;
const set = (key: string) => findEntry(sets, key) as CombinationSetEntry;

type Row = { factors: Record<string, number>; leading?: string };
/** Rows in order, by id (an array, since an object would put "1" and "5" before "2-Lr"). */
type Expected = [string, Row][];

function expectSet(entry: CombinationSetEntry, expected: Expected) {
  expect(entry.combinations.map((c) => c.id)).toEqual(expected.map(([id]) => id));
  for (const [i, combination] of entry.combinations.entries()) {
    const want = expected[i][1];
    expect(Object.keys(combination.factors).sort(), combination.id).toEqual(Object.keys(want.factors).sort());
    for (const [kind, factor] of Object.entries(want.factors)) expectClose(combination.factors[kind], factor, 1e-12);
    expect(combination.leading, combination.id).toBe(want.leading);
  }
}

const ROOF = ["Lr", "S", "R"] as const;
const each = (make: (r: (typeof ROOF)[number]) => [string, Row]) => ROOF.map(make);

describe("ASCE/SEI 7-16", () => {
  const kinds = [
    ["D", "permanent", "add"],
    ["L", "variable", "add"],
    ["Lr", "variable", "add"],
    ["S", "variable", "alternatives"],
    ["R", "variable", "add"],
    ["W", "variable", "alternatives"],
  ];

  it("strength design, §2.3.1 combinations 1 to 5", () => {
    const entry = set("ASCE/SEI 7-16 strength design (§2.3.1)");
    expect(entry.purpose).toBe("strength");
    // ASCE/SEI 7-16 §2.2 symbols: D dead, L live, Lr roof live, S snow, R rain, W wind (from memory)
    expect(entry.loadKinds.map((k) => [k.id, k.action, k.cases])).toEqual(kinds);
    // ASCE/SEI 7-16 §2.3.1 (check-values.md [ASCE7-16]; from memory), "(Lr or S or R)" and "(L or 0.5W)" expanded
    expectSet(entry, [
      ["1", { factors: { D: 1.4 } }], // 1. 1.4D
      ...each((r) => [`2-${r}`, { factors: { D: 1.2, L: 1.6, [r]: 0.5 }, leading: "L" }]), // 2. 1.2D + 1.6L + 0.5(Lr or S or R)
      ...ROOF.flatMap((r): Expected => [
        [`3-${r}-L`, { factors: { D: 1.2, [r]: 1.6, L: 1.0 }, leading: r }], // 3. 1.2D + 1.6(Lr or S or R) + L
        [`3-${r}-W`, { factors: { D: 1.2, [r]: 1.6, W: 0.5 }, leading: r }], //    … + 0.5W
      ]),
      ...each((r) => [`4-${r}`, { factors: { D: 1.2, W: 1.0, L: 1.0, [r]: 0.5 }, leading: "W" }]), // 4. 1.2D + 1.0W + L + 0.5(Lr or S or R)
      ["5", { factors: { D: 0.9, W: 1.0 }, leading: "W" }], // 5. 0.9D + 1.0W
    ]);
    expect(entry.note).toMatch(/seismic combinations/);
  });

  it("allowable stress design, §2.4.1 combinations 1 to 7", () => {
    const entry = set("ASCE/SEI 7-16 allowable stress design (§2.4.1)");
    expect(entry.purpose).toBe("allowable-stress");
    expect(entry.loadKinds.map((k) => [k.id, k.action, k.cases])).toEqual(kinds);
    // ASCE/SEI 7-16 §2.4.1 (check-values.md [ASCE7-16]; from memory)
    expectSet(entry, [
      ["1", { factors: { D: 1 } }], // 1. D
      ["2", { factors: { D: 1, L: 1 }, leading: "L" }], // 2. D + L
      ...each((r) => [`3-${r}`, { factors: { D: 1, [r]: 1 }, leading: r }]), // 3. D + (Lr or S or R)
      ...each((r) => [`4-${r}`, { factors: { D: 1, L: 0.75, [r]: 0.75 }, leading: r }]), // 4. D + 0.75L + 0.75(Lr or S or R)
      ["5", { factors: { D: 1, W: 0.6 }, leading: "W" }], // 5. D + 0.6W
      ...each((r) => [`6-${r}`, { factors: { D: 1, L: 0.75, W: 0.75 * 0.6, [r]: 0.75 }, leading: "W" }]), // 6. D + 0.75L + 0.75(0.6W) + 0.75(Lr or S or R)
      ["7", { factors: { D: 0.6, W: 0.6 }, leading: "W" }], // 7. 0.6D + 0.6W
    ]);
  });
});

describe("EN 1990:2002+A1:2005, STR", () => {
  // Table A1.2(B), recommended values (check-values.md [EN1990]; from memory)
  const gammaGsup = 1.35;
  const gammaGinf = 1.0;
  const gammaQ = 1.5;
  const xi = 0.85;
  // Table A1.1 (from memory): imposed loads categories A and B; snow, CEN states but FI, IS, NO, SE, H ≤ 1000 m; wind
  const psi0 = { Q: 0.7, S: 0.5, W: 0.6 };
  const VARIABLE = ["Q", "S", "W"] as const;

  /** Leading action at γQ, the others at γQψ0 (6.10, 6.10b). */
  const led = (gamma: number, lead: (typeof VARIABLE)[number]) => ({
    factors: { G: gamma, ...Object.fromEntries(VARIABLE.map((k) => [k, k === lead ? gammaQ : gammaQ * psi0[k]])) },
    leading: lead,
  });
  const allPsi0 = (gamma: number) => ({
    factors: { G: gamma, ...Object.fromEntries(VARIABLE.map((k) => [k, gammaQ * psi0[k]])) },
  });
  const kinds = [
    ["G", "permanent", "add"],
    ["Q", "variable", "add"],
    ["S", "variable", "alternatives"],
    ["W", "variable", "alternatives"],
  ];

  it("by expression 6.10", () => {
    const entry = set("EN 1990 STR by 6.10: A/B imposed, snow ≤ 1000 m, wind");
    expect(entry.loadKinds.map((k) => [k.id, k.action, k.cases])).toEqual(kinds);
    // EN 1990 6.4.3.2 (6.10): Σ γG Gk + γQ,1 Qk,1 + Σ γQ,i ψ0,i Qk,i; γG,inf where G is favourable (Table A1.2(B) Note 3)
    expectSet(entry, [
      ["6.10-G", { factors: { G: gammaGsup } }],
      ["6.10-Q", led(gammaGsup, "Q")],
      ["6.10-S", led(gammaGsup, "S")],
      ["6.10-W", led(gammaGsup, "W")],
      ["6.10-Q-inf", led(gammaGinf, "Q")],
      ["6.10-S-inf", led(gammaGinf, "S")],
      ["6.10-W-inf", led(gammaGinf, "W")],
    ]);
    expect(entry.note).toMatch(/No national annex is applied/);
  });

  it("by expressions 6.10a and 6.10b", () => {
    const entry = set("EN 1990 STR by 6.10a/6.10b: A/B imposed, snow ≤ 1000 m, wind");
    expect(entry.loadKinds.map((k) => [k.id, k.action, k.cases])).toEqual(kinds);
    // EN 1990 6.4.3.2 (6.10a): Σ γG Gk + Σ γQ,i ψ0,i Qk,i; (6.10b): Σ ξ γG Gk + γQ,1 Qk,1 + Σ γQ,i ψ0,i Qk,i,
    // ξ on unfavourable permanent actions only (Table A1.2(B), ξ = 0.85)
    expectSet(entry, [
      ["6.10a", allPsi0(gammaGsup)],
      ["6.10a-inf", allPsi0(gammaGinf)],
      ["6.10b-Q", led(xi * gammaGsup, "Q")],
      ["6.10b-S", led(xi * gammaGsup, "S")],
      ["6.10b-W", led(xi * gammaGsup, "W")],
      ["6.10b-Q-inf", led(gammaGinf, "Q")],
      ["6.10b-S-inf", led(gammaGinf, "S")],
      ["6.10b-W-inf", led(gammaGinf, "W")],
    ]);
  });

  it("check-values.md's accompanying factors: 1.5 × 0.7 = 1.05, 1.5 × 0.5 = 0.75, 1.5 × 0.6 = 0.9; ξγG,sup = 1.1475", () => {
    const q = set("EN 1990 STR by 6.10: A/B imposed, snow ≤ 1000 m, wind").combinations.find((c) => c.id === "6.10-W")!;
    expectClose(q.factors.Q, 1.05, 1e-12);
    expectClose(q.factors.S, 0.75, 1e-12);
    const b = set("EN 1990 STR by 6.10a/6.10b: A/B imposed, snow ≤ 1000 m, wind").combinations.find((c) => c.id === "6.10b-Q")!;
    expectClose(b.factors.G, 1.1475, 1e-12);
    expectClose(b.factors.W, 0.9, 1e-12);
  });
});
