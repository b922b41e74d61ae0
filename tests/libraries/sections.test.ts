/**
 * The section builder (lib/libraries/sections.ts) against closed forms, numbers worked by hand from the plate
 * formulas, published table values (from memory, marked so), and an independent integration of each shape
 * cut into thin strips (strips.ts). Dimensions are written in mm and converted; the builder works in metres.
 */
import { describe, expect, it } from "vitest";
import {
  buildSection,
  buildSectionOrThrow,
  rectangleTorsion,
  type Section,
  type SectionPropertiesByShape,
} from "@/lib/libraries";
import { expectAllFinite, expectClose, seededRandom } from "../engine/helpers";
import { arcOffset, stripProduct, stripProperties, type StripShape } from "./strips";

const MM = 1e-3;

function props<S extends Section["shape"]>(input: { shape: S } & Record<string, unknown>): SectionPropertiesByShape[S] {
  const section = buildSectionOrThrow(input);
  expectAllFinite(section);
  return section.properties as SectionPropertiesByShape[S];
}

/** A value rounded in a table: the computed one must round to it (within half a unit of the last digit printed). */
function expectRoundsTo(actual: number, printed: number, lastDigit: number) {
  expect(Math.abs(actual - printed)).toBeLessThanOrEqual(lastDigit / 2 + 1e-12);
}

describe("solid rectangle and circle: closed forms", () => {
  it("rectangle b × h: A = bh, I = bh³/12, S = bh²/6, Z = bh²/4, r = h/√12 (check-values.md, common practice, geometry)", () => {
    const [b, h] = [0.12, 0.3];
    const p = props({ shape: "rectangle", b, d: h });
    expectClose(p.A, b * h, 1e-14);
    expectClose(p.Ix, (b * h ** 3) / 12, 1e-14);
    expectClose(p.Iy, (h * b ** 3) / 12, 1e-14);
    expectClose(p.Sx, (b * h ** 2) / 6, 1e-14);
    expectClose(p.Sy, (h * b ** 2) / 6, 1e-14);
    expectClose(p.Zx, (b * h ** 2) / 4, 1e-14);
    expectClose(p.Zy, (h * b ** 2) / 4, 1e-14);
    expectClose(p.rx, h / Math.sqrt(12), 1e-14);
    expectClose(p.ry, b / Math.sqrt(12), 1e-14);
  });

  it("circle D: A = πD²/4, I = πD⁴/64, S = πD³/32, Z = D³/6, J = πD⁴/32, r = D/4 (common practice)", () => {
    const D = 0.075;
    const p = props({ shape: "circle", D });
    expectClose(p.A, (Math.PI * D ** 2) / 4, 1e-14);
    expectClose(p.Ix, (Math.PI * D ** 4) / 64, 1e-14);
    expectClose(p.Iy, (Math.PI * D ** 4) / 64, 1e-14);
    expectClose(p.Sx, (Math.PI * D ** 3) / 32, 1e-14);
    expectClose(p.Zx, D ** 3 / 6, 1e-14);
    expectClose(p.J, (Math.PI * D ** 4) / 32, 1e-14);
    expectClose(p.rx, D / 4, 1e-14);
  });

  // Timoshenko & Goodier, Theory of Elasticity (3rd ed.), §109, table of J = β b t³ for a b × t rectangle
  // (from memory): β printed to three figures.
  it.each([
    [1, 0.141],
    [1.5, 0.196],
    [2, 0.229],
    [3, 0.263],
    [5, 0.291],
    [10, 0.312],
  ])("rectangle's St Venant constant for b/t = %s: β = %s (Timoshenko & Goodier §109, from memory)", (ratio, beta) => {
    const t = 0.02;
    const p = props({ shape: "rectangle", b: t, d: ratio * t });
    expectRoundsTo(p.J / (ratio * t * t ** 3), beta, 0.001);
    expectClose(rectangleTorsion(ratio * t, t), p.J, 1e-14);
  });

  it("a long thin rectangle's J tends to b t³/3 (1 − 0.630 t/b) (Roark, 7th ed., Table 10.7 case 4, from memory)", () => {
    const [b, t] = [1, 0.01];
    expectClose(rectangleTorsion(b, t), ((b * t ** 3) / 3) * (1 - (0.63 * t) / b), 1e-4);
  });
});

