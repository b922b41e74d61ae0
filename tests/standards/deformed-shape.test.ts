/**
 * The deformed shape drawn over a model (lib/standards/deformed-shape.ts, layoutModel's `deformed` option and the
 * ModelDrawing component): the curve against closed-form beam deflections, the magnification, and the drawing.
 */
import { describe, expect, it } from "vitest";
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { analyze, restoreResult, resultToJson, type AnalysisResult, type ModelInput } from "@/lib/engine";
import { compileStandard } from "@/lib/standards";
import { deformedShape, niceFactor, DEFORMED_FRACTION } from "@/lib/standards/deformed-shape";
import { layoutModel } from "@/lib/standards/drawing";
import { ModelDrawing } from "@/components/standards/model-drawing";

const root = path.resolve(import.meta.dirname, "../../content/standards");

function modelOf(slug: string): ModelInput {
  const files = readdirSync(path.join(root, slug)).filter((f) => f.endsWith(".mdx"));
  const out = compileStandard(readFileSync(path.join(root, slug, files.sort().at(-1)!), "utf8"));
  if (!out.ok) throw new Error(JSON.stringify(out.problems));
  const e = out.standard.evaluate({});
  if (!e.ok) throw new Error(JSON.stringify(e));
  return e.evaluation.model;
}

function resultOf(model: ModelInput): AnalysisResult {
  const out = analyze(model);
  if (!out.ok) throw new Error(JSON.stringify(out.errors));
  return out.result;
}

const close = (actual: number, expected: number, rel = 1e-9) =>
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(rel * Math.abs(expected) + 1e-15);

const [E, I, A] = [200e9, 2e-4, 0.006];
const EI = E * I;

/** A cantilever fixed at A, length L, at `angle` (rad) from the x axis, loaded at its tip B across its axis. */
function cantilever(L: number, P: number, angle = 0): ModelInput {
  const [c, s] = [Math.cos(angle), Math.sin(angle)];
  return {
    nodes: [
      { id: "A", x: 0, y: 0, support: { ux: "fixed", uy: "fixed", rz: "fixed" } },
      { id: "B", x: L * c, y: L * s },
    ],
    members: [{ id: "m", start: "A", end: "B", E, A, I }],
    // −P along the member's local y, (−s, c): downward for a horizontal member.
    loadCases: [{ id: "P", loads: [{ kind: "nodal", node: "B", fx: P * s, fy: -P * c }] }],
  };
}

