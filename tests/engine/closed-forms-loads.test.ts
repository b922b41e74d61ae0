/**
 * Member loads against closed forms: concentrated couples, loads along the member axis, loads along the global
 * axes (per true and per projected length) on members drawn in every direction, and self-weight. Each check
 * names its source beside it. Tolerance 1e-9 relative: these are exact results of the stated models.
 */
import { describe, it } from "vitest";
import { memberDiagram, nodeDisplacement, nodeReaction, type LoadInput, type ModelInput } from "@/lib/engine";
import { analyzeOrThrow, expectClose, lineBeam, A, E, I } from "./helpers";

const EI = E * I;
const EA = E * A;

describe("concentrated couple on the span", () => {
  const L = 6;
  const C = 12e3; // counter-clockwise
  const couple = (a: number): LoadInput => ({ kind: "couple", member: "m1", position: a, value: C });

  describe.each([0.8, 2, 3, 4, 5.1])("at a = %s m on a 6 m span", (a) => {
    const b = L - a;

    it("fixed–fixed: end moments C·b(2a − b)/L² and C·a(2b − a)/L², end shears ±6C·a·b/L³", () => {
      const r = analyzeOrThrow(lineBeam([L], ["fixed", "fixed"], [couple(a)]));
      // Roark's Formulas for Stress and Strain, 8th ed. (2012), Table 8.1, case 3d (from memory):
      // M_A = M₀(4La − 3a² − L²)/L² = M₀·b(2a − b)/L², M_B = M₀·a(2b − a)/L², R_A = −R_B = 6M₀ab/L³.
      // The same values are, in closed form, the work-equivalent end forces M₀·N′(a) of the cubic (Hermite) shape
      // functions. Reactions of a fully fixed member are its fixed-end forces: counter-clockwise, upward positive.
      const mA = (C * b * (2 * a - b)) / L ** 2;
      const mB = (C * a * (2 * b - a)) / L ** 2;
      const R = (6 * C * a * b) / L ** 3;
      expectClose(nodeReaction(r, "n0", "L").mz, mA, 1e-9, C);
      expectClose(nodeReaction(r, "n1", "L").mz, mB, 1e-9, C);
      expectClose(nodeReaction(r, "n0", "L").fy, R, 1e-9, C / L);
      expectClose(nodeReaction(r, "n1", "L").fy, -R, 1e-9, C / L);
      // Along the span (sagging positive): M(0) = −M_A, a straight line of slope R up to the couple, a drop of C there.
      const d = memberDiagram(r, "m1", "L");
      expectClose(d.valueAt(0).M, -mA, 1e-9, C);
      expectClose(d.valueAt(L).M, mB, 1e-9, C);
      expectClose(d.valueAt(a, "left").M, -mA + R * a, 1e-9, C);
      expectClose(d.valueAt(a, "right").M, -mA + R * a - C, 1e-9, C);
      expectClose(d.valueAt(a / 2).V, R, 1e-9, C / L);
    });

    it("simply supported: reactions ±C/L, a moment drop of C, end rotations C(3b² − L²)/6EIL and C(3a² − L²)/6EIL", () => {
      const r = analyzeOrThrow(lineBeam([L], ["pin", "roller"], [couple(a)]));
      // Statics (common practice): R_A = C/L up, R_B = C/L down; M = C·x/L left of the couple, −C(L − x)/L right of it.
      expectClose(nodeReaction(r, "n0", "L").fy, C / L);
      expectClose(nodeReaction(r, "n1", "L").fy, -C / L);
      const d = memberDiagram(r, "m1", "L");
      expectClose(d.valueAt(a, "left").M, (C * a) / L);
      expectClose(d.valueAt(a, "right").M, (-C * b) / L);
      // Closed form, integrating EI·v″ = M twice with v(0) = v(L) = 0 (common practice; Roark's Formulas for Stress and
      // Strain, 8th ed. (2012), Table 8.1, case 3e, from memory): θ_A = C(3b² − L²)/(6EIL), θ_B = C(3a² − L²)/(6EIL),
      // v(a) = C·a·b·(b − a)/(3EIL).
      expectClose(nodeDisplacement(r, "n0", "L").rz, (C * (3 * b * b - L * L)) / (6 * EI * L));
      expectClose(nodeDisplacement(r, "n1", "L").rz, (C * (3 * a * a - L * L)) / (6 * EI * L));
      expectClose(d.valueAt(a).deflection, (C * a * b * (b - a)) / (3 * EI * L), 1e-9, (C * L * L) / EI);
    });
  });
});