describe("circular hollow section: exact", () => {
  const [D, t] = [0.1683, 0.008];
  const Di = D - 2 * t;
  const p = props({ shape: "circular-hollow", D, t });

  it("A = π(D² − Di²)/4, I = π(D⁴ − Di⁴)/64, Z = (D³ − Di³)/6 (common practice)", () => {
    expectClose(p.A, (Math.PI * (D ** 2 - Di ** 2)) / 4, 1e-14);
    expectClose(p.Ix, (Math.PI * (D ** 4 - Di ** 4)) / 64, 1e-13);
    expectClose(p.Sx, (Math.PI * (D ** 4 - Di ** 4)) / (32 * D), 1e-13);
    expectClose(p.Zx, (D ** 3 - Di ** 3) / 6, 1e-13);
    expect(p.D_t).toBe(D / t);
  });

  it("J = 2I exactly (the polar moment), and = 2πRm³t + πRm t³/2 with Rm the mid-wall radius (algebra)", () => {
    expectClose(p.J, 2 * p.Ix, 1e-15);
    const Rm = (D - t) / 2;
    // Bredt's 4Am²t/pm = 2πRm³t is the thin-walled leading term; the rest is the wall's own thickness.
    expectClose(p.J, 2 * Math.PI * Rm ** 3 * t + (Math.PI * Rm * t ** 3) / 2, 1e-13);
  });
});

describe("I section without root radius: numbers worked by hand from the plate formulas", () => {
  // b = 200, d = 400, tf = 20, tw = 10 (mm); web clear depth 360 mm.
  const p = props({ shape: "i", b: 200 * MM, d: 400 * MM, tf: 20 * MM, tw: 10 * MM });
  const cases: [key: "A" | "Ix" | "Iy" | "Sx" | "Sy" | "Zx" | "Zy" | "J", mm: number, power: number, how: string][] = [
    ["A", 2 * 200 * 20 + 360 * 10, 2, "11 600 mm²"],
    ["Ix", (200 * 400 ** 3 - 190 * 360 ** 3) / 12, 4, "(bd³ − (b − tw)h³)/12 = 327.946 667 × 10⁶ mm⁴"],
    ["Iy", (2 * 20 * 200 ** 3) / 12 + (360 * 10 ** 3) / 12, 4, "2tf b³/12 + h tw³/12 = 26.696 667 × 10⁶ mm⁴"],
    ["Sx", (200 * 400 ** 3 - 190 * 360 ** 3) / 12 / 200, 3, "Ix/(d/2)"],
    ["Sy", ((2 * 20 * 200 ** 3) / 12 + (360 * 10 ** 3) / 12) / 100, 3, "Iy/(b/2)"],
    ["Zx", 2 * (200 * 20 * 190 + 10 * 180 * 90), 3, "2(b tf (d − tf)/2 + tw (h/2)²/2) = 1.844 × 10⁶ mm³"],
    ["Zy", (2 * 20 * 200 ** 2) / 4 + (360 * 10 ** 2) / 4, 3, "2tf b²/4 + h tw²/4 = 409 000 mm³"],
    ["J", (2 * 200 * 20 ** 3 + 360 * 10 ** 3) / 3, 4, "Σ b t³/3 = 1.186 667 × 10⁶ mm⁴"],
  ];
  it.each(cases)("%s = %s (mm^%s): %s", (key, value, power) => {
    expectClose(p[key], value * MM ** power, 1e-13);
  });

  it("r = √(I/A), and the slenderness ratios b/2tf and h/tw (AISC 360-16 Table B4.1b cases 10 and 15, from memory)", () => {
    expectClose(p.rx, Math.sqrt(p.Ix / p.A), 1e-15);
    expectClose(p.ry, Math.sqrt(p.Iy / p.A), 1e-15);
    expectClose(p.b_2tf, 200 / 40, 1e-15);
    expectClose(p.h_tw, 360 / 10, 1e-15);
  });

  it("the flange outstand's c/tf as EN 1993-1-1 Table 5.2 measures it, c = (b − tw − 2r)/2 (from memory)", () => {
    expectClose(p.c_tf, (200 - 10) / 2 / 20, 1e-15);
    const rolled = props({ shape: "i", b: 200 * MM, d: 400 * MM, tf: 20 * MM, tw: 10 * MM, r: 15 * MM });
    expectClose(rolled.c_tf, (200 - 10 - 30) / 2 / 20, 1e-14);
    expectClose(rolled.h_tw, (400 - 40 - 30) / 10, 1e-14);
  });
});

