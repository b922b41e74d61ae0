/**
 * Closed-form beams from published handbook tables. Each check cites its source beside it.
 * Loads act downwards (global −y), so hogging moments and downward deflections come out negative.
 */
import { describe, it, expect } from "vitest";
import { memberDiagram, memberEndForces, nodeDisplacement, nodeReaction } from "@/lib/engine";
import { analyzeOrThrow, expectClose, lineBeam, E, I } from "./helpers";

const EI = E * I;
const L = 6;
const w = 12e3;
const P = 50e3;
const udl = (member = "m1") => ({ kind: "distributed" as const, member, direction: "global-y" as const, wStart: -w });
const point = (position: number, member = "m1") => ({
  kind: "point" as const,
  member,
  direction: "global-y" as const,
  position,
  value: -P,
});

describe("simply supported beam", () => {
  it("uniform load", () => {
    const r = analyzeOrThrow(lineBeam([L], ["pin", "roller"], [udl()]));
    const d = memberDiagram(r, "m1", "L");
    // AWC Design Aid No. 6 (2005), Fig. 1; AISC Manual Table 3-23: R = wL/2, M_max = wL²/8, Δ_max = 5wL⁴/384EI, θ_end = wL³/24EI
    expectClose(nodeReaction(r, "n0", "L").fy, (w * L) / 2);
    expectClose(d.extremes.M!.max.value, (w * L * L) / 8);
    expectClose(d.extremes.M!.max.x, L / 2);
    expectClose(d.extremes.deflection!.min.value, (-5 * w * L ** 4) / (384 * EI));
    expectClose(d.extremes.deflection!.min.x, L / 2, 1e-7);
    expectClose(nodeDisplacement(r, "n0", "L").rz, (-w * L ** 3) / (24 * EI));
  });

  it("point load at midspan", () => {
    const r = analyzeOrThrow(lineBeam([L], ["pin", "roller"], [point(L / 2)]));
    const d = memberDiagram(r, "m1", "L");
    // AWC Design Aid No. 6 (2005), Fig. 7: M = PL/4, Δ = PL³/48EI, θ_end = PL²/16EI
    expectClose(d.extremes.M!.max.value, (P * L) / 4);
    expectClose(d.valueAt(L / 2).deflection, (-P * L ** 3) / (48 * EI));
    expectClose(nodeDisplacement(r, "n1", "L").rz, (P * L * L) / (16 * EI));
  });

  it("point load at a from the left", () => {
    const a = 1.7;
    const b = L - a;
    const r = analyzeOrThrow(lineBeam([L], ["pin", "roller"], [point(a)]));
    const d = memberDiagram(r, "m1", "L");
    // AWC Design Aid No. 6 (2005), Fig. 8: R1 = Pb/L, M = Pab/L, Δ at load = Pa²b²/(3EIL)
    expectClose(nodeReaction(r, "n0", "L").fy, (P * b) / L);
    expectClose(d.extremes.M!.max.value, (P * a * b) / L);
    expectClose(d.extremes.M!.max.x, a);
    expectClose(d.valueAt(a).deflection, (-P * a * a * b * b) / (3 * EI * L));
    // The shear steps by P at the load: V just left is R1, just right R1 − P.
    expectClose(d.valueAt(a, "left").V, (P * b) / L);
    expectClose(d.valueAt(a, "right").V, (P * b) / L - P);
  });

  it("triangular load, zero at the left", () => {
    const peak = 20e3;
    const W = (peak * L) / 2;
    const r = analyzeOrThrow(
      lineBeam([L], ["pin", "roller"], [{ kind: "distributed", member: "m1", direction: "global-y", wStart: 0, wEnd: -peak }]),
    );
    const d = memberDiagram(r, "m1", "L");
    // AWC Design Aid No. 6 (2005), Fig. 5: R = W/3, 2W/3; M_max = 2WL/(9√3) at L/√3
    expectClose(nodeReaction(r, "n0", "L").fy, W / 3);
    expectClose(nodeReaction(r, "n1", "L").fy, (2 * W) / 3);
    expectClose(d.extremes.M!.max.value, (2 * W * L) / (9 * Math.sqrt(3)));
    expectClose(d.extremes.M!.max.x, L / Math.sqrt(3));
  });

  it("partial uniform load (statics, common practice)", () => {
    // w on [a, a + c]: R1 = wc(L − a − c/2)/L; M_max where V = 0, at x = a + R1/w, M_max = R1(a + R1/(2w)).
    const a = 1;
    const c = 3;
    const r = analyzeOrThrow(lineBeam([L], ["pin", "roller"], [{ ...udl(), from: a, to: a + c }]));
    const R1 = (w * c * (L - a - c / 2)) / L;
    const d = memberDiagram(r, "m1", "L");
    expectClose(nodeReaction(r, "n0", "L").fy, R1);
    expectClose(d.extremes.M!.max.x, a + R1 / w);
    expectClose(d.extremes.M!.max.value, R1 * (a + R1 / (2 * w)));
  });

  it("partial load gives the same deflection as a model with nodes at the load ends", () => {
    const loaded = analyzeOrThrow(lineBeam([L], ["pin", "roller"], [{ ...udl(), from: 1, to: 4, wEnd: -2 * w }]));
    const split = analyzeOrThrow(
      lineBeam(
        [1, 3, 2],
        ["pin", "free", "free", "roller"],
        [{ kind: "distributed", member: "m2", direction: "global-y", wStart: -w, wEnd: -2 * w }],
      ),
    );
    const d = memberDiagram(loaded, "m1", "L");
    for (const [node, x] of [
      ["n1", 1],
      ["n2", 4],
    ] as const) {
      expectClose(d.valueAt(x).deflection, nodeDisplacement(split, node, "L").uy, 1e-9);
      expectClose(d.valueAt(x).M, memberDiagram(split, node === "n1" ? "m2" : "m3", "L").valueAt(0).M, 1e-9);
    }
  });
});

