/**
 * The section builder's rules 2 (lib/libraries/section-torsion.ts): shear centre, warping constant Cw and the
 * channels' and angles' fillet-corrected J — against closed forms worked here independently (~1e-12), against a
 * thin-walled analysis from first principles (thin-walled.ts, 1e-9), and against published values where one is
 * known (each named, and marked from memory where recalled); the fillet-corrected J against Saint-Venant's problem
 * solved on a grid (prandtl.ts). check-values.md lists no warping, shear-centre or torsion value.
 */
import { describe, expect, it } from "vitest";
import { buildSectionOrThrow, rectangleTorsion, SECTION_SHAPES, type SectionPropertiesByShape } from "@/lib/libraries";
import { expectAllFinite, expectClose, seededRandom } from "../engine/helpers";
import { angleInside, channelInside, iInside, prandtlJExtrapolated } from "./prandtl";
import { thinWalled } from "./thin-walled";

const MM = 1e-3;
const IN = 0.0254;

function props<S extends keyof SectionPropertiesByShape>(
  input: { shape: S } & Record<string, unknown>,
  rules: 1 | 2 = 2,
): Required<SectionPropertiesByShape[S]> {
  const section = buildSectionOrThrow(input, rules);
  expectAllFinite(section);
  return section.properties as Required<SectionPropertiesByShape[S]>;
}

/** A value rounded in a table: the computed one must round to it (within half a unit of the last digit printed). */
function expectRoundsTo(actual: number, printed: number, lastDigit: number) {
  expect(Math.abs(actual - printed)).toBeLessThanOrEqual(lastDigit / 2 + 1e-12);
}

describe("I section: shear centre at the centroid, Cw = Iy h0²/4 (thin-walled, h0 = d − tf)", () => {
  it("without root radius, by hand: Iy = 2tf b³/12 + (d − 2tf)tw³/12, h0 = 380 mm", () => {
    const p = props({ shape: "i", b: 200 * MM, d: 400 * MM, tf: 20 * MM, tw: 10 * MM });
    const Iy = (2 * 20 * 200 ** 3) / 12 + (360 * 10 ** 3) / 12; // 26.696 667 × 10⁶ mm⁴
    expectClose(p.Cw, ((Iy * 380 ** 2) / 4) * MM ** 6, 1e-12); // 963.735 667 × 10⁹ mm⁶
    expect([p.x0, p.y0]).toEqual([0, 0]);
  });

  it("the plates' own analysis gives the flanges' part, tf b³h0²/24; the builder adds the web's Iy, (d − 2tf)tw³/12 × h0²/4", () => {
    const rand = seededRandom(4049);
    for (let n = 0; n < 20; n++) {
      const d = 0.1 + 0.8 * rand();
      const [b, tf] = [d * (0.3 + 0.7 * rand()), d * (0.03 + 0.07 * rand())];
      const tw = tf * (0.3 + 0.6 * rand());
      const p = props({ shape: "i", b, d, tf, tw });
      const h0 = d - tf;
      const plates = thinWalled([
        { from: [0, -h0 / 2], to: [0, h0 / 2], t: tw },
        { from: [0, h0 / 2], to: [b / 2, h0 / 2], t: tf },
        { from: [0, h0 / 2], to: [-b / 2, h0 / 2], t: tf },
        { from: [0, -h0 / 2], to: [b / 2, -h0 / 2], t: tf },
        { from: [0, -h0 / 2], to: [-b / 2, -h0 / 2], t: tf },
      ]);
      expectClose(plates.Cw, (tf * b ** 3 * h0 ** 2) / 24, 1e-9);
      expectClose(p.Cw - plates.Cw, (((d - 2 * tf) * tw ** 3) / 12) * (h0 ** 2 / 4), 1e-9, p.Cw);
      expect(Math.abs(plates.xs) + Math.abs(plates.ys)).toBeLessThan(1e-12 * d);
    }
  });

  it("with a root radius: Cw = Iy h0²/4 with the whole section's Iy, fillets included", () => {
    const p = props({ shape: "i", b: 150 * MM, d: 300 * MM, tf: 10.5 * MM, tw: 7 * MM, r: 14 * MM });
    expectClose(p.Cw, (p.Iy * (0.3 - 0.0105) ** 2) / 4, 1e-14);
  });

  it("UB 305×165×40: Iw = 0.164 dm⁶ (SCI P363, 'Blue Book', UB table, from memory)", () => {
    const p = props({ shape: "i", b: 165 * MM, d: 303.4 * MM, tf: 10.2 * MM, tw: 6 * MM, r: 8.9 * MM });
    expectRoundsTo(p.Cw / 1e-6, 0.164, 0.001); // 1 dm⁶ = 10⁻⁶ m⁶
  });
});

