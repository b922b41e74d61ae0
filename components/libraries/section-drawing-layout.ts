// The section drawing's geometry, apart from its markup so tests can read it: the outline built in
// millimetres on the section's own axes (y up, origins as lib/libraries/sections.ts puts them), then
// fitted into a fixed box whose text keeps one size whatever the section's size.
import type { Section } from "@/lib/libraries";
import { formatMm, formatNumber } from "./format";

/** The box (viewBox units): the section fits inside the margins, which hold dimensions and callouts. */
export const BOX = { width: 440, height: 330 };
const MARGIN = { left: 58, right: 160, top: 46, bottom: 62 };
export const FONT = 12;

type Point = { x: number; y: number };
/** A step of an outline: a straight line to `to`, or a circular arc about `centre` (less than a half turn). */
type Step = { to: Point; centre?: Point };

export interface Dimension {
  key: string;
  /** Ends of the dimension line, and the points it measures (for the extension lines), in box units. */
  from: Point;
  to: Point;
  extensions: [Point, Point][];
  label: { x: number; y: number; text: string; rotate?: boolean };
}

export interface Callout {
  key: string;
  /** The feature pointed at, where the label sits, and (for a thickness) a short line across it. */
  anchor: Point;
  label: { x: number; y: number; text: string };
  across?: [Point, Point];
}

export interface Axis {
  name: string;
  from: Point;
  to: Point;
  label: Point;
}

export interface SectionScene {
  /** Box units per millimetre. */
  scale: number;
  /** The part of the box the drawing needs: its full width, the height of what is drawn. */
  viewBox: { x: number; y: number; width: number; height: number };
  /** The outline as an SVG path (even-odd fill: a hollow section's hole is its second sub-path). */
  outline: string;
  /** The outline's extent in box units: what tests compare with the dimensions. */
  extent: { left: number; right: number; top: number; bottom: number };
  centroid: Point;
  axes: Axis[];
  dimensions: Dimension[];
  callouts: Callout[];
  scaleBar: { x: number; y: number; length: number; millimetres: number };
}

const round = (v: number) => Math.round(v * 100) / 100;

/** A scale bar of 1, 2 or 5 × 10ⁿ mm, about a quarter of the drawn width. */
function barLength(scale: number, drawnWidth: number): number {
  const target = Math.max(drawnWidth / 3, 40) / scale;
  const power = 10 ** Math.floor(Math.log10(target));
  return [5, 2, 1].map((m) => m * power).find((v) => v <= target) ?? power;
}

