/**
 * Member diagrams and envelopes beyond their extremes: where they are sampled, which side of a step a sample
 * takes, how a combination scales its cases' span loads, which result governs an envelope, and loads that sit
 * exactly at a member end. Values are checked against the simply supported beam's closed forms:
 * AWC Design Aid No. 6 (2005), Figure 1 (uniform load: V = w(L/2 − x), M = wx(L − x)/2) and Figure 8
 * (point load P at a, b = L − a: V = Pb/L then −Pa/L, M = Pbx/L for x ≤ a, Pa(L − x)/L beyond).
 */
import { describe, expect, it } from "vitest";
import { memberDiagram, memberEnvelope, memberForces, type ModelInput } from "@/lib/engine";
import { samplePositions } from "@/lib/engine/diagrams";
import { analyzeOrThrow, expectClose, lineBeam } from "./helpers";

const L = 6;
const w = 10e3;
const P = 30e3;
const a = 2;
const b = L - a;

/** Figure 1, uniform load w downwards. */
const udlM = (x: number) => (w * x * (L - x)) / 2;
const udlV = (x: number) => w * (L / 2 - x);
/** Figure 8, point load P downwards at a; `side` picks V just left or right of the load. */
const pointM = (x: number) => (x <= a ? (P * b * x) / L : (P * a * (L - x)) / L);
const pointV = (x: number, side: "left" | "right" = "right") =>
  x < a || (x === a && side === "left") ? (P * b) / L : (-P * a) / L;

/** One simply supported span: G a uniform load, Q a point load at a; C = 1.35 G + 1.5 Q; Z = G + 0 Q; U = Q upwards. */
function model(): ModelInput {
  const m = lineBeam([L], ["pin", "roller"], []);
  m.loadCases = [
    { id: "G", loads: [{ kind: "distributed", member: "m1", direction: "global-y", wStart: -w }] },
    { id: "Q", loads: [{ kind: "point", member: "m1", direction: "global-y", position: a, value: -P }] },
  ];
  m.combinations = [
    { id: "C", factors: { G: 1.35, Q: 1.5 } },
    { id: "Z", factors: { G: 1, Q: 0 } },
    { id: "U", factors: { Q: -1 } },
  ];
  m.envelopes = [{ id: "ENV", of: ["U", "G", "Q"] }];
  return m;
}
/**
 * The model analysed afresh inside each test that calls it (not at module level), so that mutation testing's
 * per-test coverage sees which test reaches which line of the engine.
 */
const result = () => analyzeOrThrow(model());

describe("sample positions", () => {
  it("are evenly spaced, at least two, plus both sides of every break, left before right", () => {
    const at = (points: number, breaks: number[]) =>
      samplePositions(L, Float64Array.from([0, ...breaks, L]), points).map((s) => `${s.x}${s.side[0]}`);
    expect(at(4, [])).toEqual(["0r", "2r", "4r", "6l"]);
    expect(at(1.9, [])).toEqual(["0r", "6l"]);
    expect(at(-3, [])).toEqual(["0r", "6l"]);
    expect(at(3.7, [])).toEqual(["0r", "3r", "6l"]);
    // A break on a uniform point: the break's left, then its right, then the uniform point's right.
    expect(at(4, [2])).toEqual(["0r", "2l", "2r", "2r", "4r", "6l"]);
    expect(at(3, [1, 4.5])).toEqual(["0r", "1l", "1r", "3r", "4.5l", "4.5r", "6l"]);
  });

  it("a diagram's samples take the value on the side they name, and match the closed form there", () => {
    const d = memberDiagram(result(), "m1", "Q", { points: 4 });
    expect(d.samples.x).toEqual([0, 2, 2, 2, 4, 6]);
    const sides = ["right", "left", "right", "right", "right", "left"] as const;
    d.samples.x.forEach((x, i) => {
      expectClose(d.samples.V[i], pointV(x, sides[i]), 1e-9, P);
      expectClose(d.samples.M[i], pointM(x), 1e-9, P * L);
    });
    // The default is 21 evenly spaced points (every 0.3 m), with the load at 2 m added on both sides.
    const byDefault = memberDiagram(result(), "m1", "Q");
    expect(byDefault.samples.x.length).toBe(23);
    expect(byDefault.samples.x.filter((x) => x === a).length).toBe(2);
    expectClose(byDefault.samples.x[1], 0.3);
    expect(memberForces(result(), "m1", "Q").samples.x).toEqual(byDefault.samples.x);
  });

  it("a case with factor zero in a combination adds no break, and its loads nothing", () => {
    const z = memberDiagram(result(), "m1", "Z", { points: 4 });
    expect(z.samples.x).toEqual([0, 2, 4, 6]);
    z.samples.x.forEach((x, i) => expectClose(z.samples.M[i], udlM(x), 1e-9, w * L * L));
  });
});

