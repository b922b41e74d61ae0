/**
 * Geometry for drawing a frame model and a member diagram as SVG: numbers and path strings only, no React, so
 * the layout is tested without rendering. Screen axes: X right, Y down (the model's y is flipped). Symbols,
 * arrows and text have fixed sizes in viewBox units; the model's own scale is one number for x and y alike, so
 * the geometry is never distorted, and the viewBox is the bounding box of everything drawn plus a margin.
 */
import { resultUnit, type DisplayUnits, type ResultKind } from "./display-units";
import type { DiagramQuantity, Extreme, LoadInput, MemberDiagram, MemberEnvelope, ModelInput, Restraint } from "@/lib/engine";
import { formatSignificant } from "./format";
import { formatFactor, type DeformedShape } from "./deformed-shape";

export interface Point {
  readonly x: number;
  readonly y: number;
}
export interface TextLabel extends Point {
  readonly text: string;
  readonly anchor: "start" | "middle" | "end";
}
export interface ViewBox {
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
}
export interface Circle {
  readonly cx: number;
  readonly cy: number;
  readonly r: number;
}

/** Text size in viewBox units; the estimate of a label's width (for the margins) assumes a sans face. */
export const FONT_SIZE = 11;
const CHAR_WIDTH = 0.6 * FONT_SIZE;
/**
 * Sizes in viewBox units, chosen so a support reads at a glance beside 11-unit text. Nodal and point loads share
 * one arrow length (the value is printed, not scaled); the largest distributed load's arrows are `udl` long, the
 * others in proportion, at least 40 % of it.
 */
const SIZE = { symbol: 14, head: 7, arrow: 32, udl: 26, hinge: 3.5, margin: 8 } as const;

const add = (a: Point, b: Point): Point => ({ x: a.x + b.x, y: a.y + b.y });
const scaled = (a: Point, k: number): Point => ({ x: a.x * k, y: a.y * k });
const along = (p: Point, d: Point, k: number): Point => add(p, scaled(d, k));
/** Perpendicular in screen axes (a quarter turn clockwise on screen). */
const perp = (a: Point): Point => ({ x: -a.y, y: a.x });
const finite = (v: number) => (Number.isFinite(v) ? v : 0);
const round = (v: number) => Math.round(finite(v) * 100) / 100 + 0;
const coords = (p: Point) => `${round(p.x)} ${round(p.y)}`;
const polyline = (ps: ReadonlyArray<Point>) => ps.map((p, i) => `${i === 0 ? "M" : "L"}${coords(p)}`).join(" ");
const closed = (ps: ReadonlyArray<Point>) => `${polyline(ps)} Z`;
const mapCircle = (p: Point) => ({ cx: round(p.x), cy: round(p.y) });

/** A label's box, estimated from its length: the server cannot measure text. */
function textBox(t: TextLabel) {
  const w = t.text.length * CHAR_WIDTH;
  const left = t.anchor === "start" ? t.x : t.anchor === "middle" ? t.x - w / 2 : t.x - w;
  return { left, right: left + w, top: t.y - FONT_SIZE * 0.8, bottom: t.y + FONT_SIZE * 0.25 };
}

/** Running bounding box of what is drawn, text included, for the viewBox. */
function boundsTracker() {
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  const point = (p: Point) => {
    if (!Number.isFinite(p.x) || !Number.isFinite(p.y)) return;
    minX = Math.min(minX, p.x);
    maxX = Math.max(maxX, p.x);
    minY = Math.min(minY, p.y);
    maxY = Math.max(maxY, p.y);
  };
  return {
    points(ps: ReadonlyArray<Point>) {
      ps.forEach(point);
    },
    text(t: TextLabel) {
      const box = textBox(t);
      point({ x: box.left, y: box.top });
      point({ x: box.right, y: box.bottom });
    },
    viewBox(margin: number): ViewBox {
      if (minX > maxX) return { x: 0, y: 0, width: 100, height: 50 };
      return {
        x: round(minX - margin),
        y: round(minY - margin),
        width: round(maxX - minX + 2 * margin),
        height: round(maxY - minY + 2 * margin),
      };
    },
  };
}
type Bounds = ReturnType<typeof boundsTracker>;

/** A label just beyond `p` in the direction `out`, anchored so it grows away from `p`. */
function labelBeyond(p: Point, out: Point, text: string, gap = 4): TextLabel {
  const at = along(p, out, gap);
  if (Math.abs(out.y) >= Math.abs(out.x))
    return { x: at.x, y: out.y < 0 ? at.y : at.y + FONT_SIZE * 0.8, text, anchor: "middle" };
  return { x: at.x, y: at.y + FONT_SIZE * 0.35, text, anchor: out.x > 0 ? "start" : "end" };
}

