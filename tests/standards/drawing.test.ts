/**
 * Drawings of a model and of a member diagram (lib/standards/drawing.ts, components/standards/): the geometry is
 * checked on the layout, and the SVG on the markup the server renders.
 */
import { describe, expect, it } from "vitest";
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { analyze, memberDiagram, memberEnvelope, type AnalysisResult, type ModelInput } from "@/lib/engine";
import { compileStandard } from "@/lib/standards";
import { diagramData, layoutDiagram, layoutModel, overlaps, type TextLabel } from "@/lib/standards/drawing";
import { ModelDrawing, type ModelDrawingProps } from "@/components/standards/model-drawing";
import { MemberDiagram, type MemberDiagramProps } from "@/components/standards/member-diagram";

const root = path.resolve(import.meta.dirname, "../../content/standards");

function modelOf(slug: string, inputs: Record<string, string> = {}): { model: ModelInput; title: string } {
  const files = readdirSync(path.join(root, slug)).filter((f) => f.endsWith(".mdx"));
  const out = compileStandard(readFileSync(path.join(root, slug, files.sort().at(-1)!), "utf8"));
  if (!out.ok) throw new Error(JSON.stringify(out.problems));
  const e = out.standard.evaluate(inputs);
  if (!e.ok) throw new Error(JSON.stringify(e));
  return { model: e.evaluation.model, title: out.standard.definition.title };
}

function resultOf(model: ModelInput): AnalysisResult {
  const out = analyze(model);
  if (!out.ok) throw new Error(JSON.stringify(out.errors));
  return out.result;
}

const drawModel = (props: ModelDrawingProps) => renderToStaticMarkup(createElement(ModelDrawing, props));
const drawDiagram = (props: MemberDiagramProps) => renderToStaticMarkup(createElement(MemberDiagram, props));
/** The markup of the wide layout only (the narrow one, for phones, follows it). */
const wide = (html: string) => html.slice(html.indexOf('data-layout="wide"'), html.indexOf('data-layout="narrow"'));
const count = (html: string, pattern: RegExp) => html.match(pattern)?.length ?? 0;

const E = 200e9;
const beam = (L: number, loads: ModelInput["loadCases"]): ModelInput => ({
  nodes: [
    { id: "A", x: 0, y: 0, support: { ux: "fixed", uy: "fixed" } },
    { id: "B", x: L, y: 0, support: { uy: "fixed" } },
  ],
  members: [{ id: "m", start: "A", end: "B", E, A: 0.006, I: 2e-4 }],
  loadCases: loads,
});