describe("the deformed shape", () => {
  it("follows a cantilever's tip-load deflection v(x) = Px²(3L − x)/(6EI), PL³/3EI at the tip", () => {
    // Roark's Formulas for Stress and Strain, 7th ed., Table 8.1, case 1a (cantilever, end load), from memory.
    const [L, P] = [4, 10e3];
    const model = cantilever(L, P);
    const shape = deformedShape(model, resultOf(model), "P")!;
    expect(shape.drawn).toBe(true);
    const m = shape.members[0];
    expect(m.x.length).toBeGreaterThanOrEqual(13);
    m.x.forEach((x, i) => {
      close(m.displacements[i].uy, (-P * x * x * (3 * L - x)) / (6 * EI));
      expect(Math.abs(m.displacements[i].ux)).toBeLessThan(1e-12);
      close(m.points[i].y, shape.factor * m.displacements[i].uy);
      close(m.points[i].x, x);
    });
    close(shape.largest!.value, (P * L ** 3) / (3 * EI));
    expect(shape.largest!.node).toBe("B");
    expect(shape.caption).toMatch(
      /^Deformed shape \(dashed\) under load case P, displacements drawn × \d+; largest displacement [\d.]+ mm at node B\.$/,
    );
  });

  it("turns an inclined member's deflection into global components", () => {
    // The same cantilever at 30°, loaded across its axis: the same v(x) along its local y, (−sin, cos) globally.
    // Roark's Formulas for Stress and Strain, 7th ed., Table 8.1, case 1a, from memory.
    const [L, P, angle] = [4, 10e3, Math.PI / 6];
    const model = cantilever(L, P, angle);
    const shape = deformedShape(model, resultOf(model), "P")!;
    const m = shape.members[0];
    m.x.forEach((x, i) => {
      const v = (-P * x * x * (3 * L - x)) / (6 * EI);
      const { ux, uy } = m.displacements[i];
      close(ux, -v * Math.sin(angle));
      close(uy, v * Math.cos(angle));
      close(m.points[i].x, x * Math.cos(angle) + shape.factor * ux);
      close(m.points[i].y, x * Math.sin(angle) + shape.factor * uy);
    });
  });

  it("includes the member's own load: a simply supported beam under a uniform load sags 5wL⁴/384EI at midspan", () => {
    // v(x) = wx(L³ − 2Lx² + x³)/(24EI), 5wL⁴/(384EI) at L/2: Roark's Formulas for Stress and Strain, 7th ed.,
    // Table 8.1, case 2e, from memory. The end displacements alone (both zero) would draw a straight line.
    const [L, w] = [8, 12e3];
    const model: ModelInput = {
      nodes: [
        { id: "A", x: 0, y: 0, support: { ux: "fixed", uy: "fixed" } },
        { id: "B", x: L, y: 0, support: { uy: "fixed" } },
      ],
      members: [{ id: "m", start: "A", end: "B", E, A, I }],
      loadCases: [{ id: "W", loads: [{ kind: "distributed", member: "m", direction: "global-y", wStart: -w }] }],
    };
    const shape = deformedShape(model, resultOf(model), "W")!;
    const m = shape.members[0];
    m.x.forEach((x, i) => close(m.displacements[i].uy, (-w * x * (L ** 3 - 2 * L * x * x + x ** 3)) / (24 * EI)));
    close(shape.largest!.value, (5 * w * L ** 4) / (384 * EI));
    expect(shape.largest).toMatchObject({ member: "m" });
    close(shape.largest!.x!, L / 2);
    expect(shape.caption).toContain("at member m, 4.00 m from node A.");
    // In US customary units the caption alone changes: inches (exactly 25.4 mm) and feet (exactly 0.3048 m).
    const us = deformedShape(model, resultOf(model), "W", "us")!;
    expect(us.members).toEqual(shape.members);
    const inches = ((5 * w * L ** 4) / (384 * EI) / 0.0254).toPrecision(3);
    expect(us.caption).toContain(`largest displacement ${inches} in at member m, ${(4 / 0.3048).toFixed(2)} ft from node A.`);
  });

  it("kinks at a hinge: a link pinned to a cantilever's tip stays straight while the cantilever curves", () => {
    // Cantilever A–B under a tip load with a link B–C hinged at B and on a roller at C: the link carries nothing
    // (statics, common practice), so A–B deflects as case 1a of Roark's Table 8.1 (7th ed., from memory) and
    // B–C is the straight line from B's deflection to C's.
    const [L, P] = [3, 20e3];
    const model: ModelInput = {
      nodes: [
        { id: "A", x: 0, y: 0, support: { ux: "fixed", uy: "fixed", rz: "fixed" } },
        { id: "B", x: L, y: 0 },
        { id: "C", x: 2 * L, y: 0, support: { uy: "fixed" } },
      ],
      members: [
        { id: "ab", start: "A", end: "B", E, A, I },
        { id: "bc", start: "B", end: "C", E, A, I, releases: { startMoment: true } },
      ],
      loadCases: [{ id: "P", loads: [{ kind: "nodal", node: "B", fy: -P }] }],
    };
    const shape = deformedShape(model, resultOf(model), "P")!;
    const [ab, bc] = shape.members;
    ab.x.forEach((x, i) => close(ab.displacements[i].uy, (-P * x * x * (3 * L - x)) / (6 * EI)));
    const tip = (-P * L ** 3) / (3 * EI);
    bc.x.forEach((x, i) => close(bc.displacements[i].uy, tip * (1 - x / L)));
  });

  it("magnifies by 1, 2 or 5 × 10ⁿ, the largest such factor that draws the largest displacement within 8 % of the model", () => {
    // Common practice: a drawing's scale is a round number.
    const cases: [number, number][] = [
      [237, 200],
      [1000, 1000],
      [999.9, 500],
      [5, 5],
      [4.999, 2],
      [19.99, 10],
      [0.3, 0.2],
      [0.001, 0.001],
      [7.3e6, 5e6],
    ];
    for (const [raw, nice] of cases) close(niceFactor(raw), nice, 1e-12);
    const model = cantilever(4, 10e3);
    const shape = deformedShape(model, resultOf(model), "P")!;
    const drawn = shape.factor * shape.largest!.value;
    expect(drawn).toBeLessThanOrEqual(DEFORMED_FRACTION * 4 * (1 + 1e-12));
    expect(drawn).toBeGreaterThan((DEFORMED_FRACTION * 4) / 2.5);
  });

  it("draws no shape and says so when nothing is displaced, and none for an envelope", () => {
    const model: ModelInput = {
      ...cantilever(4, 10e3),
      loadCases: [{ id: "Z", name: "Nothing", loads: [] }],
      envelopes: [{ id: "env", of: ["Z"] }],
    };
    const result = resultOf(model);
    const shape = deformedShape(model, result, "Z")!;
    expect(shape).toMatchObject({ drawn: false, factor: 0, members: [] });
    expect(shape.caption).toBe("No deformed shape drawn: nothing is displaced under load case Z (Nothing).");
    expect(deformedShape(model, result, "env")).toBeUndefined();
    const html = renderToStaticMarkup(createElement(ModelDrawing, { model, deformed: shape }));
    expect(html).not.toContain("data-deformed");
    expect(html).toContain(shape.caption);
  });

  it("is the same from a stored result read back as from the analysis", () => {
    const model = modelOf("portal-frame");
    const fresh = resultOf(model);
    const restored = restoreResult(model, JSON.parse(JSON.stringify(resultToJson(fresh))));
    if (!restored.ok) throw new Error(JSON.stringify(restored.errors));
    for (const id of Object.keys(fresh.combinations))
      expect(deformedShape(model, restored.result, id)).toEqual(deformedShape(model, fresh, id));
  });

  it.each(readdirSync(root))(
    "%s: a shape under every load case and combination, never NaN; the drawing states its scale in the title, description and caption",
    (slug) => {
      const model = modelOf(slug);
      const result = resultOf(model);
      const ids = [...Object.keys(result.loadCases), ...Object.keys(result.combinations)];
      for (const id of ids) {
        const shape = deformedShape(model, result, id)!;
        expect({ id, drawn: shape.drawn }).toEqual({ id, drawn: true });
        const numbers = shape.members.flatMap((m) => [...m.x, ...m.points.flatMap((p) => [p.x, p.y])]);
        expect(numbers.every(Number.isFinite)).toBe(true);
        expect(shape.caption).not.toMatch(/NaN|Infinity/);
      }
      // Drawn under the first load case and the last result (a combination where there are any): rendering is the slow part.
      for (const id of new Set([ids[0], ids[ids.length - 1]])) {
        const shape = deformedShape(model, result, id)!;
        const scene = layoutModel(model, { deformed: shape });
        expect(scene.deformed!.members).toHaveLength(model.members!.length);
        expect(scene.summary).toContain(`deformed shape under ${shape.resultLabel}, displacements drawn × `);
        const html = renderToStaticMarkup(createElement(ModelDrawing, { model, deformed: shape }));
        expect(html).not.toMatch(/NaN|Infinity| style=/);
        expect(html.match(/<g [^>]*data-deformed=""/g)).toHaveLength(2); // the wide and the narrow layout
        expect(html).toContain(`<desc>${shape.caption.replace(/&/g, "&amp;")}</desc>`);
        expect(html).toContain(`data-factor="${shape.factor}"`);
      }
    },
  );
});
