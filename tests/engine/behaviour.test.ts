/** Releases, settlement, springs, load directions, combinations and envelopes. */
import { describe, it, expect } from "vitest";
import {
  memberDiagram,
  memberEndForces,
  memberEnvelope,
  nodeDisplacement,
  nodeReaction,
  resultFor,
  type ModelInput,
} from "@/lib/engine";
import { analyzeOrThrow, expectAllFinite, expectClose, expectNear, lineBeam, E, I } from "./helpers";
import { randomFrame } from "./random-frames";

const EI = E * I;

describe("releases", () => {
  it("a member released at both ends carries no moment; with a span load it is simply supported", () => {
    const model: ModelInput = {
      nodes: [
        { id: "A", x: 0, y: 0, support: { ux: "fixed", uy: "fixed", rz: "fixed" } },
        { id: "B", x: 0, y: 4 },
        { id: "C", x: 6, y: 4 },
        { id: "D", x: 6, y: 0, support: { ux: "fixed", uy: "fixed", rz: "fixed" } },
      ],
      members: [
        { id: "AB", start: "A", end: "B", E, A: 1e-2, I },
        { id: "BC", start: "B", end: "C", E, A: 1e-2, I, releases: { startMoment: true, endMoment: true } },
        { id: "DC", start: "D", end: "C", E, A: 1e-2, I },
      ],
      loadCases: [
        { id: "H", loads: [{ kind: "nodal", node: "B", fx: 10e3 }] },
        { id: "W", loads: [{ kind: "distributed", member: "BC", direction: "global-y", wStart: -8e3 }] },
      ],
    };
    const r = analyzeOrThrow(model);
    const h = memberDiagram(r, "BC", "H");
    expect(Math.abs(h.extremes.M!.max.value)).toBeLessThan(1e-9 * 10e3 * 4);
    expect(Math.abs(h.extremes.M!.min.value)).toBeLessThan(1e-9 * 10e3 * 4);
    // The sway load splits between column AB (3EI/h³) and the link BC (EA/L) in series with column DC.
    const kc = (3 * EI) / 4 ** 3;
    const ks = 1 / (1 / ((E * 1e-2) / 6) + 1 / kc);
    expectClose(nodeReaction(r, "A", "H").fx, (-10e3 * kc) / (kc + ks), 1e-9);
    // The link pushes C: compression, N = −f_xi < 0.
    expectClose(-memberEndForces(r, "BC", "H").start.fx, (-10e3 * ks) / (kc + ks), 1e-9);
    // Simply supported: wL²/8 at midspan, zero at the hinges.
    const w = memberDiagram(r, "BC", "W");
    expectClose(w.extremes.M!.max.value, (8e3 * 36) / 8);
    expectNear(w.valueAt(0).M, 0, 1e-9 * 8e3 * 36);
    // A hinge's rotations differ on either side: the beam end rotates, the column top does not follow. The beam's
    // curve from its chord is the simply supported one, so its end rotates wL³/(24EI) (AWC Design Aid No. 6 (2005),
    // Figure 1: Δx = wx(l³ − 2lx² + x³)/(24EI)); the columns carry only axial force, so their tops stay straight.
    const theta = (8e3 * 6 ** 3) / (24 * EI);
    expectClose(nodeDisplacement(r, "B", "W").rz, 0, 1e-9, theta);
    expectClose(nodeDisplacement(r, "C", "W").rz, 0, 1e-9, theta);
    for (const x of [0.5, 1, 3, 5.5])
      expectClose(w.valueAt(x).relativeDeflection, (-8e3 * x * (6 ** 3 - 2 * 6 * x * x + x ** 3)) / (24 * EI));
    // Near the released start the curve leaves its chord at the end rotation: v_rel(x)/x → −wL³/(24EI).
    expectClose(w.valueAt(1e-4).relativeDeflection! / 1e-4, -theta, 1e-6);
  });

  it("a node where every member end is released has its rotation removed, not reported unstable", () => {
    const r = analyzeOrThrow({
      ...lineBeam([4, 4], ["fixed", "free", "fixed"], [{ kind: "nodal", node: "n1", fy: -10e3 }]),
      members: [
        { id: "m1", start: "n0", end: "n1", E, A: 1e-2, I, releases: { endMoment: true } },
        { id: "m2", start: "n1", end: "n2", E, A: 1e-2, I, releases: { startMoment: true } },
      ],
    });
    // Two cantilevers meeting at a hinge share the load: Δ = P L³ / (3EI · 2).
    expectClose(nodeDisplacement(r, "n1", "L").uy, (-10e3 * 64) / (6 * EI));
    expect(r.stats.equations).toBe(2);
  });
});