/** Whether two labels' estimated boxes overlap. */
export function overlaps(a: TextLabel, b: TextLabel): boolean {
  const [p, q] = [textBox(a), textBox(b)];
  return p.left < q.right && q.left < p.right && p.top < q.bottom && q.top < p.bottom;
}

/** Three significant figures, as the drawings print every value. */
export const formatNumber = (v: number) => formatSignificant(finite(v) + 0, 3).replace("-", "−");
const magnitude = (si: number, unit: string) => `${formatNumber(Math.abs(si) / 1000)} ${unit}`;

/** An arrow whose tip is at `tip`, pointing along the unit vector `dir`, `length` long. */
function arrow(tip: Point, dir: Point, length: number, b: Bounds): { shaft: string; head: string; tail: Point } {
  const tail = along(tip, dir, -length);
  const base = along(tip, dir, -SIZE.head);
  const n = perp(dir);
  const head = [tip, along(base, n, SIZE.head / 2.6), along(base, n, -SIZE.head / 2.6)];
  b.points([tail, ...head]);
  return { shaft: polyline([tail, base]), head: closed(head), tail };
}

/** A 270° arc round `c` with a head at its end: counter-clockwise on screen when `ccw`. */
function curvedArrow(c: Point, radius: number, ccw: boolean, b: Bounds): { shaft: string; head: string; labelAt: Point } {
  const sign = ccw ? 1 : -1;
  const start = ccw ? -Math.PI / 2 : (3 * Math.PI) / 2;
  const end = start + sign * 1.5 * Math.PI;
  const at = (t: number) => ({ x: c.x + radius * Math.cos(t), y: c.y - radius * Math.sin(t) });
  const tangent = { x: -Math.sin(end) * sign, y: -Math.cos(end) * sign };
  const tip = at(end);
  const base = along(tip, tangent, -SIZE.head);
  const n = perp(tangent);
  const head = [tip, along(base, n, SIZE.head / 2.6), along(base, n, -SIZE.head / 2.6)];
  b.points([at(start), at(start + sign * 0.5 * Math.PI), at(start + sign * Math.PI), ...head]);
  const shaft = `M${coords(at(start))} A${radius} ${radius} 0 1 ${ccw ? 0 : 1} ${coords(base)}`;
  return { shaft, head: closed(head), labelAt: { x: c.x + radius * 0.75, y: c.y - radius * 0.75 } };
}

// ————————————————————————————————————— the model —————————————————————————————————————

export interface DrawnMember {
  readonly id: string;
  readonly kind: "frame" | "truss";
  readonly from: Point;
  readonly to: Point;
  readonly label?: TextLabel;
}
export interface DrawnSupport {
  readonly node: string;
  /** The parts drawn, joined with " + ": fixed, pinned, roller, guided, spring, rotational-spring, rotation-fixed. */
  readonly kind: string;
  /** Open strokes (ground lines, zigzags, hatching) and closed outlines (triangles, blocks). */
  readonly strokes: string;
  readonly outlines: string;
  readonly wheels: ReadonlyArray<Circle>;
  /** An imposed displacement (settlement) in the load case shown. */
  readonly notes: ReadonlyArray<TextLabel>;
}
export interface DrawnLoad {
  readonly kind: LoadInput["kind"];
  /** The member or node loaded. */
  readonly on: string;
  readonly shafts: string;
  readonly heads: string;
  /** Omitted where the same value is already printed and this one would overlap a label. */
  readonly label?: TextLabel;
}
export interface ModelScene {
  readonly viewBox: ViewBox;
  /** viewBox units per metre, the same in x and y. */
  readonly scale: number;
  readonly members: ReadonlyArray<DrawnMember>;
  readonly hinges: ReadonlyArray<Circle>;
  readonly supports: ReadonlyArray<DrawnSupport>;
  readonly loads: ReadonlyArray<DrawnLoad>;
  readonly nodeLabels: ReadonlyArray<TextLabel>;
  readonly loadCase?: { readonly id: string; readonly name?: string };
  readonly hasTruss: boolean;
  /** The deformed shape, one dashed path per member in viewBox units, and the sentence that states its scale. */
  readonly deformed?: {
    readonly members: ReadonlyArray<{ readonly id: string; readonly d: string; readonly points: ReadonlyArray<Point> }>;
    readonly caption: string;
  };
  /** One sentence for assistive technology: what is drawn. */
  readonly summary: string;
}
export interface ModelDrawingOptions {
  /** The load case whose loads are drawn; default the first, `null` for none. */
  readonly loadCase?: string | null;
  /** The box (viewBox units) the model's nodes are fitted into before symbols and labels are added. */
  readonly width?: number;
  readonly height?: number;
  /** Node and member ids; by default shown while the model is small enough for them to be read. */
  readonly labels?: boolean;
  /** What the model is, for the summary: "Portal frame" → "Portal frame model: …". */
  readonly name?: string;
  /** A deformed shape (lib/standards/deformed-shape.ts) to draw over the model, in the model's coordinates. */
  readonly deformed?: DeformedShape;
}