export function layoutSection(section: Pick<Section, "shape" | "dimensions" | "properties">): SectionScene {
  const mm = Object.fromEntries(
    Object.entries(section.dimensions).flatMap(([k, v]) => (typeof v === "number" ? [[k, v * 1000]] : [])),
  ) as Record<string, number>;
  const props = section.properties as unknown as Record<string, number>;
  const g = geometryOf(section.shape, mm, props);

  // Fit the extent [x0, x1] × [y0, y1] (mm) into the inner box, centred.
  const inner = { w: BOX.width - MARGIN.left - MARGIN.right, h: BOX.height - MARGIN.top - MARGIN.bottom };
  const scale = Math.min(inner.w / (g.x1 - g.x0), inner.h / (g.y1 - g.y0));
  const ox = MARGIN.left + (inner.w - (g.x1 - g.x0) * scale) / 2 - g.x0 * scale;
  const oy = MARGIN.top + (inner.h - (g.y1 - g.y0) * scale) / 2 + g.y1 * scale;
  const at = (p: Point): Point => ({ x: round(ox + p.x * scale), y: round(oy - p.y * scale) });
  const extent = {
    left: at({ x: g.x0, y: 0 }).x,
    right: at({ x: g.x1, y: 0 }).x,
    top: at({ x: 0, y: g.y1 }).y,
    bottom: at({ x: 0, y: g.y0 }).y,
  };

  const outline = g.loops.map((loop) => pathOf(loop.map((s) => ({ to: at(s.to), centre: s.centre && at(s.centre) })))).join(" ");
  const centroid = at(g.centroid);

  // Axes through the centroid, reaching past the outline; x labelled at its left end, y at its foot.
  const reach = 12;
  const axes: Axis[] = [
    {
      name: "x",
      from: { x: extent.left - reach, y: centroid.y },
      to: { x: extent.right + reach, y: centroid.y },
      label: { x: extent.left - reach - 8, y: centroid.y + 4 },
    },
    {
      name: "y",
      from: { x: centroid.x, y: extent.top - reach },
      to: { x: centroid.x, y: extent.bottom + reach },
      label: { x: centroid.x, y: extent.bottom + reach + 11 },
    },
  ];
  if (section.shape === "angle") {
    // The principal axes at alpha (anticlockwise from x on the page, so the page's y, pointing down, flips the sign).
    const alpha = props.alpha;
    const half = 0.5 * Math.max(extent.right - extent.left, extent.bottom - extent.top);
    for (const [name, angle] of [
      ["u", alpha],
      ["v", alpha + Math.PI / 2],
    ] as const) {
      const dx = Math.cos(angle) * half;
      const dy = -Math.sin(angle) * half;
      axes.push({
        name,
        from: { x: round(centroid.x - dx), y: round(centroid.y - dy) },
        to: { x: round(centroid.x + dx), y: round(centroid.y + dy) },
        label: { x: round(centroid.x + dx * 1.08), y: round(centroid.y + dy * 1.08 + 4) },
      });
    }
  }

  const dimensions = g.dimensions.map((d): Dimension => {
    const a = at(d.a);
    const b = at(d.b);
    const text = `${d.key} = ${formatMm(d.value / 1000)} mm`;
    if (d.side === "top" || d.side === "bottom") {
      const y = d.side === "top" ? extent.top - 22 : extent.bottom + 22 + reach;
      return {
        key: d.key,
        from: { x: a.x, y },
        to: { x: b.x, y },
        extensions: [a, b].map((p): [Point, Point] => [p, { x: p.x, y: y + (d.side === "top" ? -4 : 4) }]),
        label: { x: round((a.x + b.x) / 2), y: d.side === "top" ? y - 6 : y + 14, text },
      };
    }
    const x = extent.left - 24 - reach;
    return {
      key: d.key,
      from: { x, y: a.y },
      to: { x, y: b.y },
      extensions: [a, b].map((p): [Point, Point] => [p, { x: x - 4, y: p.y }]),
      label: { x: x - 6, y: round((a.y + b.y) / 2), text, rotate: true },
    };
  });

  // Callouts in a column right of the section, in the order of their anchors from the top, never closer than a line.
  const column = extent.right + reach + 22;
  const step = FONT + 5;
  let next = -Infinity;
  const callouts = g.callouts
    .map((c) => ({ ...c, anchor: at(c.anchor), across: c.across && ([at(c.across[0]), at(c.across[1])] as [Point, Point]) }))
    .sort((p, q) => p.anchor.y - q.anchor.y)
    .map((c): Callout => {
      const y = Math.max(c.anchor.y + 4, next);
      next = y + step;
      return { key: c.key, anchor: c.anchor, across: c.across, label: { x: round(column), y: round(y), text: c.text } };
    });

  // The box's height shrinks to what is drawn, so a wide flat section leaves no empty band above and below.
  const ys = [...axes.flatMap((a) => [a.from.y, a.to.y, a.label.y]), ...callouts.map((c) => c.label.y)];
  const top = Math.max(0, Math.min(extent.top - MARGIN.top, Math.min(...ys) - FONT - 4));
  const bottom = Math.min(BOX.height, Math.max(extent.bottom + MARGIN.bottom, Math.max(...ys) + 2 * FONT + 16));
  const millimetres = barLength(scale, extent.right - extent.left);
  const scaleBar = {
    x: BOX.width - 16 - round(millimetres * scale),
    y: round(bottom - 12),
    length: round(millimetres * scale),
    millimetres,
  };
  const viewBox = { x: 0, y: round(top), width: BOX.width, height: round(bottom - top) };
  return { scale, viewBox, outline, extent, centroid, axes, dimensions, callouts, scaleBar };
}

/** A closed sub-path; an arc's sweep comes from the turn between its ends about the centre (page coordinates). */
function pathOf(steps: Step[]): string {
  const [first, ...rest] = steps;
  let d = `M${first.to.x} ${first.to.y}`;
  let from = first.to;
  for (const s of rest) {
    if (s.centre) {
      const r = round(Math.hypot(from.x - s.centre.x, from.y - s.centre.y));
      const cross = (from.x - s.centre.x) * (s.to.y - s.centre.y) - (from.y - s.centre.y) * (s.to.x - s.centre.x);
      d += `A${r} ${r} 0 0 ${cross > 0 ? 1 : 0} ${s.to.x} ${s.to.y}`;
    } else d += `L${s.to.x} ${s.to.y}`;
    from = s.to;
  }
  return `${d}Z`;
}

interface Geometry {
  loops: Step[][];
  x0: number;
  x1: number;
  y0: number;
  y1: number;
  centroid: Point;
  dimensions: { key: string; value: number; a: Point; b: Point; side: "top" | "bottom" | "left" }[];
  callouts: { key: string; anchor: Point; text: string; across?: [Point, Point] }[];
}