describe("supports", () => {
  it("settlement: a fixed–fixed beam whose end settles Δ gets M = 6EIΔ/L² and V = 12EIΔ/L³, in its own load case", () => {
    const L = 5;
    const delta = 0.01;
    const model = lineBeam([L], ["fixed", "fixed"], []);
    model.nodes[1].support = { ux: "fixed", uy: { kind: "prescribed", value: -delta, loadCase: "S" }, rz: "fixed" };
    model.loadCases = [
      { id: "S", loads: [] },
      { id: "G", loads: [{ kind: "nodal", node: "n0", fy: -1 }] },
    ];
    const r = analyzeOrThrow(model);
    // Slope-deflection (common practice): M = 6EIΔ/L², V = 12EIΔ/L³. The end that stays up hogs, the settled end sags.
    const d = memberDiagram(r, "m1", "S");
    expectClose(d.valueAt(0).M, (-6 * EI * delta) / (L * L));
    expectClose(d.valueAt(L).M, (6 * EI * delta) / (L * L));
    expectClose(d.valueAt(0).V, (12 * EI * delta) / L ** 3);
    expectClose(nodeDisplacement(r, "n1", "S").uy, -delta);
    expectClose(d.valueAt(L / 2).deflection, -delta / 2);
    // In every other load case the settling support acts as fixed.
    expectClose(nodeDisplacement(r, "n1", "G").uy, 0, 1e-9, delta);
    // G's 1 N acts straight on the support at n0, so n0 takes it and n1 nothing.
    expectClose(nodeReaction(r, "n0", "G").fy, 1);
    expectClose(nodeReaction(r, "n1", "G").fy, 0, 1e-9, 1);
    expect(r.loadCases.S.equilibrium.relative).toBeLessThan(1e-12);
  });

  it("spring: a cantilever on a tip spring deflects P / (k + 3EI/L³)", () => {
    const L = 4;
    const k = 2e6;
    const model = lineBeam([L], ["fixed", "free"], [{ kind: "nodal", node: "n1", fy: -50e3 }]);
    model.nodes[1].support = { uy: { kind: "spring", stiffness: k } };
    const r = analyzeOrThrow(model);
    const u = -50e3 / (k + (3 * EI) / L ** 3);
    expectClose(nodeDisplacement(r, "n1", "L").uy, u);
    expectClose(nodeReaction(r, "n1", "L").fy, -k * u);
  });
});