/** Shortest member drawn at least this long per 640 units of width: a many-storey frame grows its viewBox rather than its clutter. */
const MIN_MEMBER = 48;

/** One scale for x and y: fit the nodes into width × height, then enlarge (at most 3×) until short members read. */
export function fitScale(points: ReadonlyArray<Point>, shortest: number, width: number, height: number): number {
  const xs = points.map((p) => p.x);
  const ys = points.map((p) => p.y);
  const dx = points.length ? Math.max(...xs) - Math.min(...xs) : 0;
  const dy = points.length ? Math.max(...ys) - Math.min(...ys) : 0;
  let s = Math.min(dx > 0 ? width / dx : Infinity, dy > 0 ? height / dy : Infinity);
  if (!Number.isFinite(s)) s = shortest > 0 ? width / shortest : 1;
  const least = (MIN_MEMBER * width) / 640;
  if (shortest > 0 && shortest * s < least) s = Math.min(least / shortest, 3 * s);
  return s;
}

type Kind = "free" | "fixed" | "spring";
const restraintKind = (r: Restraint | undefined): Kind =>
  r === undefined || r === "free" ? "free" : r === "fixed" ? "fixed" : r.kind === "spring" ? "spring" : "fixed";

/** Hatching on the far side of a ground line from `a` to `b`, the far side being `away`. */
function hatch(a: Point, b: Point, away: Point): Point[][] {
  const length = Math.hypot(b.x - a.x, b.y - a.y);
  const dir = scaled({ x: b.x - a.x, y: b.y - a.y }, 1 / length);
  const ticks: Point[][] = [];
  for (let t = 2; t <= length; t += 4) {
    const p = along(a, dir, t);
    ticks.push([p, add(along(p, away, 4), scaled(dir, -4))]);
  }
  return ticks;
}

function drawSupport(
  id: string,
  at: Point,
  support: NonNullable<ModelInput["nodes"][number]["support"]>,
  memberDir: Point,
  shownCase: string | undefined,
  b: Bounds,
): DrawnSupport {
  const [ux, uy, rz] = [support.ux, support.uy, support.rz].map(restraintKind);
  const strokes: Point[][] = [];
  const outlines: Point[][] = [];
  const wheels: Circle[] = [];
  const parts: string[] = [];
  // Symbols go on the side away from the members: below a column base, beside a beam's end.
  const below: Point = { x: 0, y: memberDir.y > 0.3 ? -1 : 1 };
  const beside: Point = { x: memberDir.x < -0.3 ? 1 : -1, y: 0 };
  const ground = (p: Point, away: Point, half: number) => {
    const n = perp(away);
    const [g1, g2] = [along(p, n, -half), along(p, n, half)];
    strokes.push([g1, g2], ...hatch(g1, g2, away));
  };
  const triangle = (kind: "pinned" | "roller" | "guided", away: Point) => {
    const [wheeled, block] = [kind !== "pinned", kind === "guided"];
    parts.push(kind);
    const n = perp(away);
    const base = along(at, away, SIZE.symbol);
    if (block)
      outlines.push([
        along(at, n, -SIZE.symbol * 0.45),
        along(base, n, -SIZE.symbol * 0.45),
        along(base, n, SIZE.symbol * 0.45),
        along(at, n, SIZE.symbol * 0.45),
      ]);
    else outlines.push([at, along(base, n, -SIZE.symbol * 0.6), along(base, n, SIZE.symbol * 0.6)]);
    if (!wheeled) return ground(base, away, SIZE.symbol * 0.9);
    for (const k of [-0.35, 0.35]) {
      const c = along(along(base, away, 2.6), n, k * SIZE.symbol);
      wheels.push({ cx: round(c.x), cy: round(c.y), r: 2.6 });
    }
    ground(along(base, away, 5.2), away, SIZE.symbol * 0.9);
  };
  const spring = (away: Point) => {
    parts.push("spring");
    const n = perp(away);
    const zig = [at, along(at, away, 3)];
    for (let i = 1; i <= 6; i++) zig.push(along(along(at, away, 3 + i * 3), n, i === 6 ? 0 : i % 2 ? 4 : -4));
    zig.push(along(at, away, 24));
    strokes.push(zig);
    ground(along(at, away, 24), away, SIZE.symbol * 0.7);
  };
  if (ux === "fixed" && uy === "fixed" && rz === "fixed") {
    // A wall across the direction the members leave in, snapped to the nearer axis.
    const away =
      Math.abs(memberDir.y) >= Math.abs(memberDir.x)
        ? { x: 0, y: memberDir.y > 0 ? -1 : 1 }
        : { x: memberDir.x > 0 ? -1 : 1, y: 0 };
    ground(at, away, SIZE.symbol);
    parts.push("fixed");
  } else {
    // A roller held against rotation is a block on wheels (guided).
    if (ux === "fixed" && uy === "fixed") triangle("pinned", below);
    else if (uy === "fixed") triangle(rz === "fixed" ? "guided" : "roller", below);
    else if (ux === "fixed") triangle(rz === "fixed" ? "guided" : "roller", beside);
    if (ux === "spring") spring(beside);
    if (uy === "spring") spring(below);
    if (rz === "spring") {
      parts.push("rotational-spring");
      const coil = Array.from({ length: 25 }, (_, i) => {
        const t = (i / 24) * 2.5 * Math.PI;
        return { x: at.x + (3 + i * 0.3) * Math.cos(t), y: at.y - (3 + i * 0.3) * Math.sin(t) };
      });
      strokes.push(coil);
      ground(along(coil[coil.length - 1], { x: 0, y: 1 }, 4), { x: 0, y: 1 }, 6);
    }
    if (rz === "fixed" && ux !== "fixed" && uy !== "fixed") {
      parts.push("rotation-fixed");
      outlines.push([-1, 1, 1, -1].map((k, i) => add(at, { x: k * 4, y: (i < 2 ? -1 : 1) * 4 })));
    }
  }
  const notes: TextLabel[] = [];
  (["ux", "uy", "rz"] as const).forEach((dof) => {
    const r = support[dof];
    if (typeof r !== "object" || r.kind !== "prescribed" || r.value === 0) return;
    if (r.loadCase !== undefined && r.loadCase !== shownCase) return;
    const text = dof === "rz" ? `θ ${formatNumber(r.value)} rad` : `Δ${dof.slice(1)} ${formatNumber(r.value * 1000)} mm`;
    notes.push(labelBeyond(along(at, below, SIZE.symbol + 10 + notes.length * FONT_SIZE), below, text));
  });
  [...strokes, ...outlines].forEach((ps) => b.points(ps));
  wheels.forEach((w) =>
    b.points([
      { x: w.cx - w.r, y: w.cy - w.r },
      { x: w.cx + w.r, y: w.cy + w.r },
    ]),
  );
  notes.forEach(b.text);
  return {
    node: id,
    kind: parts.join(" + "),
    strokes: strokes.map(polyline).join(" "),
    outlines: outlines.map(closed).join(" "),
    wheels,
    notes,
  };
}