const p = (x: number, y: number): Point => ({ x, y });
const line = (x: number, y: number): Step => ({ to: p(x, y) });
/** A fillet or rounded corner: to (x, y) about (cx, cy); nothing when the radius is zero (a sharp corner). */
const arc = (radius: number, x: number, y: number, cx: number, cy: number): Step[] =>
  radius > 0 ? [{ to: p(x, y), centre: p(cx, cy) }] : [];
const text = (key: string, value: number) => `${key} = ${formatMm(value / 1000)} mm`;

/** A rectangle centred on the origin, with corners of radius r. */
function roundedRect(hx: number, hy: number, r: number): Step[] {
  return [
    line(-hx + r, hy),
    line(hx - r, hy),
    ...arc(r, hx, hy - r, hx - r, hy - r),
    line(hx, -hy + r),
    ...arc(r, hx - r, -hy, hx - r, -hy + r),
    line(-hx + r, -hy),
    ...arc(r, -hx, -hy + r, -hx + r, -hy + r),
    line(-hx, hy - r),
    ...arc(r, -hx + r, hy, -hx + r, hy - r),
  ];
}

/** A circle of radius r about the origin, as four quarter turns (an SVG arc cannot close on its own start). */
function circle(r: number): Step[] {
  const o = p(0, 0);
  return [
    line(r, 0),
    { to: p(0, r), centre: o },
    { to: p(-r, 0), centre: o },
    { to: p(0, -r), centre: o },
    { to: p(r, 0), centre: o },
  ];
}

/** The extent, centroid and b and d dimensions of a section b wide and d deep, symmetric about both axes. */
function centredBox(b: number, d: number): Omit<Geometry, "loops" | "callouts"> {
  return {
    x0: -b / 2,
    x1: b / 2,
    y0: -d / 2,
    y1: d / 2,
    centroid: p(0, 0),
    dimensions: [
      { key: "b", value: b, a: p(-b / 2, d / 2), b: p(b / 2, d / 2), side: "top" },
      { key: "d", value: d, a: p(-b / 2, d / 2), b: p(-b / 2, -d / 2), side: "left" },
    ],
  };
}