describe("loads along the axis of a bar fixed at both ends", () => {
  const L = 10;

  it.each([3, 7.5])("point load P at a = %s m: end reactions −P·b/L and −P·a/L; N = P·b/L, then −P·a/L", (a) => {
    const P = 100e3;
    const b = L - a;
    const r = analyzeOrThrow(
      lineBeam([L], ["fixed", "fixed"], [{ kind: "point", member: "m1", direction: "local-x", position: a, value: P }]),
    );
    // S. Timoshenko, Strength of Materials, Part I, 3rd ed. (1955), statically indeterminate problems in tension and
    // compression, bar with built-in ends loaded at an intermediate section: R₁ = Pb/l, R₂ = Pa/l (from memory).
    // Compatibility (closed form): the two parts are springs EA/a and EA/b in parallel, so u(a) = P·a·b/(EA·L).
    expectClose(nodeReaction(r, "n0", "L").fx, (-P * b) / L);
    expectClose(nodeReaction(r, "n1", "L").fx, (-P * a) / L);
    const d = memberDiagram(r, "m1", "L");
    expectClose(d.valueAt(a / 2).N, (P * b) / L);
    expectClose(d.valueAt(a, "left").N, (P * b) / L);
    expectClose(d.valueAt(a, "right").N, (-P * a) / L);
    expectClose(d.valueAt((a + L) / 2).N, (-P * a) / L);
    expectClose(d.valueAt(a).axialDisplacement, (P * a * b) / (EA * L));
  });

  it.each([
    { from: 2, to: 6, wStart: 8e3, wEnd: 8e3 },
    { from: 1.5, to: 9, wStart: -3e3, wEnd: 12e3 },
    { from: 0, to: 4, wStart: 5e3, wEnd: 0 },
    { from: 6.5, to: 10, wStart: 2e3, wEnd: 9e3 },
  ])(
    "distributed over [$from, $to] m, $wStart → $wEnd N/m: reactions and axial force by the lever rule",
    ({ from, to, wStart, wEnd }) => {
      const r = analyzeOrThrow(
        lineBeam([L], ["fixed", "fixed"], [{ kind: "distributed", member: "m1", direction: "local-x", wStart, wEnd, from, to }]),
      );
      // As for the point load above (Timoshenko, from memory), each element p·ds divides as (L − s)/L and s/L; summed, a
      // linear load divides like its resultant: R₁ = −W(L − x̄)/L, R₂ = −W·x̄/L. Resultants: the uniform part wStart·len
      // at mid-length, the triangular part (wEnd − wStart)·len/2 at two thirds of len from `from` (statics, common practice).
      const len = to - from;
      const parts = [
        { W: wStart * len, x: from + len / 2 },
        { W: ((wEnd - wStart) * len) / 2, x: from + (2 * len) / 3 },
      ];
      const W = parts[0].W + parts[1].W;
      const R1 = -parts.reduce((s, p) => s + (p.W * (L - p.x)) / L, 0);
      const R2 = -parts.reduce((s, p) => s + (p.W * p.x) / L, 0);
      const scale = Math.abs(parts[0].W) + Math.abs(parts[1].W);
      expectClose(nodeReaction(r, "n0", "L").fx, R1, 1e-9, scale);
      expectClose(nodeReaction(r, "n1", "L").fx, R2, 1e-9, scale);
      // N(x) = −R₁ − ∫₀ˣ p (tension positive): constant before the load, quadratic under it, constant after it.
      const loadUpTo = (x: number) => {
        const t = Math.min(Math.max(x - from, 0), len);
        return wStart * t + ((wEnd - wStart) * t * t) / (2 * len);
      };
      const d = memberDiagram(r, "m1", "L");
      for (const x of [from / 2, from + len / 3, from + (3 * len) / 4, (to + L) / 2])
        expectClose(d.valueAt(x).N, -R1 - loadUpTo(x), 1e-9, scale);
      expectClose(d.valueAt(L).N, -R1 - W, 1e-9, scale);
      // EA·u′ = N with u(0) = 0: at `from` the bar has stretched by N(0)·from/EA.
      expectClose(d.valueAt(from).axialDisplacement, (-R1 * from) / EA, 1e-9, (scale * L) / EA);
    },
  );
});