describe("load directions", () => {
  it("a load per projected length on a sloped member equals the same total on its true length", () => {
    const rafter = (load: object): ModelInput => ({
      nodes: [
        { id: "A", x: 0, y: 0, support: { ux: "fixed", uy: "fixed" } },
        { id: "B", x: 4, y: 3, support: { uy: "fixed" } },
      ],
      members: [{ id: "R", start: "A", end: "B", E, A: 1e-2, I }],
      loadCases: [{ id: "S", loads: [{ kind: "distributed", member: "R", direction: "global-y", ...load } as never] }],
    });
    // 2 kN/m on plan over 4 m = 8 kN; on the 5 m slope that is 1.6 kN/m of member length.
    const projected = analyzeOrThrow(rafter({ wStart: -2e3, projected: true }));
    const alongLength = analyzeOrThrow(rafter({ wStart: -1.6e3 }));
    expectClose(nodeReaction(projected, "A", "S").fy, 4e3);
    expectClose(
      memberDiagram(projected, "R", "S").extremes.M!.max.value,
      memberDiagram(alongLength, "R", "S").extremes.M!.max.value,
    );
    // Simply supported on the plan span: M_max = w·l²/8 with l = 4 m (statics, common practice).
    expectClose(memberDiagram(projected, "R", "S").extremes.M!.max.value, (2e3 * 16) / 8);
  });

  it("axial distributed load on a bar fixed at one end: N = p(L − x), u = p(Lx − x²/2)/EA", () => {
    const L = 5;
    const p = 4e3;
    const r = analyzeOrThrow(
      lineBeam([L], ["fixed", "free"], [{ kind: "distributed", member: "m1", direction: "local-x", wStart: p }]),
    );
    const d = memberDiagram(r, "m1", "L");
    // Statics and EA u' = N (common practice).
    expectClose(d.valueAt(1).N, p * (L - 1));
    expectClose(d.valueAt(2).axialDisplacement, (p * (L * 2 - (2 * 2) / 2)) / (E * 5e-3));
    expectClose(nodeDisplacement(r, "n1", "L").ux, (p * L * L) / (2 * E * 5e-3));
  });

  it("self-weight is ρ·A·g downwards", () => {
    const model = lineBeam([6], ["pin", "roller"], [{ kind: "self-weight" }]);
    model.members![0] = { ...model.members![0], density: 7850 };
    const r = analyzeOrThrow(model);
    expectClose(nodeReaction(r, "n0", "L").fy, (7850 * 5e-3 * 9.80665 * 6) / 2);
  });

  it("self-weight loads only the members that have a density; the others carry none", () => {
    const model = lineBeam([6, 4], ["pin", "roller", "roller"], [{ kind: "self-weight" }]);
    model.members![0] = { ...model.members![0], density: 7850 };
    const r = analyzeOrThrow(model);
    expectAllFinite(r);
    // Statics (common practice): only the 6 m span weighs anything, 7850 · 5e-3 · 9.80665 N/m over it.
    const total = 7850 * 5e-3 * 9.80665 * 6;
    const sum = ["n0", "n1", "n2"].reduce((s, n) => s + nodeReaction(r, n, "L").fy, 0);
    expectClose(sum, total);
  });

  it("a couple on the span: reactions ±C/L and a moment step of C", () => {
    const r = analyzeOrThrow(lineBeam([6], ["pin", "roller"], [{ kind: "couple", member: "m1", position: 2, value: 12e3 }]));
    expectClose(nodeReaction(r, "n0", "L").fy, 2e3);
    const d = memberDiagram(r, "m1", "L");
    expectClose(d.valueAt(2, "left").M! - d.valueAt(2, "right").M!, 12e3);
  });
});

describe("stresses", () => {
  it("extreme-fibre stresses are N/A ∓ M·c/I, tension positive", () => {
    const L = 6;
    const w = 10e3;
    const model = lineBeam(
      [L],
      ["pin", "roller"],
      [
        { kind: "distributed", member: "m1", direction: "global-y", wStart: -w },
        { kind: "point", member: "m1", direction: "local-x", position: L, value: 200e3 },
      ],
    );
    model.members![0] = { ...model.members![0], cTop: 0.1, cBottom: 0.2 };
    const r = analyzeOrThrow(model);
    const d = memberDiagram(r, "m1", "L");
    const M = (w * L * L) / 8;
    // 200 kN pulls the roller end: tension N = 200 kN throughout; sagging M puts the bottom fibre in tension.
    expectClose(d.valueAt(L / 2).N, 200e3);
    expectClose(d.extremes.stressBottom!.max.value, 200e3 / 5e-3 + (M * 0.2) / I);
    expectClose(d.extremes.stressTop!.min.value, 200e3 / 5e-3 - (M * 0.1) / I);
    expectClose(d.extremes.stressTop!.min.x, L / 2);
  });
});