describe("channel without root radius: numbers worked by hand", () => {
  // b = 100, d = 300, tf = 15, tw = 10 (mm): A = 2·1500 + 270·10 = 5700 mm².
  const p = props({ shape: "channel", b: 100 * MM, d: 300 * MM, tf: 15 * MM, tw: 10 * MM });
  const xc = (2 * 1500 * 50 + 2700 * 5) / 5700; // 28.684 mm from the back of the web
  const Iy = (2 * 15 * 100 ** 3) / 3 + (270 * 10 ** 3) / 3 - 5700 * xc ** 2;

  it("A, centroid, Ix, Iy, Sx, Sy, Zx, J", () => {
    expectClose(p.A, 5700 * MM ** 2, 1e-13);
    expectClose(p.xc, xc * MM, 1e-13);
    expectClose(p.Ix, ((100 * 300 ** 3 - 90 * 270 ** 3) / 12) * MM ** 4, 1e-13); // 77.3775 × 10⁶ mm⁴
    expectClose(p.Iy, Iy * MM ** 4, 1e-12); // 5.400 132 × 10⁶ mm⁴ (about the back, less A·xc²)
    expectClose(p.Sx, ((100 * 300 ** 3 - 90 * 270 ** 3) / 12 / 150) * MM ** 3, 1e-13);
    expectClose(p.Sy, (Iy / (100 - xc)) * MM ** 3, 1e-12); // to the flange tips, the farther fibre
    expectClose(p.Zx, 2 * (100 * 15 * 142.5 + 10 * 135 * 67.5) * MM ** 3, 1e-13);
    expectClose(p.J, ((2 * 100 * 15 ** 3 + 270 * 10 ** 3) / 3) * MM ** 4, 1e-13);
    expectClose(p.b_tf, 100 / 15, 1e-15);
    expectClose(p.h_tw, 270 / 10, 1e-15);
    expectClose(p.c_tf, 90 / 15, 1e-15);
  });

  it("Zy about the equal-area axis, 9.5 mm from the back (300 p = 5700/2 with p inside the web), not the centroid", () => {
    expectClose(p.xp, 9.5 * MM, 1e-12);
    // Left of the axis the full depth 300 × 9.5; right of it the web's last 0.5 mm and the flanges' 90.5 mm.
    const Zy = (300 * 9.5 ** 2) / 2 + (270 * 0.5 ** 2) / 2 + (30 * 90.5 ** 2) / 2; // 136 425 mm³
    expectClose(p.Zy, Zy * MM ** 3, 1e-12);
  });
});