function geometryOf(shape: Section["shape"], m: Record<string, number>, props: Record<string, number>): Geometry {
  switch (shape) {
    case "i":
    case "channel": {
      const { b, d, tf, tw, r } = m;
      // The web's faces: both sides of the centre for an I section; the back at x = 0 for a channel.
      const [back, face, left, right] = shape === "i" ? [-tw / 2, tw / 2, -b / 2, b / 2] : [0, tw, 0, b];
      // A tapered flange (m.taper, a ratio, came scaled with the lengths) is tf thick half-way along its outstand,
      // thicker at the web; its fillet reaches L along both faces (section-tapered.ts). Parallel flanges: L = r.
      const taper = (m.taper ?? 0) / 1000;
      const outstand = right - face;
      const [yRoot, yTip] = [d / 2 - tf - (taper * outstand) / 2, d / 2 - tf + (taper * outstand) / 2];
      const reach = taper ? r * Math.tan(Math.PI / 4 - Math.atan(taper) / 2) : r;
      const [cos, sin] = [Math.cos(Math.atan(taper)), Math.sin(Math.atan(taper))];
      const upper = [
        line(right, d / 2),
        line(right, yTip),
        line(face + reach * cos, yRoot + reach * sin),
        ...arc(r, face, yRoot - reach, face + r, yRoot - reach),
      ];
      const lower = [
        line(face, -yRoot + reach),
        ...arc(r, face + reach * cos, -yRoot - reach * sin, face + r, -yRoot + reach),
        line(right, -yTip),
        line(right, -d / 2),
        line(left, -d / 2),
      ];
      const back_ =
        shape === "i"
          ? [
              line(left, -yTip),
              line(back - reach * cos, -yRoot - reach * sin),
              ...arc(r, back, -yRoot + reach, back - r, -yRoot + reach),
              line(back, yRoot - reach),
              ...arc(r, back - reach * cos, yRoot + reach * sin, back - r, yRoot - reach),
              line(left, yTip),
            ]
          : [];
      const yi = yRoot;
      // tf is drawn where it is measured: at the tip's end for parallel flanges, half-way along a tapered outstand.
      const tfAt = taper ? face + outstand / 2 : right - tf * 0.4;
      const xc = shape === "i" ? 0 : props.xc * 1000;
      const callouts: Geometry["callouts"] = [
        {
          key: "tf",
          anchor: p(tfAt, d / 2 - tf / 2),
          text: text("tf", tf),
          across: [p(tfAt, d / 2), p(tfAt, d / 2 - tf)],
        },
        { key: "tw", anchor: p(face, -d / 4), text: text("tw", tw), across: [p(back, -d / 4), p(face, -d / 4)] },
      ];
      if (r > 0) {
        const s = Math.SQRT1_2;
        callouts.push({ key: "r", anchor: p(face + r - r * s, yi - reach + r * s), text: text("r", r) });
      }
      if (shape === "channel") callouts.push({ key: "xc", anchor: p(xc, 0), text: `xc = ${formatNumber(xc)} mm` });
      return {
        loops: [[line(left, d / 2), ...upper, ...lower, ...back_]],
        x0: left,
        x1: right,
        y0: -d / 2,
        y1: d / 2,
        centroid: p(xc, 0),
        dimensions: [
          { key: "b", value: b, a: p(left, d / 2), b: p(right, d / 2), side: "top" },
          { key: "d", value: d, a: p(left, d / 2), b: p(left, -d / 2), side: "left" },
        ],
        callouts,
      };
    }
    case "rectangular-hollow": {
      const { b, d, t, ro } = m;
      const ri = Math.max(ro - t, 0);
      const callouts: Geometry["callouts"] = [
        { key: "t", anchor: p(b / 2 - t / 2, -d / 4), text: text("t", t), across: [p(b / 2 - t, -d / 4), p(b / 2, -d / 4)] },
      ];
      if (ro > 0) {
        const s = Math.SQRT1_2;
        callouts.push({ key: "ro", anchor: p(b / 2 - ro + ro * s, d / 2 - ro + ro * s), text: text("ro", ro) });
        callouts.push({
          key: "ri",
          anchor: p(b / 2 - t - ri + ri * s, d / 2 - t - ri + ri * s),
          text: `ri = ${formatMm(ri / 1000)} mm`,
        });
      }
      return { loops: [roundedRect(b / 2, d / 2, ro), roundedRect(b / 2 - t, d / 2 - t, ri)], ...centredBox(b, d), callouts };
    }
    case "circular-hollow":
    case "circle": {
      const { D } = m;
      const t = shape === "circle" ? 0 : m.t;
      const s = Math.SQRT1_2;
      return {
        loops: t > 0 ? [circle(D / 2), circle(D / 2 - t)] : [circle(D / 2)],
        x0: -D / 2,
        x1: D / 2,
        y0: -D / 2,
        y1: D / 2,
        centroid: p(0, 0),
        dimensions: [{ key: "D", value: D, a: p(-D / 2, D / 2), b: p(D / 2, D / 2), side: "top" }],
        callouts:
          t > 0
            ? [
                {
                  key: "t",
                  anchor: p((D / 2 - t / 2) * s, -(D / 2 - t / 2) * s),
                  text: text("t", t),
                  across: [p((D / 2 - t) * s, -(D / 2 - t) * s), p((D / 2) * s, -(D / 2) * s)],
                },
              ]
            : [],
      };
    }
    case "rectangle": {
      const { b, d } = m;
      return { loops: [roundedRect(b / 2, d / 2, 0)], ...centredBox(b, d), callouts: [] };
    }
    case "angle": {
      const { b, d, t, r, r2 } = m;
      const [xc, yc] = [props.xc * 1000, props.yc * 1000];
      const s = Math.SQRT1_2;
      const callouts: Geometry["callouts"] = [
        { key: "t", anchor: p(t, d * 0.7), text: text("t", t), across: [p(0, d * 0.7), p(t, d * 0.7)] },
        { key: "xc", anchor: p(xc, yc), text: `xc = ${formatNumber(xc)} mm` },
        { key: "yc", anchor: p(xc, yc), text: `yc = ${formatNumber(yc)} mm` },
      ];
      if (r > 0) callouts.push({ key: "r", anchor: p(t + r - r * s, t + r - r * s), text: text("r", r) });
      if (r2 > 0) callouts.push({ key: "r2", anchor: p(b - r2 + r2 * s, t - r2 + r2 * s), text: text("r2", r2) });
      return {
        loops: [
          [
            line(0, 0),
            line(b, 0),
            line(b, t - r2),
            ...arc(r2, b - r2, t, b - r2, t - r2),
            line(t + r, t),
            ...arc(r, t, t + r, t + r, t + r),
            line(t, d - r2),
            ...arc(r2, t - r2, d, t - r2, d - r2),
            line(0, d),
          ],
        ],
        x0: 0,
        x1: b,
        y0: 0,
        y1: d,
        centroid: p(xc, yc),
        dimensions: [
          { key: "b", value: b, a: p(0, 0), b: p(b, 0), side: "bottom" },
          { key: "d", value: d, a: p(0, d), b: p(0, 0), side: "left" },
        ],
        callouts,
      };
    }
  }
}
