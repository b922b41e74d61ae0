// The bolts of Gusset's mark and of the sign-in drawing are where an engineer would put them: on the
// brace's centre line, at an even pitch, each wholly inside the gusset plate and inside the brace that
// laps onto it (common practice: a bolt group on the member's axis, edge distance to every cut edge).
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { MARK, SHEET, type Connection, type Point } from "@/components/connection-geometry";

const root = path.resolve(import.meta.dirname, "..", "..");

/** Distance from p to the infinite line through a and b. */
function distanceToLine(p: Point, a: Point, b: Point): number {
  return Math.abs((b.x - a.x) * (a.y - p.y) - (a.x - p.x) * (b.y - a.y)) / Math.hypot(b.x - a.x, b.y - a.y);
}

function distanceToSegment(p: Point, a: Point, b: Point): number {
  const dx = b.x - a.x;
  const dy = b.y - a.y;
  const t = Math.max(0, Math.min(1, ((p.x - a.x) * dx + (p.y - a.y) * dy) / (dx * dx + dy * dy)));
  return Math.hypot(p.x - (a.x + t * dx), p.y - (a.y + t * dy));
}

function isInside(p: Point, polygon: Point[]): boolean {
  let inside = false;
  for (let i = 0, j = polygon.length - 1; i < polygon.length; j = i++) {
    const [a, b] = [polygon[i], polygon[j]];
    if (a.y > p.y !== b.y > p.y && p.x < ((b.x - a.x) * (p.y - a.y)) / (b.y - a.y) + a.x) inside = !inside;
  }
  return inside;
}

/** The circle lies wholly inside the polygon: its centre inside and no edge closer than the radius. */
function holdsCircle(polygon: Point[], centre: Point, radius: number): boolean {
  const edges = polygon.map((a, i) => [a, polygon[(i + 1) % polygon.length]] as const);
  return isInside(centre, polygon) && edges.every(([a, b]) => distanceToSegment(centre, a, b) >= radius);
}

function problems({ plate, brace, axis, bolts, boltRadius }: Connection): string[] {
  const found: string[] = [];
  const tolerance = 1e-3 * Math.hypot(axis.origin.x - axis.workPoint.x, axis.origin.y - axis.workPoint.y);
  bolts.forEach((bolt, i) => {
    if (distanceToLine(bolt, axis.workPoint, axis.origin) > tolerance) found.push(`bolt ${i} is off the brace's centre line`);
    if (!holdsCircle(plate, bolt, boltRadius)) found.push(`bolt ${i} is not inside the plate`);
    if (!holdsCircle(brace, bolt, boltRadius)) found.push(`bolt ${i} is not inside the brace`);
  });
  const gaps = bolts.slice(1).map((bolt, i) => Math.hypot(bolt.x - bolts[i].x, bolt.y - bolts[i].y));
  if (gaps.some((gap) => Math.abs(gap - gaps[0]) > tolerance)) found.push(`uneven pitch: ${gaps.join(", ")}`);
  if (gaps.some((gap) => gap < 2 * boltRadius)) found.push("bolts overlap");
  return found;
}

describe.each([
  ["the mark", MARK],
  ["the sign-in drawing", SHEET],
])("%s", (_name, connection) => {
  it("has three bolts on the brace's centre line, evenly pitched, inside the plate and the brace", () => {
    expect(connection.bolts).toHaveLength(3);
    expect(problems(connection)).toEqual([]);
  });

  it("aims the brace's centre line at the work point, square to the plate's cut edge", () => {
    const { workPoint, origin, inward } = connection.axis;
    const toWork = { x: workPoint.x - origin.x, y: workPoint.y - origin.y };
    const length = Math.hypot(toWork.x, toWork.y);
    expect(toWork.x / length).toBeCloseTo(inward.x, 6);
    expect(toWork.y / length).toBeCloseTo(inward.y, 6);
  });

  it("would report the bolt row the drawing had before: across the brace, two outside it", () => {
    const across = { x: -connection.axis.inward.y, y: connection.axis.inward.x };
    const middle = connection.bolts[1];
    const spread = 2.5 * connection.boltRadius;
    const wrong = [-1, 0, 1].map((k) => ({ x: middle.x + across.x * spread * k, y: middle.y + across.y * spread * k }));
    expect(problems({ ...connection, bolts: wrong })).toEqual(
      expect.arrayContaining(["bolt 0 is off the brace's centre line", "bolt 0 is not inside the brace"]),
    );
  });
});

describe("app/icon.svg", () => {
  const svg = fs.readFileSync(path.join(root, "app", "icon.svg"), "utf8");
  it("draws the mark's bolts and plate", () => {
    const circles = [...svg.matchAll(/<circle cx="([\d.]+)" cy="([\d.]+)" r="([\d.]+)"/g)].map((m) => m.slice(1).map(Number));
    expect(circles).toEqual(MARK.bolts.map((bolt) => [bolt.x, bolt.y, MARK.boltRadius]));
    expect(svg).toContain(`d="M${MARK.plate.map((p) => `${p.x} ${p.y}`).join(" L")} Z"`);
    expect(svg).toContain(`d="M${MARK.brace.map((p) => `${p.x} ${p.y}`).join(" L")} Z"`);
  });
});
