/**
 * Structures against closed forms: members released at both ends, statically indeterminate trusses whose forces
 * depend on EA, and support displacements that have free equations to drive. Each check names its source
 * beside it. Tolerance 1e-9 relative: these are exact results of the stated models.
 */
import { describe, it } from "vitest";
import { memberDiagram, memberEndForces, nodeDisplacement, nodeReaction, type LoadInput, type ModelInput } from "@/lib/engine";
import { analyzeOrThrow, expectClose, lineBeam, E, I } from "./helpers";

const EI = E * I;

describe("a member released at both ends between supports that restrain rotation acts simply supported", () => {
  const L = 6;
  const w = 8e3;
  const P = 60e3;
  const udl: LoadInput = { kind: "distributed", member: "m1", direction: "global-y", wStart: -w };
  const point = (a: number, member = "m1"): LoadInput => ({
    kind: "point",
    member,
    direction: "global-y",
    position: a,
    value: -P,
  });
  /** Both nodes fully fixed: the reactions are the member's fixed-end forces after condensing both end rotations. */
  const hingedBetweenFixedNodes = (loads: LoadInput[]): ModelInput => {
    const model = lineBeam([L], ["fixed", "fixed"], loads);
    model.members = [{ ...model.members![0], releases: { startMoment: true, endMoment: true } }];
    return model;
  };

  it("uniform load: reactions wL/2, no end moments, M = wL²/8 and the simply supported deflection curve", () => {
    const r = analyzeOrThrow(hingedBetweenFixedNodes([udl]));
    // AWC Design Aid No. 6, Beam Design Formulas with Shear and Moment Diagrams (2005), Figure 1: R = wl/2,
    // M_max = wl²/8 at the centre, Δx = wx(l³ − 2lx² + x³)/(24EI).
    for (const n of ["n0", "n1"]) {
      expectClose(nodeReaction(r, n, "L").fy, (w * L) / 2);
      expectClose(nodeReaction(r, n, "L").mz, 0, 1e-9, w * L * L);
    }
    const d = memberDiagram(r, "m1", "L");
    expectClose(d.valueAt(L / 2).M, (w * L * L) / 8);
    for (const x of [0, L]) expectClose(d.valueAt(x).M, 0, 1e-9, w * L * L);
    for (const x of [1.5, 3, 4.2]) expectClose(d.valueAt(x).deflection, (-w * x * (L ** 3 - 2 * L * x * x + x ** 3)) / (24 * EI));
  });

  it.each([1.5, 2, 4.5])("point load at a = %s m: reactions Pb/L and Pa/L, M = Pab/L and Δ = Pa²b²/(3EIL) at the load", (a) => {
    const b = L - a;
    const r = analyzeOrThrow(hingedBetweenFixedNodes([point(a)]));
    // AWC Design Aid No. 6 (2005), Figure 8: R₁ = Pb/l, R₂ = Pa/l, M_max = Pab/l at the load, Δa = Pa²b²/(3EIl).
    expectClose(nodeReaction(r, "n0", "L").fy, (P * b) / L);
    expectClose(nodeReaction(r, "n1", "L").fy, (P * a) / L);
    for (const n of ["n0", "n1"]) expectClose(nodeReaction(r, n, "L").mz, 0, 1e-9, P * L);
    const d = memberDiagram(r, "m1", "L");
    expectClose(d.valueAt(a).M, (P * a * b) / L);
    for (const x of [0, L]) expectClose(d.valueAt(x).M, 0, 1e-9, P * L);
    expectClose(d.valueAt(a).deflection, (-P * a * a * b * b) / (3 * EI * L));
  });

  it("triangular load, zero at the start: reactions W/3 and 2W/3, M_max = 2WL/(9√3) at L/√3, no end moments", () => {
    const peak = 20e3;
    const W = (peak * L) / 2;
    const r = analyzeOrThrow(
      hingedBetweenFixedNodes([{ kind: "distributed", member: "m1", direction: "global-y", wStart: 0, wEnd: -peak }]),
    );
    // AWC Design Aid No. 6 (2005), Figure 5: R₁ = W/3, R₂ = 2W/3, M_max = 2Wl/(9√3) at x = l/√3.
    expectClose(nodeReaction(r, "n0", "L").fy, W / 3);
    expectClose(nodeReaction(r, "n1", "L").fy, (2 * W) / 3);
    for (const n of ["n0", "n1"]) expectClose(nodeReaction(r, n, "L").mz, 0, 1e-9, W * L);
    const d = memberDiagram(r, "m1", "L");
    expectClose(d.extremes.M.max.value, (2 * W * L) / (9 * Math.sqrt(3)));
    expectClose(d.extremes.M.max.x, L / Math.sqrt(3));
  });

  it("on top of two fixed-base columns: the columns carry Pb/L and Pa/L axially and stay straight", () => {
    const h = 4;
    const a = 2;
    const model: ModelInput = {
      nodes: [
        { id: "A", x: 0, y: 0, support: { ux: "fixed", uy: "fixed", rz: "fixed" } },
        { id: "B", x: 0, y: h },
        { id: "C", x: L, y: h },
        { id: "D", x: L, y: 0, support: { ux: "fixed", uy: "fixed", rz: "fixed" } },
      ],
      members: [
        { id: "AB", start: "A", end: "B", E, A: 1e-2, I },
        { id: "BC", start: "B", end: "C", E, A: 1e-2, I, releases: { startMoment: true, endMoment: true } },
        { id: "DC", start: "D", end: "C", E, A: 1e-2, I },
      ],
      loadCases: [
        { id: "P", loads: [point(a, "BC")] },
        { id: "W", loads: [{ ...udl, member: "BC" }] },
      ],
    };
    const r = analyzeOrThrow(model);
    // AWC Design Aid No. 6 (2005), Figures 8 and 1 as above. Linear theory: the columns' unequal shortening moves the beam
    // ends across its axis, which strains nothing, so no column bends and no horizontal force or base moment arises.
    const b = L - a;
    for (const [id, base, expected] of [
      ["P", "A", (P * b) / L],
      ["P", "D", (P * a) / L],
      ["W", "A", (w * L) / 2],
      ["W", "D", (w * L) / 2],
    ] as const) {
      const R = nodeReaction(r, base, id);
      expectClose(R.fy, expected);
      expectClose(R.fx, 0, 1e-9, expected);
      expectClose(R.mz, 0, 1e-9, expected * h);
      expectClose(nodeDisplacement(r, base === "A" ? "B" : "C", id).rz, 0, 1e-9, (expected * L * L) / EI);
    }
    expectClose(memberDiagram(r, "BC", "P").valueAt(a).M, (P * a * b) / L);
    expectClose(memberDiagram(r, "BC", "W").valueAt(L / 2).M, (w * L * L) / 8);
    // The beam's own curve, measured from its chord, is the simply supported one (Figure 1: Δx above).
    const x = 1.7;
    expectClose(
      memberDiagram(r, "BC", "W").valueAt(x).relativeDeflection,
      (-w * x * (L ** 3 - 2 * L * x * x + x ** 3)) / (24 * EI),
    );
  });

  it("released at one end only (propped cantilever), point load at a from the released end", () => {
    const a = 2;
    const b = L - a;
    const model = lineBeam([L], ["fixed", "fixed"], [point(a)]);
    model.members = [{ ...model.members![0], releases: { startMoment: true } }];
    const r = analyzeOrThrow(model);
    // AWC Design Aid No. 6 (2005), Figure 17 (from memory), a measured from the supported end:
    // R₁ = Pb²(a + 2l)/(2l³), R₂ = Pa(3l² − a²)/(2l³), M₂ = Pab(a + l)/(2l²) at the fixed end.
    expectClose(nodeReaction(r, "n0", "L").fy, (P * b * b * (a + 2 * L)) / (2 * L ** 3));
    expectClose(nodeReaction(r, "n1", "L").fy, (P * a * (3 * L * L - a * a)) / (2 * L ** 3));
    expectClose(memberDiagram(r, "m1", "L").valueAt(L).M, (-P * a * b * (a + L)) / (2 * L * L));
    expectClose(nodeReaction(r, "n0", "L").mz, 0, 1e-9, P * L);
  });
});