describe("values along a member", () => {
  it("a combination scales each case's span loads by its factor", () => {
    const d = memberDiagram(result(), "m1", "C");
    for (const x of [0, 0.7, a, 3.1, 5.5, L]) {
      expectClose(d.valueAt(x).M, 1.35 * udlM(x) + 1.5 * pointM(x), 1e-9, w * L * L);
      expectClose(d.valueAt(x, "left").V, 1.35 * udlV(x) + 1.5 * pointV(x, "left"), 1e-9, P);
    }
    expectClose(d.extremes.M.max.value, 1.35 * udlM(a) + 1.5 * pointM(a));
    expect(d.extremes.M.max.x).toBe(a);
  });

  it("outside the member, values are those at its nearer end", () => {
    const d = memberDiagram(result(), "m1", "Q");
    expect(d.valueAt(-1)).toEqual(d.valueAt(0));
    expect(d.valueAt(L + 2, "left")).toEqual(d.valueAt(L, "left"));
    expectClose(d.valueAt(-1).V, (P * b) / L);
    expectClose(d.valueAt(L + 2).V, (-P * a) / L);
    const f = memberForces(result(), "m1", "Q");
    expect(f.forcesAt(-1)).toEqual(f.forcesAt(0));
    expect(f.forcesAt(L + 2)).toEqual(f.forcesAt(L));
    expectClose(f.forcesAt(a, "left").V, (P * b) / L);
    expectClose(f.forcesAt(a).V, (-P * a) / L);
    // At the load itself, without a side: the value just beyond it.
    expect(d.valueAt(a)).toEqual(d.valueAt(a, "right"));
    expectClose(d.valueAt(a).V, (-P * a) / L);
  });

  it("point loads at the member's ends (to within 1e-12·L) act on its end forces, not as steps inside the span", () => {
    // The loads sit on the supports: the beam itself carries nothing (statics), whatever it is told.
    const m = lineBeam(
      [L],
      ["pin", "roller"],
      [
        { kind: "point", member: "m1", direction: "global-y", position: 0, value: -P },
        { kind: "point", member: "m1", direction: "global-y", position: L, value: -2 * P },
        { kind: "point", member: "m1", direction: "local-x", position: L, value: P },
        // Within 1e-12·L of the end counts as at the end.
        { kind: "point", member: "m1", direction: "global-y", position: L * (1 - 5e-13), value: -P },
      ],
    );
    m.nodes[1].support = { ux: "fixed", uy: "fixed" };
    const d = memberDiagram(analyzeOrThrow(m), "m1", "L", { points: 3 });
    expect(d.samples.x).toEqual([0, 3, 6]);
    for (const x of [0, 1, 3, L]) {
      for (const side of ["left", "right"] as const) {
        const v = d.valueAt(x, side);
        for (const q of ["N", "V", "M"] as const) expect(Math.abs(v[q])).toBeLessThan(1e-9 * P);
      }
    }
  });

  it("two loads closer than 1e-12·L share one break; a load 1e-10·L past the end is taken at the end", () => {
    const m = lineBeam(
      [L],
      ["pin", "roller"],
      [
        { kind: "point", member: "m1", direction: "global-y", position: a, value: -P / 2 },
        { kind: "point", member: "m1", direction: "global-y", position: a + 1e-13 * L, value: -P / 2 },
        { kind: "point", member: "m1", direction: "global-y", position: L * (1 + 1e-10), value: -P },
      ],
    );
    const d = memberDiagram(analyzeOrThrow(m), "m1", "L", { points: 4 });
    expect(d.samples.x).toEqual([0, 2, 2, 2, 4, 6]);
    expectClose(d.valueAt(a, "left").V, (P * b) / L);
    expectClose(d.valueAt(a, "right").V, (-P * a) / L);
    expectClose(d.valueAt(4).M, pointM(4));
  });

  it("on a short member, two loads 2e-12 m apart (more than 1e-12·L) keep their own breaks and steps", () => {
    // L = 0.1 m, so 1e-12·L = 1e-13 m: loads 2e-12 m apart are two steps in V, and between them V is the start
    // reaction less the first load only. Figure 8 superposed for the two loads: R = (P₁b₁ + P₂b₂)/L.
    const Ls = 0.1;
    const [a1, a2] = [0.04, 0.04 + 2e-12];
    const [P1, P2] = [P, 2 * P];
    const m = lineBeam(
      [Ls],
      ["pin", "roller"],
      [
        { kind: "point", member: "m1", direction: "global-y", position: a1, value: -P1 },
        { kind: "point", member: "m1", direction: "global-y", position: a2, value: -P2 },
      ],
    );
    const d = memberDiagram(analyzeOrThrow(m), "m1", "L", { points: 2 });
    expect(d.samples.x).toEqual([0, a1, a1, a2, a2, Ls]);
    const R = (P1 * (Ls - a1) + P2 * (Ls - a2)) / Ls;
    expectClose(d.valueAt(a1, "left").V, R, 1e-9, P);
    expectClose(d.valueAt(a1, "right").V, R - P1, 1e-9, P);
    expectClose(d.valueAt(a2, "left").V, R - P1, 1e-9, P);
    expectClose(d.valueAt(a2, "right").V, R - P1 - P2, 1e-9, P);
  });

  it("a case with no load on the member: a cantilever under a tip load (AWC DA-6, Figure 13)", () => {
    // Figure 13 (from memory), x from the fixed end: M = −P(L − x) (hogging), V = P, v = −Px²(3L − x)/(6EI).
    const m = lineBeam([L], ["fixed", "free"], [{ kind: "nodal", node: "n1", fy: -P }]);
    m.combinations = [{ id: "C", factors: { L: 1.5 } }];
    const r = analyzeOrThrow(m);
    const EI = m.members![0].E * m.members![0].I!;
    for (const [id, f] of [
      ["L", 1],
      ["C", 1.5],
    ] as const) {
      const d = memberDiagram(r, "m1", id, { points: 3 });
      expect(d.samples.x).toEqual([0, 3, 6]);
      for (const x of [0, 2.5, L]) {
        expectClose(d.valueAt(x).M, -f * P * (L - x), 1e-9, P * L);
        expectClose(d.valueAt(x).V, f * P);
        expectClose(d.valueAt(x).deflection, (-f * P * x * x * (3 * L - x)) / (6 * EI), 1e-9, (P * L ** 3) / EI);
      }
    }
  });

  it("a truss member stays straight: its deflection is the chord between its displaced ends", () => {
    // A symmetric two-bar truss, apex C loaded by P: each bar carries N = P/(2 sin α) in compression and shortens
    // by NL/(EA); C drops δ = NL/(EA sin α) (statics and virtual work, common practice). Here sin α = 4/5, L = 5 m.
    const EA = 200e9 * 2e-3;
    const r = analyzeOrThrow({
      nodes: [
        { id: "A", x: 0, y: 0, support: { ux: "fixed", uy: "fixed" } },
        { id: "B", x: 6, y: 0, support: { ux: "fixed", uy: "fixed" } },
        { id: "C", x: 3, y: 4 },
      ],
      members: [
        { id: "AC", start: "A", end: "C", kind: "truss", E: 200e9, A: 2e-3 },
        { id: "BC", start: "B", end: "C", kind: "truss", E: 200e9, A: 2e-3 },
      ],
      loadCases: [{ id: "P", loads: [{ kind: "nodal", node: "C", fy: -P }] }],
    });
    const delta = ((P / (2 * 0.8)) * 5) / (EA * 0.8);
    const d = memberDiagram(r, "AC", "P");
    expect(d.quantities).toEqual(["N", "V", "M", "deflection", "axialDisplacement"]);
    // C moves (0, −δ); AC's local y axis is (−4/5, 3/5), so its end moves −0.6δ across the bar.
    for (const f of [0, 0.25, 0.5, 1]) expectClose(d.valueAt(f * 5).deflection, -0.6 * delta * f, 1e-9, delta);
    expectClose(d.valueAt(5).N, -P / 1.6);
  });

  it("stresses are given at the fibres whose distance is known, and relative deflection wherever I is", () => {
    const quantities = (extra: Record<string, number>) => {
      const m = lineBeam([L], ["pin", "roller"], [{ kind: "distributed", member: "m1", direction: "global-y", wStart: -w }]);
      m.members = [{ ...m.members![0], ...extra }];
      return memberDiagram(analyzeOrThrow(m), "m1", "L").quantities;
    };
    const always = ["N", "V", "M", "deflection", "relativeDeflection", "axialDisplacement"];
    expect(quantities({})).toEqual(always);
    expect(quantities({ cBottom: 0.2 })).toEqual([...always, "stressBottom"]);
    expect(quantities({ cTop: 0.1 })).toEqual([...always, "stressTop"]);
    expect(quantities({ cTop: 0.1, cBottom: 0.2 })).toEqual([...always, "stressTop", "stressBottom"]);
  });

  it("an unknown member is named, with the function asked", () => {
    const r = result();
    expect(() => memberDiagram(r, "m9", "G")).toThrow('memberDiagram: no member "m9"');
    expect(() => memberForces(r, "m9", "G")).toThrow('memberForces: no member "m9"');
  });
});

