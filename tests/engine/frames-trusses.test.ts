/** Portal frames against Kleinlogel's formulas, and a pin-jointed truss by the method of joints. */
import { describe, it, expect } from "vitest";
import { memberDiagram, memberEndForces, nodeReaction, type ModelInput } from "@/lib/engine";
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