describe("statically indeterminate trusses: forces by compatibility, so they depend on EA", () => {
  it("three bars meeting at a loaded node, the middle bar stiffer than the inclined ones", () => {
    // S. Timoshenko, Strength of Materials, Part I, 3rd ed. (1955), statically indeterminate problems in tension and
    // compression, the symmetric three-bar system (from memory); written out here. The node drops δ: the middle bar
    // (EA₁, length h) stretches δ, each inclined bar (EA₂, length h/cosα) δ·cosα, so N₁ = EA₁δ/h, N₂ = EA₂δcos²α/h,
    // and N₁ + 2N₂cosα = P gives δ = P·h/(EA₁ + 2EA₂cos³α). Here h = 3 m, inclined bars 5 m long, cosα = 3/5.
    const P = 150e3;
    const h = 3;
    const cos = 3 / 5;
    const [A1, A2] = [3e-3, 1.2e-3];
    const model: ModelInput = {
      nodes: [
        { id: "O", x: 0, y: 0 },
        { id: "L", x: -4, y: h, support: { ux: "fixed", uy: "fixed" } },
        { id: "M", x: 0, y: h, support: { ux: "fixed", uy: "fixed" } },
        { id: "R", x: 4, y: h, support: { ux: "fixed", uy: "fixed" } },
      ],
      members: [
        { id: "left", start: "L", end: "O", kind: "truss", E, A: A2 },
        { id: "middle", start: "M", end: "O", kind: "truss", E, A: A1 },
        { id: "right", start: "R", end: "O", kind: "truss", E, A: A2 },
      ],
      loadCases: [{ id: "P", loads: [{ kind: "nodal", node: "O", fy: -P }] }],
    };
    const r = analyzeOrThrow(model);
    const delta = (P * h) / (E * A1 + 2 * E * A2 * cos ** 3);
    const tension = (m: string) => -memberEndForces(r, m, "P").start.fx;
    expectClose(nodeDisplacement(r, "O", "P").uy, -delta);
    expectClose(nodeDisplacement(r, "O", "P").ux, 0, 1e-9, delta);
    expectClose(tension("middle"), (E * A1 * delta) / h);
    expectClose(tension("left"), (E * A2 * delta * cos * cos) / h);
    expectClose(tension("right"), (E * A2 * delta * cos * cos) / h);
    expectClose(nodeReaction(r, "M", "P").fy, (E * A1 * delta) / h);
  });

  it("a tie from a pin holds up a cantilever's tip: the load divides in proportion to EA/H and 3EI/L³", () => {
    // Compatibility (common practice): the tip rests on two springs in parallel, the cantilever 3EI/L³ (AWC Design Aid
    // No. 6 (2005), Figure 13: Δ = Pl³/(3EI)) and the tie EA/H. Tie force P·k_tie/(k_tie + k_beam).
    const [L, H, P, Atie] = [4, 3, 30e3, 1.2e-5];
    const kBeam = (3 * EI) / L ** 3;
    const kTie = (E * Atie) / H;
    const model: ModelInput = {
      nodes: [
        { id: "A", x: 0, y: 0, support: { ux: "fixed", uy: "fixed", rz: "fixed" } },
        { id: "B", x: L, y: 0 },
        { id: "C", x: L, y: H, support: { ux: "fixed", uy: "fixed" } },
      ],
      members: [
        { id: "beam", start: "A", end: "B", E, A: 5e-3, I },
        { id: "tie", start: "C", end: "B", kind: "truss", E, A: Atie },
      ],
      loadCases: [{ id: "P", loads: [{ kind: "nodal", node: "B", fy: -P }] }],
    };
    const r = analyzeOrThrow(model);
    expectClose(nodeDisplacement(r, "B", "P").uy, -P / (kBeam + kTie));
    expectClose(-memberEndForces(r, "tie", "P").start.fx, (P * kTie) / (kBeam + kTie));
    expectClose(nodeReaction(r, "A", "P").fy, (P * kBeam) / (kBeam + kTie));
    expectClose(nodeReaction(r, "A", "P").mz, (P * kBeam * L) / (kBeam + kTie));
  });
});

