/** Portal frames against Kleinlogel's formulas; pin-jointed trusses by the method of joints and from a textbook example. */
import { describe, it, expect } from "vitest";
import { memberDiagram, memberEndForces, nodeDisplacement, nodeReaction, type ModelInput } from "@/lib/engine";
import { analyzeOrThrow, expectClose } from "./helpers";

const E = 200e9;
// Inextensible members in Kleinlogel's formulas: A very large makes axial shortening negligible.
const A_RIGID = 1e3;

function portal(base: "pin" | "fixed", h: number, L: number, Ic: number, Ib: number, w: number): ModelInput {
  const support = base === "fixed" ? { ux: "fixed", uy: "fixed", rz: "fixed" } : { ux: "fixed", uy: "fixed" };
  return {
    nodes: [
      { id: "A", x: 0, y: 0, support },
      { id: "B", x: 0, y: h },
      { id: "C", x: L, y: h },
      { id: "D", x: L, y: 0, support },
    ],
    members: [
      { id: "col-left", start: "A", end: "B", E, A: A_RIGID, I: Ic },
      { id: "beam", start: "B", end: "C", E, A: A_RIGID, I: Ib },
      { id: "col-right", start: "D", end: "C", E, A: A_RIGID, I: Ic },
    ],
    loadCases: [{ id: "G", loads: [{ kind: "distributed", member: "beam", direction: "global-y", wStart: -w }] }],
  } as ModelInput;
}

describe("portal frame, uniform load on the beam", () => {
  const h = 4;
  const L = 8;
  const Ic = 1.2e-4;
  const Ib = 3.1e-4;
  const w = 20e3;
  const k = (Ib * h) / (Ic * L);

  it("pinned bases", () => {
    const r = analyzeOrThrow(portal("pin", h, L, Ic, Ib, w));
    // Kleinlogel, Rigid Frame Formulas (English ed. 1952, from memory): H = wL²/(4h(2k+3)),
    // knee moment = −wL²/(4(2k+3)), k = I_beam·h/(I_col·L)
    const H = (w * L * L) / (4 * h * (2 * k + 3));
    expectClose(nodeReaction(r, "A", "G").fx, H, 1e-6);
    expectClose(nodeReaction(r, "D", "G").fx, -H, 1e-6);
    expectClose(memberDiagram(r, "beam", "G").valueAt(0).M, (-w * L * L) / (4 * (2 * k + 3)), 1e-6);
    expectClose(nodeReaction(r, "A", "G").fy, (w * L) / 2, 1e-9);
  });

  it("fixed bases", () => {
    const r = analyzeOrThrow(portal("fixed", h, L, Ic, Ib, w));
    const beam = memberDiagram(r, "beam", "G");
    // Kleinlogel, Rigid Frame Formulas (English ed. 1952, from memory): M_base = wL²/(12(k+2)),
    // M_knee = −wL²/(6(k+2)). Positive = tension on the inside face: the column's −y local side.
    expectClose(memberDiagram(r, "col-left", "G").valueAt(0).M, (w * L * L) / (12 * (k + 2)), 1e-6);
    expectClose(beam.valueAt(0).M, (-w * L * L) / (6 * (k + 2)), 1e-6);
    expectClose(beam.valueAt(L).M, (-w * L * L) / (6 * (k + 2)), 1e-6);
    // Midspan by statics: wL²/8 + M_knee.
    expectClose(beam.valueAt(L / 2).M, (w * L * L) / 8 - (w * L * L) / (6 * (k + 2)), 1e-6);
  });
});

describe("pin-jointed truss", () => {
  // Source: common practice (method of joints). Nodes A(0,0) pin, B(4,0), C(8,0) roller, D(4,3); members AB, BC,
  // AD, DC, BD; P down at B and H to the right at D. Moments about A: R_C·8 = 4P + 3H.
  //   R_C = P/2 + 3H/8, R_Ay = P/2 − 3H/8, R_Ax = −H.
  //   Joint A (AD at 3-4-5 slope): F_AD·3/5 + R_Ay = 0 → F_AD = −5P/6 + 5H/8; F_AB = −(4/5)F_AD − R_Ax = 2P/3 + H/2.
  //   Joint C: F_CD·3/5 + R_C = 0 → F_CD = −5P/6 − 5H/8; F_BC = −(4/5)F_CD = 2P/3 + H/2.
  //   Joint B: F_BD = P. (Tension positive.)
  const P = 120e3;
  const H = 40e3;
  const truss: ModelInput = {
    nodes: [
      { id: "A", x: 0, y: 0, support: { ux: "fixed", uy: "fixed" } },
      { id: "B", x: 4, y: 0 },
      { id: "C", x: 8, y: 0, support: { uy: "fixed" } },
      { id: "D", x: 4, y: 3 },
    ],
    members: [
      ["AB", "A", "B"],
      ["BC", "B", "C"],
      ["AD", "A", "D"],
      ["DC", "D", "C"],
      ["BD", "B", "D"],
    ].map(([id, start, end]) => ({ id, start, end, kind: "truss" as const, E, A: 2e-3 })),
    loadCases: [
      {
        id: "P",
        loads: [
          { kind: "nodal", node: "B", fy: -P },
          { kind: "nodal", node: "D", fx: H },
        ],
      },
    ],
  };

  it("member forces and reactions", () => {
    const r = analyzeOrThrow(truss);
    const N = (m: string) => -memberEndForces(r, m, "P").start.fx;
    expectClose(N("AB"), (2 * P) / 3 + H / 2);
    expectClose(N("BC"), (2 * P) / 3 + H / 2);
    expectClose(N("AD"), (-5 * P) / 6 + (5 * H) / 8);
    expectClose(N("DC"), (-5 * P) / 6 - (5 * H) / 8);
    expectClose(N("BD"), P);
    expectClose(nodeReaction(r, "C", "P").fy, P / 2 + (3 * H) / 8);
    expectClose(nodeReaction(r, "A", "P").fy, P / 2 - (3 * H) / 8);
    expectClose(nodeReaction(r, "A", "P").fx, -H);
    // Truss members carry no moment; node rotations nothing resists are removed, not reported unstable.
    expect(Math.abs(memberDiagram(r, "AD", "P").extremes.M!.max.value)).toBeLessThan(1e-9 * P);
    expect(r.stats.equations).toBe(5);
  });
});