describe("combinations and envelopes", () => {
  const base = randomFrame(42, { releases: true });
  const loads = base.loadCases![0].loads!;
  const model: ModelInput = {
    ...base,
    loadCases: [
      { id: "D", loads: loads.filter((l) => l.kind === "distributed") },
      { id: "Q", loads: loads.filter((l) => l.kind !== "distributed") },
    ],
    combinations: [
      { id: "ULS", factors: { D: 1.35, Q: 1.5 } },
      { id: "SLS", factors: { D: 1, Q: 1 } },
      { id: "UP", factors: { D: 0.9, Q: -1.5 } },
    ],
    envelopes: [{ id: "ALL", of: ["ULS", "SLS", "UP"] }],
  };
  // Analysed inside each test (not in the describe body), so mutation testing's per-test coverage sees which
  // test reaches which line of the engine.
  const analysed = () => analyzeOrThrow(model);

  it("a combination equals the factored sum of its load cases, along members too", () => {
    const r = analysed();
    const [D, Q, U] = [r.loadCases.D, r.loadCases.Q, r.combinations.ULS];
    expect(r.memberIds.length).toBeGreaterThan(0);
    for (const key of ["displacements", "reactions", "endForces"] as const) {
      const scale = Math.max(...Array.from(U[key], Math.abs));
      U[key].forEach((v, i) => expectNear(v, 1.35 * D[key][i] + 1.5 * Q[key][i], 1e-12 * scale));
    }
    expect(U.equilibrium.relative).toBeLessThan(1e-10);
    expect(U.relativeResidual).toBeLessThan(1e-10);
    for (const id of r.memberIds) {
      const [dd, dq, du] = ["D", "Q", "ULS"].map((c) => memberDiagram(r, id, c));
      for (const x of [0, 0.3, 1.1, 2.5, du.length]) {
        const a = dd.valueAt(x);
        const b = dq.valueAt(x);
        const c = du.valueAt(x);
        for (const q of ["N", "V", "M", "deflection"] as const)
          expectNear(c[q], 1.35 * a[q]! + 1.5 * b[q]!, 1e-9 * (Math.abs(c[q]!) + 1));
      }
    }
  });

  it("an envelope is the max and min over its results, with the governing one named", () => {
    const r = analysed();
    const env = r.envelopes.ALL;
    const results = env.of.map((id) => resultFor(r, id));
    expect(results).toHaveLength(3);
    expect(env.displacements.max).toHaveLength(3 * model.nodes.length);
    expect(env.endForces.min).toHaveLength(6 * model.members!.length);
    env.displacements.max.forEach((v, i) => {
      expect(v).toBe(Math.max(...results.map((x) => x.displacements[i])));
      expect(results[env.displacements.maxFrom[i]].displacements[i]).toBe(v);
    });
    env.endForces.min.forEach((v, i) => expect(v).toBe(Math.min(...results.map((x) => x.endForces[i]))));
    const id = r.memberIds[r.memberIds.length - 1];
    const me = memberEnvelope(r, id, "ALL", { points: 11 });
    const diagrams = env.of.map((c) => memberDiagram(r, id, c));
    const best = Math.max(...diagrams.map((d) => d.extremes.M!.max.value));
    expectClose(me.extremes.M!.max.value, best, 1e-12);
    expect(env.of[diagrams.findIndex((d) => d.extremes.M!.max.value === best)]).toBe(me.extremes.M!.max.from);
    expect(me.x.length).toBeGreaterThanOrEqual(11);
    me.x.forEach((x, i) => expect(me.max.M![i]).toBeGreaterThanOrEqual(me.min.M![i]));
    // The combination's end forces are the factored sum of its cases', member by member (linearity).
    const [up, d, q] = ["UP", "D", "Q"].map((c) => memberEndForces(r, id, c));
    for (const end of ["start", "end"] as const) {
      for (const k of ["fx", "fy", "mz"] as const) {
        const expected = 0.9 * d[end][k] - 1.5 * q[end][k];
        expectClose(up[end][k], expected, 1e-12, Math.abs(0.9 * d[end][k]) + Math.abs(1.5 * q[end][k]));
      }
    }
  });
});