describe("channel: shear centre e0 and Cw, thin-walled (b′ = b − tw/2, h′ = d − tf)", () => {
  it("closed forms: e0 = 3b′²tf/(6b′tf + h′tw), Cw = (tf b′³h′²/12)(3b′tf + 2h′tw)/(6b′tf + h′tw), x0 = tw/2 − e0 − xc", () => {
    const [b, d, tf, tw, r] = [90 * MM, 300 * MM, 15.5 * MM, 9 * MM, 12 * MM];
    const p = props({ shape: "channel", b, d, tf, tw, r });
    const [bm, hm] = [b - tw / 2, d - tf]; // 85.5 and 284.5 mm
    expectClose(p.e0, (3 * bm * bm * tf) / (6 * bm * tf + hm * tw), 1e-12); // 26.41 mm
    expectClose(p.Cw, ((tf * bm ** 3 * hm ** 2) / 12) * ((3 * bm * tf + 2 * hm * tw) / (6 * bm * tf + hm * tw)), 1e-12);
    expectClose(p.x0, tw / 2 - p.e0 - p.xc, 1e-12);
    expect(p.x0).toBeLessThan(0); // beyond the back of the web, away from the flanges
    expect(p.y0).toBe(0);
  });

  it("agrees with the plates' own analysis (shear centre and Cw from the sectorial coordinate) on random channels, to 1e-9", () => {
    const rand = seededRandom(7207);
    for (let n = 0; n < 25; n++) {
      const d = 0.1 + 0.8 * rand();
      const [b, tf] = [d * (0.2 + 0.5 * rand()), d * (0.03 + 0.07 * rand())];
      const tw = tf * (0.3 + 0.7 * rand());
      const p = props({ shape: "channel", b, d, tf, tw, r: rand() < 0.5 ? 0 : tf * rand() });
      const hm = d - tf;
      // Mid-lines, x from the back of the web: the web at tw/2, the flanges from it to the tips.
      const plates = thinWalled([
        { from: [tw / 2, -hm / 2], to: [tw / 2, hm / 2], t: tw },
        { from: [tw / 2, hm / 2], to: [b, hm / 2], t: tf },
        { from: [tw / 2, -hm / 2], to: [b, -hm / 2], t: tf },
      ]);
      expectClose(p.e0, tw / 2 - plates.xs, 1e-9);
      expectClose(p.Cw, plates.Cw, 1e-9);
      expect(Math.abs(plates.ys)).toBeLessThan(1e-12 * d);
    }
  });

  it("uniform thickness, b = 4 in and h = 6 in to the mid-lines: e = b/(2 + h/3b) = 1.6 in (Beer & Johnston, Mechanics of Materials, shear centre of a channel, worked example, from memory)", () => {
    const t = 0.15 * IN;
    const p = props({ shape: "channel", b: 4 * IN + t / 2, d: 6 * IN + t, tf: t, tw: t });
    expectClose(p.e0, 1.6 * IN, 1e-12);
  });
});

describe("angle: shear centre where the legs' mid-lines meet, Cw = 0", () => {
  it("x0 = t/2 − xc, y0 = t/2 − yc, and the plates' own analysis puts it there with Cw = 0", () => {
    const [b, d, t] = [90 * MM, 150 * MM, 10 * MM];
    const p = props({ shape: "angle", b, d, t, r: 12 * MM, r2: 6 * MM });
    expectClose(p.x0, t / 2 - p.xc, 1e-12);
    expectClose(p.y0, t / 2 - p.yc, 1e-12);
    expect(p.Cw).toBe(0);
    const plates = thinWalled([
      { from: [t / 2, t / 2], to: [t / 2, d], t },
      { from: [t / 2, t / 2], to: [b, t / 2], t },
    ]);
    expect(Math.abs(plates.xs - t / 2) + Math.abs(plates.ys - t / 2)).toBeLessThan(1e-12 * d);
    expect(plates.Cw).toBeLessThan(1e-12 * t * d ** 5);
  });
});