interface Geometry {
  readonly from: Point;
  readonly to: Point;
  /** Unit vector from start to end, screen axes. */
  readonly u: Point;
  /** Length in metres. */
  readonly length: number;
}

/** Everything about a load but where it sits: the arrows drawn for it and its label. */
function drawLoads(
  model: ModelInput,
  loads: ReadonlyArray<LoadInput>,
  nodes: Map<string, Point>,
  geometry: Map<string, Geometry>,
  scale: number,
  b: Bounds,
  placed: TextLabel[],
): DrawnLoad[] {
  const out: DrawnLoad[] = [];
  const stacked = new Map<string, number>();
  const g = 9.80665;
  const spans: { on: string; direction: string; wStart: number; wEnd: number; from?: number; to?: number; note: string }[] = [];
  for (const load of loads) {
    if (load.kind === "distributed")
      spans.push({ on: load.member, ...load, wEnd: load.wEnd ?? load.wStart, note: load.projected ? " (projected)" : "" });
    if (load.kind === "self-weight")
      for (const m of model.members ?? [])
        if (m.density) {
          const w = -(load.factor ?? 1) * m.density * m.A * g;
          spans.push({ on: m.id, direction: "global-y", wStart: w, wEnd: w, note: " self-weight" });
        }
  }
  // Loads on one storey must not reach the next: at most a third of the shortest member.
  const shortest = Math.min(...[...geometry.values()].map((m) => m.length * scale).filter((l) => l > 0));
  const udlHeight = Math.max(12, Math.min(SIZE.udl, shortest / 3));
  const wMax = Math.max(0, ...spans.map((s) => Math.max(Math.abs(s.wStart), Math.abs(s.wEnd))));
  const directionOf = (direction: string, m: Geometry): Point =>
    direction === "local-x"
      ? m.u
      : direction === "local-y"
        ? scaled(perp(m.u), -1)
        : direction === "global-x"
          ? { x: 1, y: 0 }
          : { x: 0, y: -1 };
  const pointOn = (m: Geometry, at: number) => along(m.from, m.u, at * scale);
  const push = (kind: LoadInput["kind"], on: string, shafts: string[], heads: string[], label: TextLabel) => {
    const repeated = placed.some((o) => o.text === label.text) && placed.some((o) => overlaps(o, label));
    if (!repeated) {
      b.text(label);
      placed.push(label);
    }
    out.push({ kind, on, shafts: shafts.join(" "), heads: heads.join(" "), ...(repeated ? {} : { label }) });
  };
  for (const s of spans) {
    const m = geometry.get(s.on);
    if (!m || (s.wStart === 0 && s.wEnd === 0)) continue;
    const dir = directionOf(s.direction, m);
    const dominant = Math.abs(s.wStart) >= Math.abs(s.wEnd) ? Math.sign(s.wStart) : Math.sign(s.wEnd);
    const force = scaled(dir, dominant);
    const parallel = Math.abs(m.u.x * dir.y - m.u.y * dir.x) < 0.2;
    // A load along the member is drawn beside it; loads on the same side of one member stack outwards.
    // Beside a member on its local +y side, away from the member's own label.
    const side = parallel ? scaled(perp(m.u), -1) : scaled(force, -1);
    const normal = scaled(perp(m.u), -1);
    const key = `${s.on}:${parallel ? "along" : Math.sign(side.x * normal.x + side.y * normal.y)}`;
    const offset = stacked.get(key) ?? (parallel ? 6 : 0);
    const a = s.from ?? 0;
    const z = s.to ?? m.length;
    const height = udlHeight * Math.min(1, Math.max(0.4, Math.max(Math.abs(s.wStart), Math.abs(s.wEnd)) / wMax));
    const k = height / Math.max(Math.abs(s.wStart), Math.abs(s.wEnd));
    const count = Math.max(2, Math.round(((z - a) * scale) / 18) + 1);
    const shafts: string[] = [];
    const heads: string[] = [];
    const tails: Point[] = [];
    for (let i = 0; i < count; i++) {
      const t = a + ((z - a) * i) / (count - 1);
      const w = s.wStart + ((s.wEnd - s.wStart) * (t - a)) / (z - a || 1);
      const base = along(pointOn(m, t), side, offset);
      const length = parallel ? 10 : Math.abs(w) * k;
      const tip = parallel ? along(base, force, 5) : base;
      tails.push(parallel ? along(base, side, 0) : along(tip, dir, -w * k));
      if (length < SIZE.head * 0.8) continue;
      const drawn = arrow(tip, scaled(dir, Math.sign(w)), length, b);
      shafts.push(drawn.shaft);
      heads.push(drawn.head);
    }
    if (!parallel) {
      shafts.push(polyline(tails));
      b.points(tails);
    }
    const extent = parallel ? 4 : height;
    const sameSign = Math.sign(s.wStart) * Math.sign(s.wEnd) >= 0;
    const value = (w: number) => formatNumber((sameSign ? Math.abs(w) : w) / 1000);
    const text = `${s.wStart === s.wEnd ? value(s.wStart) : `${value(s.wStart)}–${value(s.wEnd)}`} kN/m${s.note}`;
    const middle = along(pointOn(m, (a + z) / 2), side, offset + extent);
    // Clear of the arrows under a sloping member: half the text's width times the slope.
    const slope = Math.abs(side.y) >= Math.abs(side.x) ? Math.abs(m.u.y / (m.u.x || 1)) : Math.abs(m.u.x / (m.u.y || 1));
    const clear = 3 + Math.min(40, ((text.length * CHAR_WIDTH) / 2) * slope);
    stacked.set(key, offset + extent + clear + FONT_SIZE + 4);
    push(s.note === " self-weight" ? "self-weight" : "distributed", s.on, shafts, heads, labelBeyond(middle, side, text, clear));
  }
  for (const load of loads) {
    if (load.kind === "point" || load.kind === "couple") {
      const m = geometry.get(load.member);
      if (!m || load.value === 0) continue;
      const at = pointOn(m, load.position);
      if (load.kind === "couple") {
        const c = curvedArrow(at, 12, load.value > 0, b);
        push(
          "couple",
          load.member,
          [c.shaft],
          [c.head],
          labelBeyond(c.labelAt, { x: 0.7, y: -0.7 }, magnitude(load.value, "kN·m")),
        );
        continue;
      }
      const dir = scaled(directionOf(load.direction, m), Math.sign(load.value));
      const parallel = Math.abs(m.u.x * dir.y - m.u.y * dir.x) < 0.2;
      const tip = parallel ? along(at, perp(m.u), 6) : at;
      const drawn = arrow(tip, dir, parallel ? SIZE.arrow * 0.6 : SIZE.arrow, b);
      push(
        "point",
        load.member,
        [drawn.shaft],
        [drawn.head],
        labelBeyond(drawn.tail, scaled(dir, -1), magnitude(load.value, "kN")),
      );
    }
    if (load.kind === "nodal") {
      const at = nodes.get(load.node);
      if (!at) continue;
      for (const [f, dir] of [
        [load.fx ?? 0, { x: 1, y: 0 }],
        [load.fy ?? 0, { x: 0, y: -1 }],
      ] as const) {
        if (f === 0) continue;
        const d = scaled(dir, Math.sign(f));
        const drawn = arrow(along(at, d, -3), d, SIZE.arrow, b);
        push("nodal", load.node, [drawn.shaft], [drawn.head], labelBeyond(drawn.tail, scaled(d, -1), magnitude(f, "kN")));
      }
      if (load.mz) {
        const c = curvedArrow(at, 12, load.mz > 0, b);
        push("nodal", load.node, [c.shaft], [c.head], labelBeyond(c.labelAt, { x: 0.7, y: -0.7 }, magnitude(load.mz, "kN·m")));
      }
    }
  }
  return out;
}

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? "" : "s"}`;

/** Everything needed to draw a model: members, hinges, supports, the loads of one case, labels and the viewBox. */
export function layoutModel(model: ModelInput, options: ModelDrawingOptions = {}): ModelScene {
  const raw = model.nodes.filter((n) => Number.isFinite(n.x) && Number.isFinite(n.y));
  const ends = (model.members ?? []).map((m) => ({
    m,
    a: raw.find((n) => n.id === m.start),
    z: raw.find((n) => n.id === m.end),
  }));
  const lengths = ends.flatMap(({ a, z }) => (a && z ? [Math.hypot(z.x - a.x, z.y - a.y)] : [])).filter((l) => l > 0);
  const scale = fitScale(raw, lengths.length ? Math.min(...lengths) : 0, options.width ?? 640, options.height ?? 420);
  const nodes = new Map(raw.map((n) => [n.id, { x: n.x * scale, y: -n.y * scale }]));
  const b = boundsTracker();
  b.points([...nodes.values()]);
  const labels = options.labels ?? (raw.length <= 30 && ends.length <= 40);
  const geometry = new Map<string, Geometry>();
  const members: DrawnMember[] = [];
  const hinges: Circle[] = [];
  const leaving = new Map<string, Point>();
  const placed: TextLabel[] = [];
  for (const { m, a, z } of ends) {
    if (!a || !z) continue;
    const from = nodes.get(a.id)!;
    const to = nodes.get(z.id)!;
    const length = Math.hypot(z.x - a.x, z.y - a.y);
    const u = length > 0 ? { x: (to.x - from.x) / (length * scale), y: (to.y - from.y) / (length * scale) } : { x: 1, y: 0 };
    geometry.set(m.id, { from, to, u, length });
    leaving.set(a.id, add(leaving.get(a.id) ?? { x: 0, y: 0 }, u));
    leaving.set(z.id, add(leaving.get(z.id) ?? { x: 0, y: 0 }, scaled(u, -1)));
    const kind = m.kind ?? "frame";
    // Local −y: below a beam drawn left to right, where its loads are not.
    // Mid-length, unless that lands on a label already placed (crossing braces): then a third of the way along.
    const label = labels
      ? [0.5, 0.3, 0.7]
          .map((t) => labelBeyond(along(along(from, u, length * scale * t), perp(u), 3), perp(u), m.id, 3))
          .find((l, i) => i === 2 || !placed.some((o) => overlaps(o, l)))
      : undefined;
    if (label) {
      b.text(label);
      placed.push(label);
    }
    members.push({ id: m.id, kind, from, to, label });
    if (kind === "frame" && length > 0)
      for (const [released, p, d] of [
        [m.releases?.startMoment, from, u],
        [m.releases?.endMoment, to, scaled(u, -1)],
      ] as const)
        if (released) hinges.push({ ...mapCircle(along(p, d, SIZE.hinge + 1.5)), r: SIZE.hinge });
  }
  const cases = model.loadCases ?? [];
  const shown =
    options.loadCase === null
      ? undefined
      : options.loadCase === undefined
        ? cases[0]
        : cases.find((c) => c.id === options.loadCase);
  const supports: DrawnSupport[] = [];
  for (const n of raw) {
    const direction = leaving.get(n.id) ?? { x: 0, y: 0 };
    const size = Math.hypot(direction.x, direction.y);
    const unit = size > 1e-9 ? scaled(direction, 1 / size) : { x: 0, y: -1 };
    if (n.support && [n.support.ux, n.support.uy, n.support.rz].some((r) => restraintKind(r) !== "free"))
      supports.push(drawSupport(n.id, nodes.get(n.id)!, n.support, unit, shown?.id, b));
  }
  const loads = shown ? drawLoads(model, shown.loads ?? [], nodes, geometry, scale, b, placed) : [];
  const deformed = options.deformed && {
    members: options.deformed.members.map((m) => {
      const points = m.points.map((p) => ({ x: finite(p.x * scale), y: finite(-p.y * scale) }));
      b.points(points);
      return { id: m.id, d: polyline(points), points };
    }),
    caption: options.deformed.caption,
  };
  const nodeLabels = labels
    ? raw.map((n) => {
        const at = nodes.get(n.id)!;
        const d = leaving.get(n.id) ?? { x: 0, y: 0 };
        // Into the corner no member leaves towards; above a support, whose symbol is below.
        const t: TextLabel = {
          x: at.x + (d.x > 0.1 ? -5 : 5),
          y: at.y + (d.y < -0.1 && !n.support ? FONT_SIZE + 3 : -5),
          text: n.id,
          anchor: d.x > 0.1 ? "end" : "start",
        };
        b.text(t);
        return t;
      })
    : [];
  const what = `${options.name ? `${options.name} model` : "Structural model"}: ${plural(raw.length, "node")}, ${plural(members.length, "member")}, ${plural(supports.length, "support")}`;
  const loadsShown = shown ? `loads of case ${shown.id}${shown.name ? ` (${shown.name})` : ""}` : "no loads shown";
  const shape = options.deformed;
  const deformedShown = !shape
    ? ""
    : shape.drawn
      ? `; deformed shape under ${shape.resultLabel}, displacements drawn ${formatFactor(shape.factor)}`
      : `; no deformed shape under ${shape.resultLabel}`;
  const summary = `${what}; ${loadsShown}${deformedShown}`;
  return {
    viewBox: b.viewBox(SIZE.margin),
    scale,
    members,
    hinges,
    supports,
    loads,
    nodeLabels,
    loadCase: shown ? { id: shown.id, ...(shown.name ? { name: shown.name } : {}) } : undefined,
    hasTruss: members.some((m) => m.kind === "truss"),
    ...(deformed ? { deformed } : {}),
    summary,
  };
}

// ————————————————————————————————————— a member diagram —————————————————————————————————————

/** How each quantity is named, and the kind of value it is (its unit and factor follow the reader's units). */
const DIAGRAM_QUANTITIES: Readonly<Record<DiagramQuantity, { symbol: string; name: string; kind: ResultKind }>> = {
  N: { symbol: "N", name: "Axial force", kind: "force" },
  V: { symbol: "V", name: "Shear force", kind: "force" },
  M: { symbol: "M", name: "Bending moment", kind: "moment" },
  deflection: { symbol: "δ", name: "Deflection", kind: "displacement" },
  relativeDeflection: { symbol: "δ", name: "Deflection from the chord", kind: "displacement" },
  axialDisplacement: { symbol: "u", name: "Axial displacement", kind: "displacement" },
  stressTop: { symbol: "σ", name: "Stress at the top fibre", kind: "stress" },
  stressBottom: { symbol: "σ", name: "Stress at the bottom fibre", kind: "stress" },
};

/** Values along a member: one curve, or the max and min curves of an envelope, with exact extremes. */
export interface DiagramData {
  readonly quantity: DiagramQuantity;
  readonly length: number;
  readonly x: ReadonlyArray<number>;
  readonly curves: ReadonlyArray<ReadonlyArray<number>>;
  readonly max: Extreme & { readonly from?: string };
  readonly min: Extreme & { readonly from?: string };
}

export function diagramData(source: MemberDiagram | MemberEnvelope, quantity: DiagramQuantity): DiagramData | undefined {
  if ("samples" in source) {
    const values = source.samples[quantity];
    const extremes = source.extremes[quantity];
    if (!values || !extremes) return undefined;
    return { quantity, length: source.length, x: source.samples.x, curves: [values], ...extremes };
  }
  const [max, min, extremes] = [source.max[quantity], source.min[quantity], source.extremes[quantity]];
  if (!max || !min || !extremes) return undefined;
  return { quantity, length: source.x[source.x.length - 1] ?? 0, x: source.x, curves: [max, min], ...extremes };
}

export interface DiagramMark extends Circle {
  readonly which: "max" | "min";
  readonly label: TextLabel;
}
export interface DiagramScene {
  readonly viewBox: ViewBox;
  readonly baseline: { readonly from: Point; readonly to: Point };
  /** Per curve: its line (steps at point loads are vertical segments) and the area between it and the baseline. */
  readonly curves: ReadonlyArray<{ readonly line: string; readonly area: string }>;
  readonly marks: ReadonlyArray<DiagramMark>;
  /** Ends of the member: x = 0 and x = L under the baseline, and a note when the values are all zero. */
  readonly notes: ReadonlyArray<TextLabel>;
  /** Positive values drawn below the baseline (bending moment: on the tension side of a sagging member). */
  readonly positiveBelow: boolean;
  /** The screen points of each curve, for tests. */
  readonly points: ReadonlyArray<ReadonlyArray<Point>>;
}

/** How a quantity is printed: symbol, name, and the display unit and factor from SI in the reader's units. */
export function diagramDisplay(quantity: DiagramQuantity, units: DisplayUnits = "si") {
  const { symbol, name, kind } = DIAGRAM_QUANTITIES[quantity];
  return { symbol, name, ...resultUnit(kind, units) };
}

/** "M max 144 kN·m at x = 3.00 m" from an SI value (or "… kip·ft at x = 9.84 ft" in US customary units). */
export function describeExtreme(
  quantity: DiagramQuantity,
  which: "max" | "min",
  e: Extreme & { from?: string },
  units: DisplayUnits = "si",
): string {
  const d = diagramDisplay(quantity, units);
  const length = resultUnit("length", units);
  const from = e.from ? ` (${e.from})` : "";
  return `${d.symbol} ${which} ${formatNumber(e.value * d.factor)} ${d.unit} at x = ${(finite(e.x) * length.factor).toFixed(2)} ${length.unit}${from}`;
}

/** Below this (in display units: kN, kN·m, mm, MPa) a value is numerical noise and is drawn as zero. */
const NEGLIGIBLE = 1e-6;

export function layoutDiagram(
  data: DiagramData,
  options: { width?: number; height?: number; startNode?: string; endNode?: string; units?: DisplayUnits } = {},
): DiagramScene {
  const width = options.width ?? 520;
  const height = options.height ?? 140;
  const display = diagramDisplay(data.quantity);
  const positiveBelow = data.quantity === "M";
  const shown = (v: number) => (Math.abs(v * display.factor) < NEGLIGIBLE ? 0 : finite(v));
  const all = [...data.curves.flat(), data.max.value, data.min.value].map(shown);
  const hi = Math.max(0, ...all);
  const lo = Math.min(0, ...all);
  const k = hi - lo > 0 ? height / (hi - lo) : 0;
  const X = (x: number) => (data.length > 0 ? (finite(x) / data.length) * width : 0);
  const Y = (v: number) => (k === 0 ? height / 2 : (positiveBelow ? shown(v) - lo : hi - shown(v)) * k);
  const base = Y(0);
  const b = boundsTracker();
  const baseline = { from: { x: 0, y: base }, to: { x: width, y: base } };
  b.points([baseline.from, baseline.to]);
  const points = data.curves.map((values) => {
    const ps = data.x.map((x, i) => ({ x: X(x), y: Y(values[i]) }));
    // The exact extremes join the curve where no sample is already there, so the drawn peak is the labelled one.
    if (data.curves.length === 1)
      for (const e of [data.max, data.min]) {
        const i = data.x.findIndex((x) => x >= e.x);
        if (i > 0 && Math.abs(data.x[i] - e.x) > 1e-9 * data.length && Math.abs(data.x[i - 1] - e.x) > 1e-9 * data.length)
          ps.splice(i, 0, { x: X(e.x), y: Y(e.value) });
      }
    b.points(ps);
    return ps;
  });
  const curves = points.map((ps) => ({
    line: polyline(ps),
    area: closed([{ x: ps[0]?.x ?? 0, y: base }, ...ps, { x: ps[ps.length - 1]?.x ?? 0, y: base }]),
  }));
  const marks: DiagramMark[] = [];
  for (const which of ["max", "min"] as const) {
    const e = data[which];
    if (which === "max" ? shown(e.value) <= 0 : shown(e.value) >= 0) continue;
    const p = { x: X(e.x), y: Y(e.value) };
    const anchor = p.x < width * 0.2 ? "start" : p.x > width * 0.8 ? "end" : "middle";
    const label: TextLabel = {
      x: p.x,
      y: p.y > base ? p.y + FONT_SIZE + 4 : p.y - 6,
      text: describeExtreme(data.quantity, which, e, options.units),
      anchor,
    };
    b.text(label);
    marks.push({ cx: round(p.x), cy: round(p.y), r: 2.5, which, label });
  }
  const below =
    Math.max(base, ...points.flat().map((p) => p.y), ...marks.filter((m) => m.cy > base).map((m) => m.label.y)) + FONT_SIZE + 4;
  const notes: TextLabel[] = [
    { x: 0, y: below, text: "x = 0", anchor: "start" },
    { x: width, y: below, text: `x = ${finite(data.length).toFixed(2)} m`, anchor: "end" },
  ];
  if (options.startNode) notes.push({ x: -5, y: base + FONT_SIZE * 0.35, text: options.startNode, anchor: "end" });
  if (options.endNode) notes.push({ x: width + 5, y: base + FONT_SIZE * 0.35, text: options.endNode, anchor: "start" });
  if (marks.length === 0)
    notes.push({ x: width / 2, y: base - 6, text: `${display.symbol} = 0 along the member`, anchor: "middle" });
  notes.forEach(b.text);
  return { viewBox: b.viewBox(SIZE.margin), baseline, curves, marks, notes, positiveBelow, points };
}