describe("rolled sections with root radius: table values of SCI P363 (the 'Blue Book'), from memory", () => {
  // Rounded as printed; the builder must round to each. These tables take parallel flanges, quarter-circle
  // root fillets and, for It, El Darwish & Johnston's fillet correction — the builder's conventions.
  it("UB 305×165×40 (b 165.0, d 303.4, tw 6.0, tf 10.2, r 8.9 mm)", () => {
    const p = props({ shape: "i", b: 165 * MM, d: 303.4 * MM, tf: 10.2 * MM, tw: 6 * MM, r: 8.9 * MM });
    expectRoundsTo(p.A / 1e-4, 51.3, 0.1); // cm²
    expectRoundsTo(p.Ix / 1e-8, 8503, 1); // cm⁴
    expectRoundsTo(p.Iy / 1e-8, 764, 1);
    expectRoundsTo(p.Sx / 1e-6, 560, 1); // cm³
    expectRoundsTo(p.Zx / 1e-6, 623, 1);
    expectRoundsTo(p.rx / 1e-2, 12.9, 0.1); // cm
    expectRoundsTo(p.ry / 1e-2, 3.86, 0.01);
    expectRoundsTo(p.J / 1e-8, 14.7, 0.1);
  });

  it("PFC 300×90×41 (b 90, d 300, tw 9.0, tf 15.5, r 12 mm): A, I, and the centroid from the back of the web", () => {
    const p = props({ shape: "channel", b: 90 * MM, d: 300 * MM, tf: 15.5 * MM, tw: 9 * MM, r: 12 * MM });
    expectRoundsTo(p.A / 1e-4, 52.7, 0.1);
    expectRoundsTo(p.Ix / 1e-8, 7218, 1);
    expectRoundsTo(p.Iy / 1e-8, 404, 1);
    expectRoundsTo(p.xc / 1e-2, 2.6, 0.01);
  });

  it("L 100×100×10 (EN 10056-1 dimensions: r1 12, r2 6 mm): A, I, Iu, Iv and the centroid from the heel", () => {
    const p = props({ shape: "angle", b: 100 * MM, d: 100 * MM, t: 10 * MM, r: 12 * MM, r2: 6 * MM });
    expectRoundsTo(p.A / 1e-4, 19.2, 0.1);
    expectRoundsTo(p.Ix / 1e-8, 177, 1);
    expectRoundsTo(p.Iu / 1e-8, 280, 1);
    expectRoundsTo(p.Iv / 1e-8, 73.0, 0.1);
    expectRoundsTo(p.yc / 1e-2, 2.82, 0.01);
  });
});

describe("rectangular hollow section", () => {
  it("a thin square tube with sharp corners: J by Bredt, 4Am²t/pm = t(a − t)³, plus the open-wall term pm t³/3 (Bredt; EN 10210-2 form, from memory)", () => {
    const [a, t] = [0.2, 0.004];
    const p = props({ shape: "rectangular-hollow", b: a, d: a, t });
    const bredt = t * (a - t) ** 3;
    expectClose(p.J, bredt + (4 * (a - t) * t ** 3) / 3, 1e-13);
    expect(p.J / bredt - 1).toBeLessThan(1e-3); // the open-wall term is (4/3)(t/(a − t))² of Bredt's
    expectClose(p.A, a * a - (a - 2 * t) ** 2, 1e-13);
    expectClose(p.Ix, (a ** 4 - (a - 2 * t) ** 4) / 12, 1e-13);
    expectClose(p.b_t, (a - 2 * t) / t, 1e-13);
  });

  it("rounded corners: area by hand, the four outer corners (4 − π)ro² off and the inner ones (4 − π)ri² back", () => {
    const [b, d, t, ro] = [0.15, 0.25, 0.01, 0.025];
    const ri = ro - t;
    const p = props({ shape: "rectangular-hollow", b, d, t, ro });
    expectClose(p.A, b * d - (4 - Math.PI) * ro ** 2 - ((b - 2 * t) * (d - 2 * t) - (4 - Math.PI) * ri ** 2), 1e-13);
    // AISC 360-16 B4.1b(d): the flat width, less the inside corner radius each side (from memory).
    expectClose(p.b_t, (b - 2 * t - 2 * ri) / t, 1e-13);
    expectClose(p.h_t, (d - 2 * t - 2 * ri) / t, 1e-13);
  });
});