describe("envelopes along a member", () => {
  it("take the larger and smaller value at each sample, over the union of every result's breaks", () => {
    // U lifts the beam (hogging), G and Q sag it.
    const env = memberEnvelope(result(), "m1", ["G", "U"], { points: 4 });
    expect(env.of).toEqual(["G", "U"]);
    expect(env.x).toEqual([0, 2, 2, 2, 4, 6]);
    env.x.forEach((x, i) => {
      expectClose(env.max.M![i], udlM(x), 1e-9, w * L * L);
      expectClose(env.min.M![i], -pointM(x), 1e-9, w * L * L);
    });
    const sides = ["right", "left", "right", "right", "right", "left"] as const;
    env.x.forEach((x, i) => {
      const [g, u] = [udlV(x), -pointV(x, sides[i])];
      expectClose(env.max.V![i], Math.max(g, u), 1e-9, P);
      expectClose(env.min.V![i], Math.min(g, u), 1e-9, P);
    });
  });

  it("name the result that governs each extreme, in whatever order the results are listed", () => {
    // Figure 1: M_max = wL²/8 = 45 kN·m at L/2 under G; Figure 8: Pab/L = 40 kN·m at a under Q; U is −Q.
    for (const of of [
      ["U", "G", "Q"],
      ["Q", "U", "G"],
      ["G", "Q", "U"],
    ]) {
      const e = memberEnvelope(result(), "m1", of).extremes.M!;
      expect([e.max.from, e.min.from]).toEqual(["G", "U"]);
      expectClose(e.max.value, (w * L * L) / 8);
      expectClose(e.max.x, L / 2);
      expectClose(e.min.value, (-P * a * b) / L);
      expectClose(e.min.x, a);
    }
    // No result loads the beam along its axis: N is exactly zero in all three, and a tie goes to the first listed.
    for (const of of [
      ["U", "G", "Q"],
      ["Q", "U", "G"],
    ]) {
      const n = memberEnvelope(result(), "m1", of).extremes.N!;
      expect([n.max.value, n.min.value]).toEqual([0, 0]);
      expect([n.max.from, n.min.from]).toEqual([of[0], of[0]]);
    }
    // The model's envelope by its id; a single result by its own id.
    expect(memberEnvelope(result(), "m1", "ENV").of).toEqual(["U", "G", "Q"]);
    expect(memberEnvelope(result(), "m1", "ENV").extremes.M!.max.from).toBe("G");
    const one = memberEnvelope(result(), "m1", "Q", { points: 4 });
    expect(one.of).toEqual(["Q"]);
    expect(one.extremes.M!).toMatchObject({ max: { from: "Q", x: a }, min: { from: "Q" } });
    expectClose(one.extremes.M!.max.value, (P * a * b) / L);
  });

  it("list only the quantities every enveloped result has", () => {
    const m = model();
    m.members = [{ ...m.members![0], cTop: 0.1 }];
    const r = analyzeOrThrow(m);
    expect(Object.keys(memberEnvelope(r, "m1", ["G", "Q"]).extremes)).toEqual([
      "N",
      "V",
      "M",
      "deflection",
      "relativeDeflection",
      "axialDisplacement",
      "stressTop",
    ]);
  });
});
