/**
 * Tapered flanges (lib/libraries/section-tapered.ts, section-curves.ts): the new parts against the old ones where
 * they coincide, every tapered I section and channel against an independent integration in strips (strips.ts,
 * the outline's widths written here from the drawing), numbers worked by hand, and the refusals. A section given
 * no taper must be exactly what it was (the stored entries' hashes depend on it: entry-hashes.test.ts).
 * No published table of a tapered section is checked: tables differ on where tf is measured (see the report).
 */
import { describe, expect, it } from "vitest";
import { buildSection, buildSectionOrThrow, type SectionPropertiesByShape } from "@/lib/libraries";
import { below, momentsOf, rect, spandrel, type Part } from "@/lib/libraries/section-geometry";
import { fillet, poly } from "@/lib/libraries/section-curves";
import { expectAllFinite, expectClose, seededRandom } from "../engine/helpers";
import { stripProperties, type StripShape } from "./strips";

const MM = 1e-3;

function expectSameMoments(a: Part, b: Part, scale: number) {
  const [m, n] = [momentsOf(a), momentsOf(b)];
  for (const key of ["a", "qx", "qy", "xx", "yy", "xy"] as const) expectClose(m[key], n[key], 1e-12, scale ** (key.length + 1));
  for (const axis of ["x", "y"] as const)
    for (const c of [-2, -0.5, 0.1, 0.37, 0.5, 0.93, 1.2, 3].map((f) => f * scale)) {
      const [p, q] = [below(a, axis, c), below(b, axis, c)];
      expectClose(p.a, q.a, 1e-12, scale ** 2);
      expectClose(p.q, q.q, 1e-12, scale ** 3);
    }
}

describe("the new parts where they coincide with the old", () => {
  it("a polygon drawn as a rectangle is the rectangle, whichever way round (moments and the part below any line)", () => {
    expectSameMoments(
      poly([
        [0.1, -0.2],
        [0.5, -0.2],
        [0.5, 0.7],
        [0.1, 0.7],
      ]),
      rect(0.1, 0.5, -0.2, 0.7),
      1,
    );
    expectSameMoments(
      poly([
        [0.1, 0.7],
        [0.5, 0.7],
        [0.5, -0.2],
        [0.1, -0.2],
      ]),
      rect(0.1, 0.5, -0.2, 0.7),
      1,
    );
  });

  it("a fillet between faces at right angles is the quarter-circle spandrel, in all four corners", () => {
    for (const sx of [1, -1] as const)
      for (const sy of [1, -1] as const)
        expectSameMoments(fillet([0.3, 0.2], [sx, 0], [0, sy], 0.4), spandrel(0.3, 0.2, sx, sy, 0.4), 1);
  });
});

type Flanged = { b: number; d: number; tf: number; tw: number; r: number; taper: number };

/**
 * A tapered I section or channel as strips, from the drawing: the fillet's centre r from the web's face and L =
 * r tan(45° − θ/2) below the flange's root, its arc from the web (T1) to the sloped face (T2).
 */
function taperedStrips(shape: "i" | "channel", { b, d, tf, tw, r, taper }: Flanged): { x: StripShape; y: StripShape } {
  const theta = Math.atan(taper);
  const [face, tipX] = shape === "i" ? [tw / 2, b / 2] : [tw, b];
  const o = tipX - face;
  const root = tf + (taper * o) / 2;
  const [yRoot, yTip] = [d / 2 - root, d / 2 - tf + (taper * o) / 2];
  const L = r * Math.tan(Math.PI / 4 - theta / 2);
  const [ox, oy] = [face + r, yRoot - L];
  const [xT2, yT2] = [face + L * Math.cos(theta), yRoot + L * Math.sin(theta)];
  const root2 = (u: number) => Math.sqrt(Math.max(r * r - u * u, 0));
  // Distance from the web's face (I: the centre line; channel: the back) to the outline at height |y| ≥ 0.
  const reach = (y: number) => {
    if (y >= yTip) return tipX;
    if (y >= yT2) return face + (y - yRoot) / taper; // the sloped face
    if (r > 0 && y >= oy) return ox - root2(y - oy); // the fillet's arc
    return face;
  };
  // Material above the web's mid-height at a distance x past the web's face: the flange, and the fillet near the web.
  const height = (x: number) => {
    if (x <= face) return d / 2;
    if (r > 0 && x < xT2) return d / 2 - (oy + root2(x - ox));
    return root - taper * (x - face);
  };
  const ys = [d / 2, yTip, yT2, yRoot, oy];
  const xs = [tipX, xT2, face];
  if (shape === "i")
    return {
      y: { width: (y) => 2 * reach(Math.abs(y)), breaks: [...ys, ...ys.map((v) => -v), 0] },
      x: { width: (x) => 2 * height(Math.abs(x)), breaks: [...xs, ...xs.map((v) => -v), 0] },
    };
  return {
    y: { width: (y) => reach(Math.abs(y)), breaks: [...ys, ...ys.map((v) => -v), 0] },
    x: { width: (x) => 2 * height(x), breaks: [0, ...xs] },
  };
}