describe("angle: principal axes", () => {
  it("Mohr's circle: the rotated second moment I(θ) = Ix cos²θ + Iy sin²θ − Ixy sin 2θ is largest, Iu, at θ = alpha and smallest, Iv, across it (common practice)", () => {
    const p = props({ shape: "angle", b: 90 * MM, d: 150 * MM, t: 10 * MM, r: 12 * MM });
    const at = (th: number) => p.Ix * Math.cos(th) ** 2 + p.Iy * Math.sin(th) ** 2 - p.Ixy * Math.sin(2 * th);
    let [max, min, argmax] = [-Infinity, Infinity, 0];
    for (let i = 0; i < 200_000; i++) {
      const th = -Math.PI / 2 + (Math.PI * i) / 200_000;
      const v = at(th);
      if (v > max) [max, argmax] = [v, th];
      min = Math.min(min, v);
    }
    expectClose(p.Iu, max, 1e-9);
    expectClose(p.Iv, min, 1e-9);
    expectClose(at(p.alpha), p.Iu, 1e-12);
    expectClose(at(p.alpha + Math.PI / 2), p.Iv, 1e-12);
    expect(Math.abs(p.alpha - argmax)).toBeLessThan(1e-4);
    expectClose(p.Iu + p.Iv, p.Ix + p.Iy, 1e-13);
    expectClose(p.ru, Math.sqrt(p.Iu / p.A), 1e-14);
  });

  it("an equal angle's principal axes lie at 45°, Iu = Ix − Ixy and Iv = Ix + Ixy (symmetry)", () => {
    const p = props({ shape: "angle", b: 100 * MM, d: 100 * MM, t: 10 * MM, r: 12 * MM });
    expectClose(p.alpha, Math.PI / 4, 1e-12);
    expectClose(p.Ix, p.Iy, 1e-12);
    expectClose(p.Iu, p.Ix - p.Ixy, 1e-12);
    expectClose(p.Iv, p.Ix + p.Ixy, 1e-12);
  });

  it("without root radius, worked by hand from the two legs: A, centroid, Ix, Iy, Ixy, Sx, Sy, and J = (b + d − t)t³/3", () => {
    // b = 75, d = 100, t = 8: the vertical leg 8 × 100 and the horizontal 67 × 8.
    const p = props({ shape: "angle", b: 75 * MM, d: 100 * MM, t: 8 * MM });
    const A = 800 + 536; // mm²
    expectClose(p.A, A * MM ** 2, 1e-13);
    expectClose(p.xc, ((800 * 4 + 536 * (8 + 67 / 2)) / A) * MM, 1e-13);
    expectClose(p.yc, ((800 * 50 + 536 * 4) / A) * MM, 1e-13);
    expectClose(p.J, ((167 * 8 ** 3) / 3) * MM ** 4, 1e-13);
    expectClose(p.b_t, 75 / 8, 1e-15);
    expectClose(p.bd_2t, 175 / 16, 1e-15);
    // Second moments about the heel's lines, less A times the centroid's distance squared; S to the far fibre.
    const [xc, yc] = [(800 * 4 + 536 * 41.5) / A, (800 * 50 + 536 * 4) / A]; // 19.045, 31.549 mm
    const Ix = (8 * 100 ** 3) / 3 + (67 * 8 ** 3) / 3 - A * yc ** 2;
    const Iy = (100 * 8 ** 3) / 3 + (8 * (75 ** 3 - 8 ** 3)) / 3 - A * xc ** 2;
    expectClose(p.Ix, Ix * MM ** 4, 1e-12);
    expectClose(p.Iy, Iy * MM ** 4, 1e-12);
    expectClose(p.Sx, (Ix / (100 - yc)) * MM ** 3, 1e-12);
    expectClose(p.Sy, (Iy / (75 - xc)) * MM ** 3, 1e-12);
    // Product of inertia: each leg's own is zero (rectangles), so Ixy = Σ A (x − xc)(y − yc).
    expectClose(p.Ixy, (800 * (4 - xc) * (50 - yc) + 536 * (41.5 - xc) * (4 - yc)) * MM ** 4, 1e-12);
  });

  it("Su and Sv reach the outline's farthest point from each principal axis (outline sampled, fillet and toe arcs included)", () => {
    const [b, d, t, r, r2] = [0.09, 0.15, 0.01, 0.012, 0.006];
    const p = props({ shape: "angle", b, d, t, r, r2 });
    const outline: [number, number][] = [];
    const edge = (x0: number, y0: number, x1: number, y1: number) => {
      for (let i = 0; i <= 1000; i++) outline.push([x0 + ((x1 - x0) * i) / 1000, y0 + ((y1 - y0) * i) / 1000]);
    };
    const arc = (cx: number, cy: number, radius: number, from: number) => {
      for (let i = 0; i <= 20_000; i++) {
        const a = from + (Math.PI / 2) * (i / 20_000);
        outline.push([cx + radius * Math.cos(a), cy + radius * Math.sin(a)]);
      }
    };
    edge(0, 0, b, 0);
    edge(b, 0, b, t - r2);
    arc(b - r2, t - r2, r2, 0);
    edge(b - r2, t, t + r, t);
    arc(t + r, t + r, r, Math.PI);
    edge(t, t + r, t, d - r2);
    arc(t - r2, d - r2, r2, 0);
    edge(t - r2, d, 0, d);
    edge(0, d, 0, 0);
    const [c, s] = [Math.cos(p.alpha), Math.sin(p.alpha)];
    const toU = Math.max(...outline.map(([x, y]) => Math.abs(-(x - p.xc) * s + (y - p.yc) * c)));
    const toV = Math.max(...outline.map(([x, y]) => Math.abs((x - p.xc) * c + (y - p.yc) * s)));
    // A sampled arc falls short of its farthest point by at most r(1 − cos(Δθ/2)) ≈ 8e-10 r.
    expectClose(p.Su, p.Iu / toU, 1e-9);
    expectClose(p.Sv, p.Iv / toV, 1e-9);
  });
});

