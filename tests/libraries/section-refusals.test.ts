/**
 * The section builder's refusals: every one, with the dimension it names and the whole sentence, since the
 * sentence is what a lead reads beside the field. A refused input never yields properties (so no NaN).
 */
import { describe, expect, it } from "vitest";
import { buildSection, buildSectionOrThrow } from "@/lib/libraries";

const MM = 1e-3;
const I = { shape: "i", b: 150 * MM, d: 300 * MM, tf: 10 * MM, tw: 7 * MM, r: 12 * MM };

function problemsOf(input: unknown) {
  const out = buildSection(input);
  if (out.ok) throw new Error(`expected a refusal of ${JSON.stringify(input)}`);
  return out.problems;
}

describe("what any dimension must be", () => {
  it("a shape the builder knows", () => {
    const sentence = "Choose the shape: one of i, channel, rectangular-hollow, circular-hollow, rectangle, circle, angle.";
    for (const input of [{ shape: "tee", b: 1 }, { b: 1 }, null, "i", 3]) {
      expect(problemsOf(input)).toEqual([{ path: "shape", message: sentence }]);
    }
  });

  it("each dimension given, a finite number, greater than zero; each problem in the order of the dimensions", () => {
    expect(problemsOf({ shape: "i", b: "150", d: -0.3, tf: Number.NaN, r: Infinity })).toEqual([
      { path: "b", message: "The flange width b must be a finite number (in metres)." },
      { path: "d", message: "The depth d must be greater than zero (it is -300 mm)." },
      { path: "tf", message: "The flange thickness tf must be a finite number (in metres)." },
      { path: "tw", message: "Give the web thickness tw." },
      { path: "r", message: "The root radius r must be a finite number (in metres), or left out for a sharp corner." },
    ]);
    expect(problemsOf({ shape: "circle", D: 0 })).toEqual([
      { path: "D", message: "The diameter D must be greater than zero (it is 0 mm)." },
    ]);
    expect(problemsOf({ shape: "circular-hollow", D: Infinity, t: -Infinity })).toEqual([
      { path: "D", message: "The outside diameter D must be a finite number (in metres)." },
      { path: "t", message: "The wall thickness t must be a finite number (in metres)." },
    ]);
  });

  it("between 0.01 mm and 10 m: a depth in millimetres typed where metres are wanted is caught", () => {
    expect(problemsOf({ ...I, d: 300 })).toEqual([
      { path: "d", message: "The depth d is 300000 mm, more than 10 m: give dimensions in metres (300 mm is 0.3)." },
    ]);
    expect(problemsOf({ shape: "circular-hollow", D: 0.1, t: 1e-6 })).toEqual([
      { path: "t", message: "The wall thickness t is 0.001 mm: no structural section is thinner than 0.01 mm." },
    ]);
    expect(buildSection({ shape: "rectangle", b: 10, d: 1e-5 }).ok).toBe(true);
  });

  it("a radius may be zero or left out (a sharp corner), never negative", () => {
    expect(buildSection({ ...I, r: 0 }).ok).toBe(true);
    expect(buildSection({ ...I, r: undefined }).ok).toBe(true);
    expect(problemsOf({ ...I, r: -5 * MM })).toEqual([
      { path: "r", message: "The root radius r must not be negative (it is -5 mm)." },
    ]);
    expect(problemsOf({ shape: "rectangular-hollow", b: 0.1, d: 0.1, t: 0.005, ro: -0.001 })).toEqual([
      { path: "ro", message: "The outer corner radius ro must not be negative (it is -1 mm)." },
    ]);
  });

  it("buildSectionOrThrow throws the sentences", () => {
    expect(() => buildSectionOrThrow({ shape: "circle", D: -1 })).toThrow(
      "The diameter D must be greater than zero (it is -1000 mm).",
    );
  });
});