function randomTapered(shape: "i" | "channel", rand: () => number): Flanged {
  const d = 0.1 + 0.6 * rand();
  const b = d * (0.3 + 0.4 * rand());
  const tf = d * (0.03 + 0.05 * rand());
  const tw = tf * (0.4 + 0.5 * rand());
  const o = shape === "i" ? (b - tw) / 2 : b - tw;
  // Up to the slope that leaves the tip a fifth of tf, and past the 1:6 of rolled sections.
  const taper = Math.min(0.05 + 0.25 * rand(), (1.6 * tf) / o);
  const r = rand() < 0.2 ? 0 : tf * (0.3 + 1.2 * rand());
  return { b, d, tf, tw, r, taper };
}

describe("tapered I sections and channels against their strips, on random dimensions", () => {
  it.each(["i", "channel"] as const)("%s: A, Ix, Iy, Zx and Zy about the equal-area axes, the centroid, to 1e-9", (shape) => {
    const rand = seededRandom(shape === "i" ? 1913 : 2027);
    for (let n = 0; n < 25; n++) {
      const dims = randomTapered(shape, rand);
      const built = buildSection({ shape, ...dims });
      if (!built.ok) throw new Error(JSON.stringify([dims, built.problems]));
      expectAllFinite(built.section);
      const p = built.section.properties as SectionPropertiesByShape["channel"];
      const strips = taperedStrips(shape, dims);
      const [sy, sx] = [stripProperties(strips.y), stripProperties(strips.x)];
      expectClose(p.A, sy.A, 1e-9);
      expectClose(p.A, sx.A, 1e-9);
      expectClose(p.Ix, sy.I, 1e-9);
      expectClose(p.Iy, sx.I, 1e-9);
      expectClose(p.Zx, sy.Z, 1e-9);
      expectClose(p.Zy, sx.Z, 1e-9);
      if (shape === "channel") {
        expectClose(p.xc, sx.sc, 1e-9);
        expectClose(p.xp, sx.c, 1e-9);
      }
    }
  });
});