describe("fixed–fixed beam", () => {
  it("uniform load", () => {
    const r = analyzeOrThrow(lineBeam([L], ["fixed", "fixed"], [udl()]));
    const d = memberDiagram(r, "m1", "L");
    // AWC Design Aid No. 6 (2005), Fig. 23; Roark 7th ed. Table 8.1: M_end = wL²/12, M_mid = wL²/24, Δ_mid = wL⁴/384EI
    expectClose(d.valueAt(0).M, (-w * L * L) / 12);
    expectClose(d.valueAt(L).M, (-w * L * L) / 12);
    expectClose(d.valueAt(L / 2).M, (w * L * L) / 24);
    expectClose(d.valueAt(L / 2).deflection, (-w * L ** 4) / (384 * EI));
    // AWC Design Aid No. 6 (2005), Fig. 23: M = 0 at 0.2113L (exactly L/2 − L/√12)
    const x0 = L / 2 - L / Math.sqrt(12);
    expect(x0 / L).toBeCloseTo(0.2113, 4);
    expectClose(d.valueAt(x0).M, 0, 1e-9, (w * L * L) / 12);
  });

  it("point load at a", () => {
    const a = 2;
    const b = L - a;
    const r = analyzeOrThrow(lineBeam([L], ["fixed", "fixed"], [point(a)]));
    const d = memberDiagram(r, "m1", "L");
    // AWC Design Aid No. 6 (2005), Fig. 25: M1 = Pab²/L², M2 = Pa²b/L², R1 = Pb²(3a+b)/L³,
    // M at load = 2Pa²b²/L³, Δ at load = Pa³b³/(3EIL³)
    expectClose(d.valueAt(0).M, (-P * a * b * b) / (L * L));
    expectClose(d.valueAt(L).M, (-P * a * a * b) / (L * L));
    expectClose(nodeReaction(r, "n0", "L").fy, (P * b * b * (3 * a + b)) / L ** 3);
    expectClose(d.valueAt(a).M, (2 * P * a * a * b * b) / L ** 3);
    expectClose(d.valueAt(a).deflection, (-P * a ** 3 * b ** 3) / (3 * EI * L ** 3));
  });

  it("point load at midspan", () => {
    const r = analyzeOrThrow(lineBeam([L], ["fixed", "fixed"], [point(L / 2)]));
    const d = memberDiagram(r, "m1", "L");
    // AWC Design Aid No. 6 (2005), Fig. 24: M = PL/8 at the ends and the centre, Δ = PL³/192EI
    expectClose(d.valueAt(0).M, (-P * L) / 8);
    expectClose(d.valueAt(L / 2).M, (P * L) / 8);
    expectClose(d.valueAt(L / 2).deflection, (-P * L ** 3) / (192 * EI));
  });

  it("triangular load", () => {
    const peak = 20e3;
    const r = analyzeOrThrow(
      lineBeam([L], ["fixed", "fixed"], [{ kind: "distributed", member: "m1", direction: "global-y", wStart: 0, wEnd: -peak }]),
    );
    const f = memberEndForces(r, "m1", "L");
    // Roark 7th ed. Table 8.1 (from memory): end moments wL²/30 (zero end) and wL²/20 (peak end)
    expectClose(f.start.mz, (peak * L * L) / 30);
    expectClose(f.end.mz, (-peak * L * L) / 20);
  });
});