// ——— Every shape against the strips (independent integration), on dimensions drawn at random ———

type StripPair = { x: StripShape; y: StripShape };

/** The shape cut into strips along y (for Ix, Zx: width across at height y) and along x (for Iy, Zy: height at x). */
function stripsOf(section: Section): StripPair {
  const s = section.dimensions;
  switch (s.shape) {
    case "i": {
      const { b, d, tf, tw, r } = s;
      const yi = d / 2 - tf;
      return {
        y: {
          width: (y) => (Math.abs(y) >= yi ? b : tw + 2 * arcOffset(r, Math.abs(y) - (yi - r))),
          breaks: sym([d / 2, yi, yi - r]),
        },
        x: {
          width: (x) => (Math.abs(x) <= tw / 2 ? d : 2 * tf + 2 * arcOffset(r, tw / 2 + r - Math.abs(x))),
          breaks: sym([b / 2, tw / 2 + r, tw / 2]),
        },
      };
    }
    case "channel": {
      const { b, d, tf, tw, r } = s;
      const yi = d / 2 - tf;
      return {
        y: {
          width: (y) => (Math.abs(y) >= yi ? b : tw + arcOffset(r, Math.abs(y) - (yi - r))),
          breaks: sym([d / 2, yi, yi - r]),
        },
        x: { width: (x) => (x <= tw ? d : 2 * tf + 2 * arcOffset(r, tw + r - x)), breaks: [0, tw, tw + r, b] },
      };
    }
    case "rectangular-hollow": {
      const { b, d, t, ro } = s;
      const ri = Math.max(ro - t, 0);
      const across = (outer: number, half: number) => (u: number) => {
        const a = Math.abs(u);
        const full = outer - 2 * arcOffset(ro, a - (half - ro));
        const hole = a < half - t ? outer - 2 * t - 2 * arcOffset(ri, a - (half - t - ri)) : 0;
        return full - hole;
      };
      return {
        y: { width: across(b, d / 2), breaks: sym([d / 2, d / 2 - ro, d / 2 - t, d / 2 - t - ri]) },
        x: { width: across(d, b / 2), breaks: sym([b / 2, b / 2 - ro, b / 2 - t, b / 2 - t - ri]) },
      };
    }
    case "circular-hollow": {
      const [R, Ri] = [s.D / 2, s.D / 2 - s.t];
      const chord = (rad: number, u: number) => 2 * Math.sqrt(Math.max(rad * rad - u * u, 0));
      const shape = { width: (u: number) => chord(R, u) - chord(Ri, u), breaks: sym([R, Ri]) };
      return { x: shape, y: shape };
    }
    case "circle": {
      const R = s.D / 2;
      const shape = { width: (u: number) => 2 * Math.sqrt(Math.max(R * R - u * u, 0)), breaks: sym([R]) };
      return { x: shape, y: shape };
    }
    case "rectangle":
      return { y: { width: () => s.b, breaks: sym([s.d / 2]) }, x: { width: () => s.d, breaks: sym([s.b / 2]) } };
    case "angle": {
      // Across leg b's tip the toe takes arcOffset(r2, ·) off in the top r2 of its thickness; likewise leg d's.
      const { b, d, t, r, r2 } = s;
      const across = (long: number, other: number) => (u: number) =>
        u < t ? long - arcOffset(r2, u - (t - r2)) : t + arcOffset(r, t + r - u) - arcOffset(r2, u - (other - r2));
      return {
        y: { width: across(b, d), breaks: [0, t - r2, t, t + r, d - r2, d] },
        x: { width: across(d, b), breaks: [0, t - r2, t, t + r, b - r2, b] },
      };
    }
  }
}