describe("support displacements with free equations", () => {
  const L = 5;
  const delta = 0.01;

  it("propped cantilever whose prop settles δ: R = 3EIδ/L³, M_A = 3EIδ/L², θ_B = −3δ/(2L)", () => {
    const model = lineBeam([L], ["fixed", "roller"], []);
    model.nodes[1] = { ...model.nodes[1], support: { uy: { kind: "prescribed", value: -delta } } };
    const r = analyzeOrThrow(model);
    // AWC Design Aid No. 6 (2005), Figure 13 (cantilever, load at the free end): Δ = Pl³/(3EI), θ = Pl²/(2EI), M = Pl,
    // Δx = P(2l³ − 3l²x + x³)/(6EI) from the free end. The prop must pull the tip down δ: P = 3EIδ/L³ downwards.
    // With EI = 16 MN·m², L = 5 m, δ = 10 mm: M_A = 19.2 kN·m.
    const F = (3 * EI * delta) / L ** 3;
    expectClose(nodeReaction(r, "n1", "L").fy, -F);
    expectClose(nodeReaction(r, "n0", "L").fy, F);
    expectClose(nodeReaction(r, "n0", "L").mz, F * L);
    expectClose(F * L, 19.2e3);
    expectClose(memberDiagram(r, "m1", "L").valueAt(0).M, -F * L);
    expectClose(nodeDisplacement(r, "n1", "L").uy, -delta);
    expectClose(nodeDisplacement(r, "n1", "L").rz, (-3 * delta) / (2 * L));
    // At midspan (x = l/2 from the free end): Δ = 5Pl³/(48EI) = 5δ/16.
    expectClose(memberDiagram(r, "m1", "L").valueAt(L / 2).deflection, (-5 * delta) / 16);
  });

  it("two equal spans whose middle support settles δ: R_B = −6EIδ/L³, R_A = R_C = 3EIδ/L³, M_B = 3EIδ/L²", () => {
    const model = lineBeam([L, L], ["pin", "roller", "roller"], []);
    model.nodes[1] = { ...model.nodes[1], support: { uy: { kind: "prescribed", value: -delta, loadCase: "L" } } };
    const r = analyzeOrThrow(model);
    // AWC Design Aid No. 6 (2005), Figure 7 (simple beam, load at centre): Δ = Pl³/(48EI), M = Pl/4, R = P/2; the end
    // rotation θ = Pl²/(16EI) from memory. With l = 2L the middle support pulls the beam down with P = 48EIδ/(2L)³ = 6EIδ/L³.
    const P = (6 * EI * delta) / L ** 3;
    expectClose(nodeReaction(r, "n1", "L").fy, -P);
    expectClose(nodeReaction(r, "n0", "L").fy, P / 2);
    expectClose(nodeReaction(r, "n2", "L").fy, P / 2);
    expectClose(memberDiagram(r, "m1", "L").valueAt(L).M, (P * 2 * L) / 4);
    expectClose(nodeDisplacement(r, "n0", "L").rz, (-P * (2 * L) ** 2) / (16 * EI));
    expectClose(nodeDisplacement(r, "n2", "L").rz, (P * (2 * L) ** 2) / (16 * EI));
    expectClose(nodeDisplacement(r, "n1", "L").rz, 0, 1e-9, delta / L);
  });

  it("an imposed rotation θ at one end of a beam pinned at the other: M = 3EIθ/L, far end turns −θ/2", () => {
    const theta = 2e-3;
    const model = lineBeam([L], ["pin", "roller"], []);
    model.nodes[0] = { ...model.nodes[0], support: { ux: "fixed", uy: "fixed", rz: { kind: "prescribed", value: theta } } };
    const r = analyzeOrThrow(model);
    // Slope-deflection (common practice): with the far end pinned, the near-end moment is 3EIθ/L and the far end
    // rotates −θ/2; the end shears are ±3EIθ/L² by statics.
    expectClose(nodeReaction(r, "n0", "L").mz, (3 * EI * theta) / L);
    expectClose(nodeReaction(r, "n0", "L").fy, (3 * EI * theta) / L ** 2);
    expectClose(nodeReaction(r, "n1", "L").fy, (-3 * EI * theta) / L ** 2);
    expectClose(nodeDisplacement(r, "n1", "L").rz, -theta / 2);
  });
});