/** A force system on the member: global components and the point (global coordinates) where it acts. */
interface Force {
  readonly fx: number;
  readonly fy: number;
  readonly x: number;
  readonly y: number;
}

describe("loads along global axes on an inclined member, drawn in each of four directions", () => {
  // A 3-4-5 member between a pin at x = 0 and a roller (vertical reaction) at x = 4; length 5 m, rise 3 m, run 4 m.
  const ORIENTATIONS = [
    { name: "up to the right", start: [0, 0], end: [4, 3] },
    { name: "down to the left", start: [4, 3], end: [0, 0] },
    { name: "down to the right", start: [0, 3], end: [4, 0] },
    { name: "up to the left", start: [4, 0], end: [0, 3] },
  ] as const;
  const L = 5;
  const RHO = 7850;

  describe.each(ORIENTATIONS)("member drawn $name", ({ start, end }) => {
    const c = (end[0] - start[0]) / L;
    const s = (end[1] - start[1]) / L;
    const at = (t: number) => ({ x: start[0] + c * t, y: start[1] + s * t });
    // Resultant of a linear load on [from, to] (member coordinates) and where it acts (statics, common practice).
    const resultant = (gx: number, gy: number, wa: number, wb: number, from = 0, to = L): Force => {
      const W = ((wa + wb) / 2) * (to - from);
      const centroid = from + ((to - from) * (wa + 2 * wb)) / (3 * (wa + wb));
      return { fx: gx * W, fy: gy * W, ...at(centroid) };
    };
    // Intensity per projected length: a global-y load acts on the run (|c|·L), a global-x load on the rise (|s|·L).
    const run = Math.abs(c);
    const rise = Math.abs(s);
    const weight = RHO * A * 9.80665; // N/m; standard gravity 9.80665 m/s² (3rd CGPM, 1901, from memory)
    const cases: { id: string; loads: LoadInput[]; forces: Force[] }[] = [
      {
        id: "Y",
        loads: [{ kind: "distributed", member: "R", direction: "global-y", wStart: -2e3 }],
        forces: [resultant(0, 1, -2e3, -2e3)],
      },
      {
        id: "Yp",
        loads: [{ kind: "distributed", member: "R", direction: "global-y", wStart: -2e3, projected: true }],
        forces: [resultant(0, 1, -2e3 * run, -2e3 * run)],
      },
      {
        id: "X",
        loads: [{ kind: "distributed", member: "R", direction: "global-x", wStart: 1.5e3 }],
        forces: [resultant(1, 0, 1.5e3, 1.5e3)],
      },
      {
        id: "Xp",
        loads: [{ kind: "distributed", member: "R", direction: "global-x", wStart: 1.5e3, projected: true }],
        forces: [resultant(1, 0, 1.5e3 * rise, 1.5e3 * rise)],
      },
      {
        id: "XpT",
        loads: [
          { kind: "distributed", member: "R", direction: "global-x", wStart: 1e3, wEnd: 3e3, from: 1, to: 4.5, projected: true },
        ],
        forces: [resultant(1, 0, 1e3 * rise, 3e3 * rise, 1, 4.5)],
      },
      {
        id: "YpT",
        loads: [
          {
            kind: "distributed",
            member: "R",
            direction: "global-y",
            wStart: -4e3,
            wEnd: -1e3,
            from: 0.5,
            to: 3,
            projected: true,
          },
        ],
        forces: [resultant(0, 1, -4e3 * run, -1e3 * run, 0.5, 3)],
      },
      {
        id: "P",
        loads: [
          { kind: "point", member: "R", direction: "global-x", position: 1.2, value: 5e3 },
          { kind: "point", member: "R", direction: "global-y", position: 3.9, value: -7e3 },
        ],
        forces: [
          { fx: 5e3, fy: 0, ...at(1.2) },
          { fx: 0, fy: -7e3, ...at(3.9) },
        ],
      },
      { id: "G", loads: [{ kind: "self-weight" }], forces: [{ fx: 0, fy: -weight * L, ...at(L / 2) }] },
      { id: "G135", loads: [{ kind: "self-weight", factor: 1.35 }], forces: [{ fx: 0, fy: -1.35 * weight * L, ...at(L / 2) }] },
    ];
    const pinAtStart = start[0] === 0;
    const model: ModelInput = {
      nodes: [
        { id: "S", x: start[0], y: start[1], support: pinAtStart ? { ux: "fixed", uy: "fixed" } : { uy: "fixed" } },
        { id: "T", x: end[0], y: end[1], support: pinAtStart ? { uy: "fixed" } : { ux: "fixed", uy: "fixed" } },
      ],
      members: [{ id: "R", start: "S", end: "T", E, A, I, density: RHO }],
      loadCases: cases.map(({ id, loads }) => ({ id, loads })),
    };
    const r = analyzeOrThrow(model);
    const pin = pinAtStart ? { id: "S", x: start[0], y: start[1] } : { id: "T", x: end[0], y: end[1] };
    const roller = pinAtStart ? { id: "T", x: end[0] } : { id: "S", x: start[0] };

    it.each(cases)(
      "case $id: reactions from statics, and the load's local components from the N and V diagrams",
      ({ id, forces }) => {
        const Fx = forces.reduce((t, f) => t + f.fx, 0);
        const Fy = forces.reduce((t, f) => t + f.fy, 0);
        const momentAboutPin = forces.reduce((t, f) => t + (f.x - pin.x) * f.fy - (f.y - pin.y) * f.fx, 0);
        const scale = forces.reduce((t, f) => t + Math.abs(f.fx) + Math.abs(f.fy), 0);
        // Statics (common practice): moments about the pin give the roller; then ΣFy and ΣFx give the pin.
        const rollerY = -momentAboutPin / (roller.x - pin.x);
        expectClose(nodeReaction(r, roller.id, id).fy, rollerY, 1e-9, scale);
        expectClose(nodeReaction(r, pin.id, id).fy, -Fy - rollerY, 1e-9, scale);
        expectClose(nodeReaction(r, pin.id, id).fx, -Fx, 1e-9, scale);
        expectClose(nodeReaction(r, roller.id, id).fx, 0, 1e-9, scale);
        // Along the member N′ = −p and V′ = q (lib/engine/README.md), so the jumps of N and V from end to end are the
        // load's components along local x = (c, s) and local y = (−s, c), summed.
        const d = memberDiagram(r, "R", id);
        const alongX = Fx * c + Fy * s;
        const alongY = -Fx * s + Fy * c;
        expectClose(d.valueAt(L, "left").N - d.valueAt(0).N, -alongX, 1e-9, scale);
        expectClose(d.valueAt(L, "left").V - d.valueAt(0).V, alongY, 1e-9, scale);
        // Pinned ends: no end moments.
        expectClose(d.valueAt(0).M, 0, 1e-9, scale * L);
        expectClose(d.valueAt(L).M, 0, 1e-9, scale * L);
      },
    );

    it("self-weight totals ρ·A·g·L, shared by the two supports as statics says", () => {
      // g = 9.80665 m/s², standard gravity (3rd CGPM, 1901, from memory); the centroid is at mid-run, so each
      // support takes half (statics, common practice). Written out here rather than through the table above.
      const total = 7850 * 5e-3 * 9.80665 * 5;
      expectClose(nodeReaction(r, "S", "G").fy + nodeReaction(r, "T", "G").fy, total);
      expectClose(nodeReaction(r, "S", "G").fy, total / 2);
      expectClose(nodeReaction(r, "T", "G135").fy, (1.35 * total) / 2);
      // Local components per length: along x −ρAg·s, along y −ρAg·c (gravity is (0, −ρAg)).
      const d = memberDiagram(r, "R", "G");
      expectClose(d.valueAt(L, "left").N - d.valueAt(0).N, total * s);
      expectClose(d.valueAt(L, "left").V - d.valueAt(0).V, -total * c);
    });
  });
});