const sym = (values: number[]) => [...values, ...values.map((v) => -v), 0];

/** Valid dimensions (mm) of each shape, drawn from plausible ranges. */
function randomInput(shape: Section["shape"], rand: () => number): Record<string, unknown> {
  const between = (lo: number, hi: number) => lo + (hi - lo) * rand();
  switch (shape) {
    case "i":
    case "channel": {
      const d = between(100, 900);
      const b = between(0.25, 1.1) * d;
      const tf = between(0.03, 0.12) * d;
      const tw = between(0.2, 0.9) * tf;
      const outstand = shape === "i" ? (b - tw) / 2 : b - tw;
      const r = rand() < 0.2 ? 0 : between(0, 1) * Math.min(outstand, (d - 2 * tf) / 2 - 1e-3, 2 * tf);
      return { shape, b: b * MM, d: d * MM, tf: tf * MM, tw: tw * MM, r: r * MM };
    }
    case "rectangular-hollow": {
      const b = between(40, 400);
      const d = between(40, 400);
      const t = between(0.02, 0.2) * Math.min(b, d);
      const ro = rand() < 0.2 ? 0 : between(0, 3) * t;
      return { shape, b: b * MM, d: d * MM, t: t * MM, ro: Math.min(ro, Math.min(b, d) / 2) * MM };
    }
    case "circular-hollow": {
      const D = between(20, 1000);
      return { shape, D: D * MM, t: between(0.01, 0.45) * D * MM };
    }
    case "rectangle":
      return { shape, b: between(10, 500) * MM, d: between(10, 500) * MM };
    case "circle":
      return { shape, D: between(10, 500) * MM };
    case "angle": {
      const b = between(30, 250);
      const d = between(30, 250);
      const t = between(0.04, 0.2) * Math.min(b, d);
      const r = Math.min(rand() < 0.2 ? 0 : between(0, 1.5) * t, Math.min(b, d) - t);
      const r2 = rand() < 0.2 ? 0 : between(0, 1) * Math.min(t, Math.min(b, d) - t - r);
      return { shape, b: b * MM, d: d * MM, t: t * MM, r: r * MM, r2: r2 * MM };
    }
  }
}