describe("closed and solid sections: shear centre at the centroid, Cw taken as 0", () => {
  it.each([
    { shape: "rectangular-hollow", b: 0.1, d: 0.15, t: 0.006, ro: 0.012 },
    { shape: "circular-hollow", D: 0.168, t: 0.006 },
    { shape: "rectangle", b: 0.1, d: 0.2 },
    { shape: "circle", D: 0.05 },
  ] as const)("$shape", (input) => {
    const p = props(input);
    expect([p.x0, p.y0, p.Cw]).toEqual([0, 0, 0]);
  });
});

describe("J with fillet corrections under rules 2 (El Darwish & Johnston, 1965; each formula from memory)", () => {
  it("channel: (2/3)b tf³ + (1/3)(d − 2tf)tw³ + 2α₃D₃⁴ − 0.420 tf⁴ (SCI P363's form for parallel flange channels, from memory)", () => {
    const [b, d, T, t, r] = [90, 300, 15.5, 9, 12]; // mm
    const alpha3 = -0.0908 + 0.2621 * (t / T) + 0.1231 * (r / T) - 0.0752 * ((t * r) / T ** 2) - 0.0945 * (t / T) ** 2;
    const D3 = 2 * (3 * r + t + T - Math.sqrt(2 * (2 * r + t) * (2 * r + T)));
    const J = (2 / 3) * b * T ** 3 + (1 / 3) * (d - 2 * T) * t ** 3 + 2 * alpha3 * D3 ** 4 - 0.42 * T ** 4;
    const p = props({ shape: "channel", b: b * MM, d: d * MM, tf: T * MM, tw: t * MM, r: r * MM });
    expectClose(p.J, J * MM ** 4, 1e-12);
    // PFC 300×90×41: It = 28.8 cm⁴ (SCI P363, PFC table, from memory).
    expectRoundsTo(p.J / 1e-8, 28.8, 0.1);
    // Rules 1 keeps the plain sum: 28.88 cm⁴.
    expectClose(
      props({ shape: "channel", b: b * MM, d: d * MM, tf: T * MM, tw: t * MM, r: r * MM }, 1).J,
      ((2 * b * T ** 3 + (d - 2 * T) * t ** 3) / 3) * MM ** 4,
      1e-12,
    );
  });

  it("angle: (b + d − t)t³/3 + α₄D₄⁴ − 0.315 t⁴, α₄ = 0.0768 + 0.0479 r/t, D₄ = 2[(3r + 2t) − √2(2r + t)] (from memory; see section-torsion.ts)", () => {
    const [b, d, t, r] = [90, 150, 10, 12]; // mm
    const D4 = 2 * (3 * r + 2 * t - Math.sqrt(2 * (2 * r + t) * (2 * r + t)));
    const J = ((b + d - t) * t ** 3) / 3 + (0.0768 + 0.0479 * (r / t)) * D4 ** 4 - 0.315 * t ** 4;
    const p = props({ shape: "angle", b: b * MM, d: d * MM, t: t * MM, r: r * MM, r2: 6 * MM });
    expectClose(p.J, J * MM ** 4, 1e-12);
    // Which leg is called b does not matter.
    expectClose(props({ shape: "angle", b: d * MM, d: b * MM, t: t * MM, r: r * MM }).J, p.J, 1e-14);
  });

  // Saint-Venant's problem on a grid (prandtl.ts), in mm, against the formulas: within 1 % (the formulas' own fit and
  // the grid's steps along the fillet each a few tenths of a per cent); the plain sums fall 3 to 8 % short.
  it.each([
    [
      "angle 100×100×10, r 12",
      angleInside(100, 100, 10, 12),
      [0, 100, 0, 100],
      1,
      { shape: "angle", b: 100, d: 100, t: 10, r: 12 },
    ],
    ["angle 150×90×10, r 12", angleInside(90, 150, 10, 12), [0, 90, 0, 150], 1, { shape: "angle", b: 90, d: 150, t: 10, r: 12 }],
    ["angle 60×60×6, r 8", angleInside(60, 60, 6, 8), [0, 60, 0, 60], 0.6, { shape: "angle", b: 60, d: 60, t: 6, r: 8 }],
    [
      "channel 150×75, tf 10, tw 6, r 10",
      channelInside(75, 150, 10, 6, 10),
      [0, 75, -75, 75],
      1,
      { shape: "channel", b: 75, d: 150, tf: 10, tw: 6, r: 10 },
    ],
    [
      "channel 300×100, tf 15, tw 9, r 15",
      channelInside(100, 300, 15, 9, 15),
      [0, 100, -150, 150],
      1,
      { shape: "channel", b: 100, d: 300, tf: 15, tw: 9, r: 15 },
    ],
    [
      "I 300×150, tf 10, tw 6, r 8 (the I section's formula, rules 1 and 2)",
      iInside(150, 300, 10, 6, 8),
      [-75, 75, -150, 150],
      1,
      { shape: "i", b: 150, d: 300, tf: 10, tw: 6, r: 8 },
    ],
  ] as const)("%s: J within 1 % of Saint-Venant's problem solved on a grid", (_, inside, box, h, mm) => {
    const input = Object.fromEntries(Object.entries(mm).map(([k, v]) => [k, typeof v === "number" ? v * MM : v]));
    const J = buildSectionOrThrow(input).properties.J / MM ** 4;
    const grid = prandtlJExtrapolated(inside, box as unknown as [number, number, number, number], h);
    expectClose(J, grid, 0.01);
  });

  it("the grid itself: a solid 100 × 10 rectangle comes out to Saint-Venant's series within 1e-5", () => {
    const grid = prandtlJExtrapolated((x, y) => x >= 0 && x <= 100 && y >= 0 && y <= 10, [0, 100, 0, 10], 1);
    expectClose(grid, rectangleTorsion(100, 10), 1e-5);
  });

  it("without a root radius both keep the plain sum Σ b t³/3, as under rules 1", () => {
    const channel = { shape: "channel", b: 0.1, d: 0.3, tf: 0.015, tw: 0.01 } as const;
    expect(props(channel).J).toBe(props(channel, 1).J);
    const angle = { shape: "angle", b: 0.075, d: 0.1, t: 0.008 } as const;
    expectClose(props(angle).J, ((167 * 8 ** 3) / 3) * MM ** 4, 1e-13);
  });
});