describe("three-bar plane truss, textbook example", () => {
  // Source: D. L. Logan, A First Course in the Finite Element Method, 4th ed. (2007), Example 3.5 (from memory).
  // Three bars meet at node 1 and run to pinned supports: bar 1 vertical (L = 120 in), bar 2 diagonal at 45°
  // (L = 120√2 in), bar 3 horizontal (L = 120 in); E = 30×10⁶ psi, A = 2 in² for all; 10 000 lb down at node 1.
  // Book answers (rounded, stresses from its rounded displacements): u1 = 0.414×10⁻² in, v1 = −1.59×10⁻² in;
  // σ1 = 3965 psi, σ2 = 1471 psi, σ3 = −1035 psi. The engine is checked against the exact solution of this model,
  // solved below by hand (two unknowns), not against the rounded figures. Modelled in SI: the engine works in N, m, Pa.
  const IN = 0.0254;
  const LBF = 4.4482216152605;
  const PSI = LBF / IN ** 2;
  const [EPSI, AIN2, PLB] = [30e6, 2, 10_000];
  const truss: ModelInput = {
    nodes: [
      { id: "1", x: 0, y: 0 },
      { id: "2", x: 0, y: 120 * IN, support: { ux: "fixed", uy: "fixed" } },
      { id: "3", x: 120 * IN, y: 120 * IN, support: { ux: "fixed", uy: "fixed" } },
      { id: "4", x: 120 * IN, y: 0, support: { ux: "fixed", uy: "fixed" } },
    ],
    members: [
      ["b1", "2", "1"],
      ["b2", "3", "1"],
      ["b3", "4", "1"],
    ].map(([id, start, end]) => ({ id, start, end, kind: "truss" as const, E: EPSI * PSI, A: AIN2 * IN ** 2 })),
    loadCases: [{ id: "P", loads: [{ kind: "nodal", node: "1", fy: -PLB * LBF }] }],
  };

  /**
   * Exact solution in inches and psi: K = Σ (EA/L)·n·nᵀ over the bars (n = unit vector from node 1 to the bar's
   * support), K·[u, v] = [0, −P] by Cramer's rule; a bar's elongation is −n·[u, v], its stress E·elongation/L.
   */
  function exactSolution() {
    const bars = { b1: [0, 120], b2: [120, 120], b3: [120, 0] } as const;
    let [k11, k12, k22] = [0, 0, 0];
    for (const [dx, dy] of Object.values(bars)) {
      const L = Math.hypot(dx, dy);
      const k = (EPSI * AIN2) / L;
      k11 += (k * dx * dx) / (L * L);
      k12 += (k * dx * dy) / (L * L);
      k22 += (k * dy * dy) / (L * L);
    }
    const det = k11 * k22 - k12 * k12;
    const [Fx, Fy] = [0, -PLB];
    const u = (k22 * Fx - k12 * Fy) / det;
    const v = (k11 * Fy - k12 * Fx) / det;
    const stress = (id: keyof typeof bars) => {
      const [dx, dy] = bars[id];
      const L = Math.hypot(dx, dy);
      return (EPSI * -((dx * u + dy * v) / L)) / L;
    };
    return { u, v, stress };
  }

  it("displacement of the loaded node and the bar stresses equal the exact solution of the model", () => {
    const exact = exactSolution();
    // The hand solution is the book's, to the figures the book prints.
    expectClose(exact.u, 0.414e-2, 0.5e-3 / 0.414);
    expectClose(exact.v, -1.59e-2, 0.5e-2 / 1.59);
    const r = analyzeOrThrow(truss);
    const d = nodeDisplacement(r, "1", "P");
    expectClose(d.ux / IN, exact.u);
    expectClose(d.uy / IN, exact.v);
    const stressPsi = (m: string) => -memberEndForces(r, m, "P").start.fx / (AIN2 * IN ** 2) / PSI;
    for (const id of ["b1", "b2", "b3"] as const) expectClose(stressPsi(id), exact.stress(id));
    // Unrounded, the model gives σ1 = 3964.5, σ2 = 1464.5, σ3 = −1035.5 psi: equilibrium at node 1 checks the hand solution.
    expectClose((exact.stress("b1") + exact.stress("b2") / Math.SQRT2) * AIN2, PLB);
    expectClose((exact.stress("b3") + exact.stress("b2") / Math.SQRT2) * AIN2, 0, 1e-9, PLB);
  });
});