describe("every shape against its strips (an independent integration), on random dimensions", () => {
  const shapes = ["i", "channel", "rectangular-hollow", "circular-hollow", "rectangle", "circle", "angle"] as const;
  it.each(shapes)("%s: A, centroid, Ix, Iy, and Zx, Zy about the equal-area axes, to 1e-9", (shape) => {
    const rand = seededRandom(shape.length * 7919);
    for (let n = 0; n < 25; n++) {
      const section = buildSectionOrThrow(randomInput(shape, rand));
      const p = section.properties as SectionPropertiesByShape["angle"];
      const strips = stripsOf(section);
      const sy = stripProperties(strips.y);
      const sx = stripProperties(strips.x);
      expectClose(p.A, sy.A, 1e-9);
      expectClose(p.A, sx.A, 1e-9);
      expectClose(p.Ix, sy.I, 1e-9);
      expectClose(p.Iy, sx.I, 1e-9);
      expectClose(p.Zx, sy.Z, 1e-9);
      expectClose(p.Zy, sx.Z, 1e-9);
      if (section.shape === "channel") {
        expectClose(section.properties.xc, sx.sc, 1e-9);
        expectClose(section.properties.xp, sx.c, 1e-9);
      }
      if (section.shape === "angle") {
        expectClose(p.xc, sx.sc, 1e-9);
        expectClose(p.yc, sy.sc, 1e-9);
        const Ixy = stripProduct(strips.y) - sy.A * sx.sc * sy.sc;
        expectClose(p.Ixy, Ixy, 1e-9, Math.sqrt(p.Ix * p.Iy));
      }
    }
  });

  it.each(shapes)("%s: invariants — Z ≥ S, r = √(I/A), positive and finite, Iu + Iv = Ix + Iy for angles", (shape) => {
    const rand = seededRandom(shape.length * 104729);
    for (let n = 0; n < 200; n++) {
      const out = buildSection(randomInput(shape, rand));
      if (!out.ok) throw new Error(JSON.stringify(out.problems));
      expectAllFinite(out.section);
      const p = out.section.properties as SectionPropertiesByShape["angle"];
      expect(p.Zx).toBeGreaterThanOrEqual(p.Sx * (1 - 1e-12));
      expect(p.Zy).toBeGreaterThanOrEqual(p.Sy * (1 - 1e-12));
      expectClose(p.rx, Math.sqrt(p.Ix / p.A), 1e-14);
      expectClose(p.ry, Math.sqrt(p.Iy / p.A), 1e-14);
      for (const key of ["A", "Ix", "Iy", "Sx", "Sy", "Zx", "Zy", "J"] as const) expect(p[key]).toBeGreaterThan(0);
      if (shape === "angle") {
        expectClose(p.Iu + p.Iv, p.Ix + p.Iy, 1e-12);
        expect(p.Iu).toBeGreaterThanOrEqual(Math.max(p.Ix, p.Iy) * (1 - 1e-12));
        expect(p.Iv).toBeLessThanOrEqual(Math.min(p.Ix, p.Iy) * (1 + 1e-12));
        expect(p.Iv).toBeGreaterThan(0);
      }
    }
  });
});

describe("results as data", () => {
  it("keys come in one fixed order per shape, and the same input gives the same JSON (rules 1)", () => {
    const input = { shape: "channel", b: 0.09, d: 0.3, tf: 0.0155, tw: 0.009, r: 0.012 };
    const a = buildSectionOrThrow(input, 1);
    expect(Object.keys(a.properties)).toEqual([
      "A",
      "Ix",
      "Iy",
      "Sx",
      "Sy",
      "Zx",
      "Zy",
      "rx",
      "ry",
      "J",
      "xc",
      "xp",
      "b_tf",
      "h_tw",
      "c_tf",
    ]);
    expect(Object.keys(a.dimensions)).toEqual(["shape", "b", "d", "tf", "tw", "r"]);
    expect(JSON.stringify(buildSectionOrThrow({ r: 0.012, tw: 0.009, tf: 0.0155, d: 0.3, b: 0.09, shape: "channel" }, 1))).toBe(
      JSON.stringify(a),
    );
    const angle = buildSectionOrThrow({ shape: "angle", b: 0.1, d: 0.1, t: 0.01 }, 1);
    expect(Object.keys(angle.properties)).toEqual([
      ...["A", "Ix", "Iy", "Sx", "Sy", "Zx", "Zy", "rx", "ry", "J"],
      ...["xc", "yc", "Ixy", "Iu", "Iv", "alpha", "Su", "Sv", "ru", "rv", "b_t", "d_t", "bd_2t"],
    ]);
    expect(angle.dimensions).toEqual({ shape: "angle", b: 0.1, d: 0.1, t: 0.01, r: 0, r2: 0 });
  });
});