describe("rules 2 as data", () => {
  it("every shape: rules 1's keys first, in their order and with their values (but J of channels and angles), then the additions", () => {
    const inputs = {
      i: { shape: "i", b: 0.15, d: 0.3, tf: 0.0105, tw: 0.007, r: 0.014 },
      channel: { shape: "channel", b: 0.09, d: 0.3, tf: 0.0155, tw: 0.009, r: 0.012 },
      "rectangular-hollow": { shape: "rectangular-hollow", b: 0.1, d: 0.15, t: 0.006, ro: 0.012 },
      "circular-hollow": { shape: "circular-hollow", D: 0.168, t: 0.006 },
      rectangle: { shape: "rectangle", b: 0.1, d: 0.2 },
      circle: { shape: "circle", D: 0.05 },
      angle: { shape: "angle", b: 0.1, d: 0.1, t: 0.01, r: 0.012, r2: 0.006 },
    } as const;
    for (const shape of SECTION_SHAPES) {
      const one = buildSectionOrThrow(inputs[shape], 1);
      const two = buildSectionOrThrow(inputs[shape], 2);
      expect([one.rules, two.rules]).toEqual([1, 2]);
      expect(two.dimensions).toEqual(one.dimensions);
      const [p1, p2] = [one.properties, two.properties] as unknown as Record<string, number>[];
      const keys1 = Object.keys(p1);
      expect(Object.keys(p2).slice(0, keys1.length), shape).toEqual(keys1);
      expect(Object.keys(p2).slice(keys1.length), shape).toEqual(
        shape === "channel" ? ["e0", "x0", "y0", "Cw"] : ["x0", "y0", "Cw"],
      );
      for (const key of keys1)
        if (!(key === "J" && (shape === "channel" || shape === "angle"))) expect(p2[key], `${shape} ${key}`).toBe(p1[key]);
    }
  });

  it("the newest rules are the default, and rules the builder does not have are refused", () => {
    const input = { shape: "rectangle", b: 0.1, d: 0.2 };
    expect(buildSectionOrThrow(input).rules).toBe(2);
    // @ts-expect-error: a rule that does not exist
    expect(() => buildSectionOrThrow(input, 3)).toThrow("The section builder's rules are 1 or 2.");
  });
});
