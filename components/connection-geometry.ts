// The bolted brace-to-gusset connection that Gusset's mark (components/gusset-mark.tsx, app/icon.svg) and
// the sign-in page's drawing show. The bolts are set out as on a detail: on the brace's centre line, at an
// even pitch, with an edge distance from the plate's cut edge and from the brace's end, so every bolt lies
// inside both the plate and the brace (tests/unit/connection-geometry.test.ts checks it).
export type Point = { x: number; y: number };

export type Connection = {
  /** The gusset plate's outline, in order. */
  plate: Point[];
  /** The brace's outline over the plate and beyond it: end (inside the plate), then the far end. */
  brace: Point[];
  /**
   * The brace's centre line: the work point it aims at, where it crosses the plate's cut edge (origin), the
   * middle of the brace's far end, and the unit direction into the plate.
   */
  axis: { workPoint: Point; origin: Point; far: Point; inward: Point };
  bolts: Point[];
  boltRadius: number;
};

type Setting = {
  plate: Point[];
  /** A point on the brace's centre line (the work point) and a second one further out along it. */
  workPoint: Point;
  outward: Point;
  /** The plate edge cut square to the brace: the centre line crosses it here. */
  cutEdge: [Point, Point];
  braceWidth: number;
  /** How far the brace runs past the cut edge, away from the plate. */
  braceOverhang: number;
  boltCount: number;
  boltRadius: number;
  /** Centre to centre, along the brace. */
  pitch: number;
  /** Bolt centre to the plate's cut edge, and to the brace's end. */
  edgeDistance: number;
};

const round = (value: number) => Math.round(value * 1000) / 1000;
const at = (p: Point, d: Point, s: number): Point => ({ x: round(p.x + d.x * s), y: round(p.y + d.y * s) });

/** Where the line through `p` along `d` crosses the line through a and b. */
function crossing(p: Point, d: Point, [a, b]: [Point, Point]): Point {
  const e = { x: b.x - a.x, y: b.y - a.y };
  const denominator = d.x * e.y - d.y * e.x;
  const t = ((a.x - p.x) * e.y - (a.y - p.y) * e.x) / denominator;
  return { x: p.x + d.x * t, y: p.y + d.y * t };
}

export function setOutConnection(setting: Setting): Connection {
  const { workPoint, outward, braceWidth, pitch, edgeDistance, boltCount } = setting;
  const length = Math.hypot(outward.x - workPoint.x, outward.y - workPoint.y);
  const out = { x: (outward.x - workPoint.x) / length, y: (outward.y - workPoint.y) / length };
  const inward = { x: -out.x, y: -out.y };
  const across = { x: -out.y, y: out.x };
  const origin = crossing(workPoint, out, setting.cutEdge);
  const bolts = Array.from({ length: boltCount }, (_, i) => at(origin, inward, edgeDistance + i * pitch));
  const braceEnd = at(origin, inward, edgeDistance * 2 + (boltCount - 1) * pitch);
  const farEnd = at(origin, out, setting.braceOverhang);
  const half = braceWidth / 2;
  const brace = [at(braceEnd, across, half), at(farEnd, across, half), at(farEnd, across, -half), at(braceEnd, across, -half)];
  return {
    plate: setting.plate,
    brace,
    axis: { workPoint, origin: at(origin, out, 0), far: farEnd, inward },
    bolts,
    boltRadius: setting.boltRadius,
  };
}

/** An outline as an SVG path ("M4 4 L14 4 … Z"). */
export function outlinePath(points: Point[]): string {
  return `M${points.map((p) => `${p.x} ${p.y}`).join(" L")} Z`;
}

/**
 * The mark, on a 32-unit grid: the column face at x = 4, the beam face at y = 28, the plate's third side
 * cut square to a brace at 45° whose centre line runs through the corner where the two faces meet.
 */
export const MARK = setOutConnection({
  plate: [
    { x: 4, y: 4 },
    { x: 14, y: 4 },
    { x: 28, y: 18 },
    { x: 28, y: 28 },
    { x: 4, y: 28 },
  ],
  workPoint: { x: 4, y: 28 },
  outward: { x: 5, y: 27 },
  cutEdge: [
    { x: 14, y: 4 },
    { x: 28, y: 18 },
  ],
  braceWidth: 7,
  braceOverhang: 9,
  boltCount: 3,
  boltRadius: 2,
  pitch: 5.5,
  edgeDistance: 3.5,
});

/**
 * The sign-in page's drawing (400 × 520): a column (x 60–96) and a beam (y 330–362); the brace's centre line
 * runs through the work point where their centre lines meet (78, 346), and the plate's cut edge is centred on it.
 */
export const SHEET = setOutConnection({
  plate: [
    { x: 96, y: 170 },
    { x: 160, y: 170 },
    { x: 254, y: 264 },
    { x: 254, y: 330 },
    { x: 96, y: 330 },
  ],
  workPoint: { x: 78, y: 346 },
  outward: { x: 79, y: 345 },
  cutEdge: [
    { x: 160, y: 170 },
    { x: 254, y: 264 },
  ],
  braceWidth: 34,
  braceOverhang: 320,
  boltCount: 3,
  boltRadius: 6,
  pitch: 30,
  edgeDistance: 22,
});