describe("the model drawing", () => {
  it.each([
    ["pinned", 0],
    ["fixed", 2],
  ])("draws the portal frame's three members and its two %s bases", (bases, fixed) => {
    const { model, title } = modelOf("portal-frame", { bases });
    const html = wide(drawModel({ model, name: title }));
    expect(count(html, /<line [^>]*data-member=/g)).toBe(3);
    expect(count(html, /data-support="/g)).toBe(2);
    expect(count(html, /data-support="fixed"/g)).toBe(fixed);
    expect(count(html, /data-support="pinned"/g)).toBe(2 - fixed);
  });

  it("names what it shows: nodes, members, supports and the load case", () => {
    const { model, title } = modelOf("portal-frame");
    const html = drawModel({ model, name: title });
    expect(html).toContain(`role="img"`);
    expect(html).toContain(`aria-label="${title} model: 4 nodes, 3 members, 2 supports; loads of case D (Dead)"`);
    expect(drawModel({ model, loadCase: null })).toContain("Structural model: 4 nodes, 3 members, 2 supports; no loads shown");
  });

  it("keeps the model's proportions: one scale for x and y", () => {
    // 12 m by 5 m: the drawn frame must be 12/5 as wide as it is tall, in any box it is fitted into.
    for (const [width, height] of [
      [640, 420],
      [300, 340],
      [200, 600],
    ]) {
      const scene = layoutModel(modelOf("portal-frame").model, { width, height });
      const xs = scene.members.flatMap((m) => [m.from.x, m.to.x]);
      const ys = scene.members.flatMap((m) => [m.from.y, m.to.y]);
      const drawnWidth = Math.max(...xs) - Math.min(...xs);
      const drawnHeight = Math.max(...ys) - Math.min(...ys);
      expect(drawnWidth / drawnHeight).toBeCloseTo(12 / 5, 6);
      expect(drawnWidth).toBeCloseTo(12 * scene.scale, 6);
      const { x, y, width: w, height: h } = scene.viewBox;
      for (const p of scene.members.flatMap((m) => [m.from, m.to])) {
        expect(p.x).toBeGreaterThan(x);
        expect(p.x).toBeLessThan(x + w);
        expect(p.y).toBeGreaterThan(y);
        expect(p.y).toBeLessThan(y + h);
      }
    }
  });

  it("draws loads as arrows with their values in kN, kN/m and kN·m", () => {
    const { model } = modelOf("portal-frame");
    expect(wide(drawModel({ model }))).toContain(">6.00 kN/m</text>");
    expect(wide(drawModel({ model, loadCase: "W_left" }))).toContain(">10.0 kN</text>");
    const couple = beam(6, [{ id: "C", loads: [{ kind: "couple", member: "m", position: 2, value: -12_500 }] }]);
    expect(wide(drawModel({ model: couple }))).toContain(">12.5 kN·m</text>");
    const trapezoid = beam(6, [
      { id: "T", loads: [{ kind: "distributed", member: "m", direction: "global-y", wStart: -2000, wEnd: -5000 }] },
    ]);
    expect(wide(drawModel({ model: trapezoid }))).toContain(">2.00–5.00 kN/m</text>");
  });

  it("draws truss members apart from frame members, and released ends as hinges", () => {
    const braced = wide(drawModel(modelOf("braced-bay", { bracing: "X" })));
    expect(count(braced, /data-kind="truss"/g)).toBe(5);
    expect(braced).not.toContain("data-hinge");
    const released = beam(6, []);
    released.members![0].releases = { startMoment: true, endMoment: true };
    released.nodes[0].support = { ux: "fixed", uy: "fixed", rz: "fixed" };
    released.nodes[1].support = { ux: "fixed", uy: "fixed", rz: "fixed" };
    expect(count(wide(drawModel({ model: released })), /data-hinge/g)).toBe(2);
  });

  it("draws rollers, springs and a settlement in their own symbols", () => {
    const model: ModelInput = {
      nodes: [
        { id: "A", x: 0, y: 0, support: { ux: "fixed", uy: { kind: "prescribed", value: -0.012, loadCase: "S" } } },
        { id: "B", x: 6, y: 0, support: { uy: "fixed" } },
        { id: "C", x: 12, y: 0, support: { uy: { kind: "spring", stiffness: 1e7 } } },
      ],
      members: [
        { id: "m1", start: "A", end: "B", E, A: 0.006, I: 2e-4 },
        { id: "m2", start: "B", end: "C", E, A: 0.006, I: 2e-4 },
      ],
      loadCases: [{ id: "S", loads: [] }],
    };
    const html = wide(drawModel({ model }));
    expect(html).toContain('data-support="pinned" data-node="A"');
    expect(html).toContain('data-support="roller" data-node="B"');
    expect(html).toContain('data-support="spring" data-node="C"');
    expect(html).toContain("Δy −12.0 mm");
  });

  it("keeps a 10 × 10 frame legible: members long enough to read and no printed labels on top of each other", () => {
    const { model } = modelOf("multi-storey-frame", { n_bays: "10", n_storeys: "10" });
    const scene = layoutModel(model);
    expect(scene.members).toHaveLength(210);
    const shortest = Math.min(...scene.members.map((m) => Math.hypot(m.to.x - m.from.x, m.to.y - m.from.y)));
    expect(shortest).toBeGreaterThanOrEqual(40);
    // The clash check itself sees two labels printed on top of each other.
    const a: TextLabel = { x: 0, y: 0, text: "20.0 kN/m", anchor: "start" };
    expect(clashes([a, { ...a, x: 30, y: 4 }])).toHaveLength(1);
    const labels = scene.loads.flatMap((l) => (l.label ? [l.label] : []));
    expect(labels.length).toBeGreaterThan(0);
    expect(clashes(labels)).toEqual([]);
  });

  it("prints no label on another in the starting standards' drawings", () => {
    for (const slug of readdirSync(root)) {
      const scene = layoutModel(modelOf(slug).model);
      const labels: TextLabel[] = [
        ...scene.members.flatMap((m) => (m.label ? [m.label] : [])),
        ...scene.nodeLabels,
        ...scene.loads.flatMap((l) => (l.label ? [l.label] : [])),
      ];
      expect({ slug, clashes: clashes(labels) }).toEqual({ slug, clashes: [] });
    }
  });

  it("never prints NaN or Infinity, nor a style attribute (the Content-Security-Policy forbids them)", () => {
    const degenerate: ModelInput[] = [
      { nodes: [{ id: "A", x: 0, y: 0, support: { ux: "fixed", uy: "fixed", rz: "fixed" } }] },
      { nodes: [{ id: "A", x: 0, y: 0 }], members: [] },
      beam(6, []),
      beam(6, [{ id: "Z", loads: [{ kind: "distributed", member: "m", direction: "global-y", wStart: 0 }] }]),
      beam(500, [{ id: "P", loads: [{ kind: "point", member: "m", direction: "global-y", position: 1, value: -1 }] }]),
      beam(0.01, [{ id: "W", loads: [{ kind: "distributed", member: "m", direction: "local-x", wStart: 3 }] }]),
      {
        nodes: [
          { id: "A", x: 0, y: 0 },
          { id: "B", x: 0, y: 0 },
        ],
        members: [{ id: "z", start: "A", end: "B", E, A: 1, I: 1 }],
      },
    ];
    const starting = readdirSync(root).flatMap((slug) => {
      const { model } = modelOf(slug);
      return (model.loadCases ?? []).map((c) => ({ model, loadCase: c.id }));
    });
    for (const props of [...degenerate.map((model) => ({ model })), ...starting]) {
      const html = drawModel(props);
      expect(html).not.toMatch(/NaN|Infinity/);
      expect(html).not.toMatch(/ style=/);
    }
  });
});

function clashes(labels: ReadonlyArray<TextLabel>): string[] {
  const out: string[] = [];
  labels.forEach((a, i) => labels.slice(i + 1).forEach((b) => overlaps(a, b) && out.push(`${a.text} / ${b.text}`)));
  return out;
}

describe("the member diagram", () => {
  it("labels a simply supported beam's moment under a uniform load wL²/8 at midspan, drawn on the tension side", () => {
    // M_max = wL²/8 at L/2 = 12 kN/m × (8 m)² / 8 = 96 kN·m: AISC Steel Construction Manual, 15th ed., Table 3-23, case 1.
    const { model } = modelOf("simply-supported-beam", { L: "8 m", w_D: "12 kN/m" });
    const d = memberDiagram(resultOf(model), "beam", "D", { points: 41 });
    const html = drawDiagram({ diagram: d, of: "M", startNode: "A", endNode: "B" });
    expect(html).toContain(">M max 96.0 kN·m at x = 4.00 m</text>");
    expect(html).toContain("tension side");
    const scene = layoutDiagram(diagramData(d, "M")!);
    const peak = scene.marks.find((m) => m.which === "max")!;
    expect(scene.positiveBelow).toBe(true);
    expect(peak.cy).toBeGreaterThan(scene.baseline.from.y);
    expect(peak.cx).toBeCloseTo((scene.baseline.from.x + scene.baseline.to.x) / 2, 6);
    expect(scene.marks.map((m) => m.which)).toEqual(["max"]);
  });

  it("shows a point load as a vertical step in the shear, as large as the load", () => {
    // V jumps by P at the load; either side V = Pb/L and −Pa/L (AISC Manual, 15th ed., Table 3-23, case 7).
    const { model } = modelOf("simply-supported-beam", { L: "8 m", w_D: "0 kN/m", w_L: "0 kN/m", P_L: "40 kN", a: "2 m" });
    const d = memberDiagram(resultOf(model), "beam", "L");
    const data = diagramData(d, "V")!;
    const i = data.x.findIndex((x, k) => k > 0 && x === data.x[k - 1]);
    expect(data.x[i]).toBeCloseTo(2, 9);
    expect(data.curves[0][i - 1]).toBeCloseTo(30_000, 6);
    expect(data.curves[0][i]).toBeCloseTo(-10_000, 6);
    const points = layoutDiagram(data).points[0];
    const steps = points.filter((p, k) => k > 0 && Math.abs(p.x - points[k - 1].x) < 1e-9 && Math.abs(p.y - points[k - 1].y) > 1);
    expect(steps).toHaveLength(1);
    const html = drawDiagram({ diagram: d, of: "V" });
    expect(html).toContain(">V max 30.0 kN at x = 0.00 m</text>");
    expect(html).toContain(">V min −10.0 kN at x = 2.00 m</text>");
  });

  it("draws an envelope as its max and min curves, each extreme named with the result that gives it", () => {
    const { model } = modelOf("two-span-beam");
    const html = drawDiagram({ diagram: memberEnvelope(resultOf(model), "span1", "live"), of: "M" });
    expect(count(wide(html), /data-curve="/g)).toBe(2);
    expect(html).toMatch(/>M max [\d.]+ kN·m at x = [\d.]+ m \((L1|L_both)\)<\/text>/);
    expect(html).toMatch(/>M min −[\d.]+ kN·m at x = 6.00 m \((L1|L2|L_both)\)<\/text>/);
  });

  it("says when a quantity is zero along the member, and prints no NaN or Infinity", () => {
    const braced = modelOf("braced-bay").model;
    const result = resultOf(braced);
    const html = drawDiagram({ diagram: memberDiagram(result, "brace_AC", "D"), of: "M" });
    expect(html).toContain("M = 0 along the member");
    const unloaded = resultOf(beam(6, [{ id: "0", loads: [] }]));
    for (const of of ["N", "V", "M", "deflection"] as const) {
      const markup = drawDiagram({ diagram: memberDiagram(unloaded, "m", "0"), of });
      expect(markup).not.toMatch(/NaN|Infinity| style=/);
    }
    const long = resultOf(
      beam(500, [{ id: "P", loads: [{ kind: "point", member: "m", direction: "global-y", position: 1, value: -1 }] }]),
    );
    for (const of of ["N", "V", "M", "deflection"] as const)
      expect(drawDiagram({ diagram: memberDiagram(long, "m", "P"), of })).not.toMatch(/NaN|Infinity| style=/);
  });
});