describe("thicknesses less than what they cut into, radii that fit", () => {
  it.each([
    [
      "I: two flanges as deep as the section",
      { shape: "i", b: 100 * MM, d: 50 * MM, tf: 30 * MM, tw: 5 * MM },
      "tf",
      "The flange thickness tf = 30 mm leaves no web in a 50 mm deep section: 2 tf must be less than d.",
    ],
    [
      "I: a web as wide as the flange",
      { ...I, tw: 150 * MM, r: 0 },
      "tw",
      "The web thickness tw = 150 mm leaves no flange outstand: it must be less than the flange width b = 150 mm.",
    ],
    [
      "I: a root radius wider than the outstand",
      { ...I, r: 72 * MM },
      "r",
      "The root radius r = 72 mm does not fit beside the web: it must not exceed the flange outstand (b − tw)/2 = 71.5 mm.",
    ],
    [
      "I: root radii that meet across the web",
      { ...I, b: 400 * MM, r: 140 * MM },
      "r",
      "The root radius r = 140 mm leaves no straight web: the flanges and fillets take 2 tf + 2 r = 300 mm of the 300 mm depth.",
    ],
    [
      "channel: a root radius wider than the flange beyond the web",
      { shape: "channel", b: 90 * MM, d: 300 * MM, tf: 15 * MM, tw: 9 * MM, r: 82 * MM },
      "r",
      "The root radius r = 82 mm does not fit beside the web: it must not exceed the flange outstand b − tw = 81 mm.",
    ],
    [
      "channel: flanges as deep as the section",
      { shape: "channel", b: 90 * MM, d: 30 * MM, tf: 15 * MM, tw: 9 * MM },
      "tf",
      "The flange thickness tf = 15 mm leaves no web in a 30 mm deep section: 2 tf must be less than d.",
    ],
    [
      "rectangular hollow: walls meeting across the width",
      { shape: "rectangular-hollow", b: 100 * MM, d: 200 * MM, t: 50 * MM },
      "t",
      "The wall thickness t = 50 mm leaves no hole in a 100 mm wide section: 2 t must be less than b.",
    ],
    [
      "rectangular hollow: walls meeting across the depth",
      { shape: "rectangular-hollow", b: 200 * MM, d: 80 * MM, t: 45 * MM },
      "t",
      "The wall thickness t = 45 mm leaves no hole in a 80 mm deep section: 2 t must be less than d.",
    ],
    [
      "rectangular hollow: a corner radius over half the smaller side",
      { shape: "rectangular-hollow", b: 200 * MM, d: 100 * MM, t: 5 * MM, ro: 51 * MM },
      "ro",
      "The outer corner radius ro = 51 mm does not fit: it must not exceed half the smaller side, 50 mm.",
    ],
    [
      "circular hollow: a wall to the centre",
      { shape: "circular-hollow", D: 100 * MM, t: 50 * MM },
      "t",
      "The wall thickness t = 50 mm leaves no hole in a 100 mm diameter tube: t must be less than D/2 = 50 mm.",
    ],
    [
      "angle: a thickness as long as leg b",
      { shape: "angle", b: 50 * MM, d: 100 * MM, t: 50 * MM },
      "t",
      "The thickness t = 50 mm leaves nothing of the 50 mm leg b: it must be less than b.",
    ],
    [
      "angle: a thickness longer than leg d",
      { shape: "angle", b: 100 * MM, d: 40 * MM, t: 45 * MM },
      "t",
      "The thickness t = 45 mm leaves nothing of the 40 mm leg d: it must be less than d.",
    ],
    [
      "angle: a root radius past the shorter leg",
      { shape: "angle", b: 100 * MM, d: 60 * MM, t: 8 * MM, r: 53 * MM },
      "r",
      "The root radius r = 53 mm does not fit between the legs: it must not exceed the shorter leg less t, 52 mm.",
    ],
  ])("%s", (_, input, path, message) => {
    expect(problemsOf(input)).toEqual([{ path, message }]);
  });

  it.each([
    [
      "angle: a toe radius thicker than the leg",
      { shape: "angle", b: 100 * MM, d: 100 * MM, t: 10 * MM, r: 12 * MM, r2: 11 * MM },
      "The toe radius r2 = 11 mm does not fit the thickness: it must not exceed t = 10 mm.",
    ],
    [
      "angle: a toe radius that meets the root fillet",
      { shape: "angle", b: 40 * MM, d: 100 * MM, t: 10 * MM, r: 25 * MM, r2: 6 * MM },
      "The toe radius r2 = 6 mm meets the root fillet: r + r2 = 31 mm must not exceed the shorter leg less t, 30 mm.",
    ],
  ])("%s", (_, input, message) => {
    expect(problemsOf(input)).toEqual([{ path: "r2", message }]);
  });

  it("at the limits that still leave a section, the builder answers with finite numbers", () => {
    for (const input of [
      { ...I, r: 71.5 * MM },
      { shape: "rectangular-hollow", b: 100 * MM, d: 100 * MM, t: 49.9 * MM, ro: 50 * MM },
      { shape: "circular-hollow", D: 100 * MM, t: 49.99 * MM },
      { shape: "angle", b: 100 * MM, d: 60 * MM, t: 8 * MM, r: 52 * MM },
      { shape: "angle", b: 100 * MM, d: 60 * MM, t: 8 * MM, r: 44 * MM, r2: 8 * MM },
      { shape: "angle", b: 100 * MM, d: 100 * MM, t: 99.9 * MM },
    ]) {
      const out = buildSection(input);
      expect(out.ok).toBe(true);
      if (out.ok) for (const v of Object.values(out.section.properties)) expect(Number.isFinite(v)).toBe(true);
    }
  });
});