describe("tapered flanges: numbers worked by hand", () => {
  // b = 200, d = 400, tf = 20 (half-way along the outstand), tw = 10 mm, 14 % slope: the flange 26.65 mm thick at the
  // web and 13.35 mm at its tip.
  const dims = { b: 200 * MM, d: 400 * MM, tf: 20 * MM, tw: 10 * MM, taper: 0.14 };
  const p = buildSectionOrThrow({ shape: "i", ...dims }).properties as Required<SectionPropertiesByShape["i"]>;

  it("without a root radius the area is the parallel section's, 2(b − tw)tf + d tw: the outstands keep their mean thickness", () => {
    expectClose(p.A, (2 * 190 * 20 + 400 * 10) * MM ** 2, 1e-13);
  });

  it("J thin-walled: each outstand o(t₁ + t₂)(t₁² + t₂²)/12, the flange over the web tw t₁³/3, the web (d − 2t₁)tw³/3", () => {
    const [o, t1, t2] = [95, 20 + 0.07 * 95, 20 - 0.07 * 95];
    const flange = (10 * t1 ** 3) / 3 + (2 * o * (t1 + t2) * (t1 * t1 + t2 * t2)) / 12;
    expectClose(p.J, (2 * flange + ((400 - 2 * t1) * 10 ** 3) / 3) * MM ** 4, 1e-12);
  });

  it("Cw = Iy h0²/4 with h0 = d − tf, tf the mean thickness; the clear web depth is d − 2t₁", () => {
    expectClose(p.Cw, (p.Iy * (0.4 - 0.02) ** 2) / 4, 1e-14);
    expectClose(p.h_tw, (400 - 2 * (20 + 0.07 * 95)) / 10, 1e-12);
  });

  it("a channel's shear centre and Cw take the mean thickness, as for parallel flanges", () => {
    const c = { b: 90 * MM, d: 300 * MM, tf: 15.5 * MM, tw: 9 * MM, r: 12 * MM };
    const tapered = buildSectionOrThrow({ shape: "channel", ...c, taper: 0.08 }).properties as Required<
      SectionPropertiesByShape["channel"]
    >;
    const parallel = buildSectionOrThrow({ shape: "channel", ...c }).properties as Required<SectionPropertiesByShape["channel"]>;
    expect(tapered.e0).toBe(parallel.e0);
    expect(tapered.Cw).toBe(parallel.Cw);
    expect(tapered.x0).not.toBe(parallel.x0); // the centroid moves towards the web
  });
});

describe("no taper is the section as it was", () => {
  it("left out or zero, every property is the parallel section's, bit for bit; left out, the dimensions have no taper", () => {
    for (const shape of ["i", "channel"] as const) {
      const dims = { shape, b: 0.09, d: 0.3, tf: 0.0155, tw: 0.009, r: 0.012 };
      const [none, zero] = [buildSectionOrThrow(dims, 1), buildSectionOrThrow({ ...dims, taper: 0 }, 1)];
      expect(JSON.stringify(zero.properties)).toBe(JSON.stringify(none.properties));
      expect(Object.keys(none.dimensions)).toEqual(["shape", "b", "d", "tf", "tw", "r"]);
    }
  });

  it("a slope of 10⁻⁸ moves no property by more than 10⁻⁶ (relative): the tapered parts meet the parallel ones", () => {
    for (const shape of ["i", "channel"] as const) {
      const dims = { shape, b: 0.09, d: 0.3, tf: 0.0155, tw: 0.009, r: 0.012 };
      const [flat, slight] = [buildSectionOrThrow(dims, 1), buildSectionOrThrow({ ...dims, taper: 1e-8 }, 1)].map(
        (s) => s.properties as unknown as Record<string, number>,
      );
      for (const key of ["A", "Ix", "Iy", "Sx", "Sy", "Zx", "Zy"]) expectClose(slight[key], flat[key], 1e-6);
    }
  });
});

describe("refusals", () => {
  const messages = (input: Record<string, unknown>) => {
    const out = buildSection(input);
    return out.ok ? [] : out.problems.map((p) => [p.path, p.message]);
  };
  const i = { shape: "i", b: 0.2, d: 0.4, tf: 0.02, tw: 0.01, r: 0.015 };

  it("a slope that thins the tip to nothing, a negative one, and one given in per cent", () => {
    expect(messages({ ...i, taper: 0.5 })).toEqual([
      [
        "taper",
        "The inner flange slope 0.5 thins the flange to nothing at its tip: over half the outstand (47.5 mm) it takes 23.75 mm, more than tf = 20 mm.",
      ],
    ]);
    expect(messages({ ...i, taper: -0.1 })).toEqual([
      ["taper", "The inner flange slope taper must not be negative (it is -0.1)."],
    ]);
    expect(messages({ ...i, taper: 14 })).toEqual([
      ["taper", "The inner flange slope taper is 14, steeper than 1 in 2: give it as a ratio (14 % is 0.14, 1:6 is 0.1667)."],
    ]);
  });

  it("flanges and fillets that leave no straight web", () => {
    expect(messages({ ...i, d: 0.07, taper: 0.14 })).toEqual([
      [
        "r",
        "The flanges and fillets leave no straight web: at the web they take 2 (tf + 6.65 mm of slope + fillet) = 79.3926 mm of the 70 mm depth.",
      ],
    ]);
  });
});