describe("propped cantilever, uniform load", () => {
  it("reactions, moments and the exact maximum deflection", () => {
    // Propped (roller) end at x = 0, fixed end at x = L.
    const r = analyzeOrThrow(lineBeam([L], ["roller", "fixed"], [udl()]));
    const d = memberDiagram(r, "m1", "L");
    // AWC Design Aid No. 6 (2005), Fig. 15: R = 3wL/8 (propped), 5wL/8 (fixed), M_fixed = wL²/8,
    // M⁺ = 9wL²/128 at 3L/8 from the propped end, Δ_max = wL⁴/(184.6EI) at 0.4215L from the propped end
    expectClose(nodeReaction(r, "n0", "L").fy, (3 * w * L) / 8);
    expectClose(nodeReaction(r, "n1", "L").fy, (5 * w * L) / 8);
    expectClose(d.valueAt(L).M, (-w * L * L) / 8);
    expectClose(d.extremes.M!.max.value, (9 * w * L * L) / 128);
    expectClose(d.extremes.M!.max.x, (3 * L) / 8);
    // Exact: v = w x (L³ − 3Lx² + 2x³)/(48EI); v' = 0 at 8ξ³ − 9ξ² + 1 = 0, ξ = (1 + √33)/16.
    const xi = (1 + Math.sqrt(33)) / 16;
    const coefficient = (xi * (1 - 3 * xi * xi + 2 * xi ** 3)) / 48;
    expect(xi).toBeCloseTo(0.4215, 4);
    expect(1 / coefficient).toBeCloseTo(184.6, 1);
    expectClose(d.extremes.deflection!.min.x, xi * L, 1e-7);
    expectClose(d.extremes.deflection!.min.value, (-coefficient * w * L ** 4) / EI);
  });
});

describe("cantilever", () => {
  it("tip load", () => {
    const r = analyzeOrThrow(lineBeam([L], ["fixed", "free"], [{ kind: "nodal", node: "n1", fy: -P }]));
    // AWC Design Aid No. 6 (2005), Fig. 13: Δ = PL³/3EI, θ = PL²/2EI, M = PL
    expectClose(nodeDisplacement(r, "n1", "L").uy, (-P * L ** 3) / (3 * EI));
    expectClose(nodeDisplacement(r, "n1", "L").rz, (-P * L * L) / (2 * EI));
    expectClose(nodeReaction(r, "n0", "L").mz, P * L);
    expectClose(memberDiagram(r, "m1", "L").valueAt(0).M, -P * L);
  });

  it("uniform load", () => {
    const r = analyzeOrThrow(lineBeam([L], ["fixed", "free"], [udl()]));
    // AWC Design Aid No. 6 (2005), Fig. 12: Δ = wL⁴/8EI, θ = wL³/6EI, M = wL²/2
    expectClose(nodeDisplacement(r, "n1", "L").uy, (-w * L ** 4) / (8 * EI));
    expectClose(nodeDisplacement(r, "n1", "L").rz, (-w * L ** 3) / (6 * EI));
    expectClose(memberDiagram(r, "m1", "L").extremes.M!.min.value, (-w * L * L) / 2);
  });
});

describe("continuous beams, uniform load on every span", () => {
  it("two equal spans", () => {
    const r = analyzeOrThrow(lineBeam([L, L], ["pin", "roller", "roller"], [udl("m1"), udl("m2")]));
    const d1 = memberDiagram(r, "m1", "L");
    // AWC Design Aid No. 6 (2005), Fig. 29: R = 0.375wL, 1.25wL, 0.375wL; M_support = −wL²/8; M⁺ = 9wL²/128 at 0.375L
    expectClose(nodeReaction(r, "n0", "L").fy, 0.375 * w * L);
    expectClose(nodeReaction(r, "n1", "L").fy, 1.25 * w * L);
    expectClose(nodeReaction(r, "n2", "L").fy, 0.375 * w * L);
    expectClose(d1.valueAt(L).M, (-w * L * L) / 8);
    expectClose(d1.extremes.M!.max.value, (9 * w * L * L) / 128);
    expectClose(d1.extremes.M!.max.x, 0.375 * L);
  });

  it("three equal spans", () => {
    const r = analyzeOrThrow(lineBeam([L, L, L], ["pin", "roller", "roller", "roller"], [udl("m1"), udl("m2"), udl("m3")]));
    const d1 = memberDiagram(r, "m1", "L");
    // AISC Manual Table 3-22 (from memory): R = 0.4wL, 1.1wL; M_support = −0.1wL²; end span M⁺ = 0.08wL² at 0.4L;
    // centre span M⁺ = 0.025wL²
    expectClose(nodeReaction(r, "n0", "L").fy, 0.4 * w * L);
    expectClose(nodeReaction(r, "n1", "L").fy, 1.1 * w * L);
    expectClose(d1.valueAt(L).M, -0.1 * w * L * L);
    expectClose(d1.extremes.M!.max.value, 0.08 * w * L * L);
    expectClose(d1.extremes.M!.max.x, 0.4 * L);
    expectClose(memberDiagram(r, "m2", "L").extremes.M!.max.value, 0.025 * w * L * L);
  });
});
