/**
 * The section builder's input: a shape and its dimensions in metres, checked with zod at the boundary so the
 * builder never sees a dimension that would give a NaN or a section that cannot exist. Every refusal is a
 * sentence that names the dimension and its value in millimetres, the unit a drawing states them in.
 */
import { z } from "@/lib/domain/zod";

export const SECTION_SHAPES = ["i", "channel", "rectangular-hollow", "circular-hollow", "rectangle", "circle", "angle"] as const;
export type SectionShape = (typeof SECTION_SHAPES)[number];

/** A shape's name in a sentence ("… which an I section needs"). */
export const SHAPE_NAMES: Record<SectionShape, string> = {
  i: "an I section",
  channel: "a channel",
  "rectangular-hollow": "a rectangular hollow section",
  "circular-hollow": "a circular hollow section",
  rectangle: "a solid rectangle",
  circle: "a solid circle",
  angle: "an angle",
};

/** I sections and channels name their dimensions alike. */
const FLANGED_LABELS = {
  b: "flange width b",
  d: "depth d",
  tf: "flange thickness tf",
  tw: "web thickness tw",
  r: "root radius r",
  taper: "inner flange slope taper",
} as const;

/** What each shape calls its dimensions, for the sentences (and the screens). */
export const DIMENSION_LABELS = {
  i: FLANGED_LABELS,
  channel: FLANGED_LABELS,
  "rectangular-hollow": { b: "width b", d: "depth d", t: "wall thickness t", ro: "outer corner radius ro" },
  "circular-hollow": { D: "outside diameter D", t: "wall thickness t" },
  rectangle: { b: "width b", d: "depth d" },
  circle: { D: "diameter D" },
  angle: { b: "leg b", d: "leg d", t: "thickness t", r: "root radius r", r2: "toe radius r2" },
} as const satisfies Record<SectionShape, Record<string, string>>;

/** Every dimension key any shape uses. */
export type DimensionKey = { [S in SectionShape]: keyof (typeof DIMENSION_LABELS)[S] }[SectionShape];

/** A length in millimetres for a sentence: six significant figures, no trailing zeros. */
export function mm(metres: number): string {
  return `${Number((metres * 1000).toPrecision(6))} mm`;
}

/** Bounds of any dimension: beyond them the input is a slip (mm typed as metres), and the integrals would underflow. */
const SMALLEST = 1e-5;
const LARGEST = 10;

function length(label: string) {
  return z
    .number({
      error: (issue) => (issue.input === undefined ? `Give the ${label}.` : `The ${label} must be a finite number (in metres).`),
    })
    .refine((v) => v > 0, {
      error: (issue) => `The ${label} must be greater than zero (it is ${mm(issue.input as number)}).`,
      abort: true,
    })
    .refine((v) => v >= SMALLEST, {
      error: (issue) => `The ${label} is ${mm(issue.input as number)}: no structural section is thinner than ${mm(SMALLEST)}.`,
      abort: true,
    })
    .refine((v) => v <= LARGEST, {
      // Millimetres given where metres are wanted are the likely cause.
      error: (issue) =>
        `The ${label} is ${mm(issue.input as number)}, more than ${LARGEST} m: give dimensions in metres (300 mm is 0.3).`,
    });
}

/** A radius may be zero (a sharp corner) and is zero when left out. */
function radius(label: string) {
  return z
    .number({ error: `The ${label} must be a finite number (in metres), or left out for a sharp corner.` })
    .refine((v) => v >= 0, { error: (issue) => `The ${label} must not be negative (it is ${mm(issue.input as number)}).` })
    .default(0);
}

/** A radius "must not exceed" a limit worked out from other dimensions: equal within rounding is allowed. */
const exceeds = (value: number, limit: number) => value > limit * (1 + 1e-12);

type Ctx = z.core.$RefinementCtx;
const fail = (ctx: Ctx, path: string, message: string) => ctx.addIssue({ code: "custom", path: [path], message });

/** Steepest flange slope accepted: 1 in 2 (27°), well past any rolled section's (1:6, 8°, 14 %). */
export const STEEPEST_TAPER = 0.5;

/**
 * A flange's inner face may slope (a tapered flange): `taper` is the slope as a ratio, rise over run (0.14 for
 * 14 %, 1/6 for 1:6, tan 8° for 8°), the flange thicker towards the web. Left out, the flanges are parallel and
 * the section is exactly what it was before tapers were known; tf is then the mean flange thickness, measured
 * half-way along the outstand from the web's face to the tip, as tables of tapered sections give it.
 */
function taper(label: string) {
  return z
    .number({ error: `The ${label} must be a finite number (a ratio: 0.14 for 14 %), or left out for parallel flanges.` })
    .refine((v) => v >= 0, { error: (issue) => `The ${label} must not be negative (it is ${issue.input as number}).` })
    .refine((v) => v <= STEEPEST_TAPER, {
      error: (issue) =>
        `The ${label} is ${issue.input as number}, steeper than 1 in 2: give it as a ratio (14 % is 0.14, 1:6 is 0.1667).`,
    })
    .optional();
}

/** How far along a fillet's faces it reaches from the corner when the flange's face slopes by `slope`: r tan(45° − θ/2). */
export function filletReach(r: number, slope: number): number {
  return r * Math.tan(Math.PI / 4 - Math.atan(slope) / 2);
}

/** I and channel sections share their dimensions; they differ in where the fillets and the web sit. */
function flanged<S extends "i" | "channel">(shape: S) {
  const n = DIMENSION_LABELS[shape];
  return z
    .object({
      shape: z.literal(shape),
      b: length(n.b),
      d: length(n.d),
      tf: length(n.tf),
      tw: length(n.tw),
      r: radius(n.r),
      taper: taper(n.taper),
    })
    .superRefine((s, ctx) => {
      if (2 * s.tf >= s.d) {
        fail(
          ctx,
          "tf",
          `The flange thickness tf = ${mm(s.tf)} leaves no web in a ${mm(s.d)} deep section: 2 tf must be less than d.`,
        );
        return;
      }
      if (s.tw >= s.b) {
        fail(
          ctx,
          "tw",
          `The web thickness tw = ${mm(s.tw)} leaves no flange outstand: it must be less than the flange width b = ${mm(s.b)}.`,
        );
        return;
      }
      if (s.taper) {
        // A slope out of range is named by its own check above.
        if (s.taper > 0 && s.taper <= STEEPEST_TAPER) taperedFits(shape, { ...s, taper: s.taper }, ctx);
        return;
      }
      const outstand = shape === "i" ? (s.b - s.tw) / 2 : s.b - s.tw;
      if (exceeds(s.r, outstand)) {
        fail(
          ctx,
          "r",
          `The root radius r = ${mm(s.r)} does not fit beside the web: it must not exceed the flange outstand ${shape === "i" ? "(b − tw)/2" : "b − tw"} = ${mm(outstand)}.`,
        );
      }
      if (2 * s.tf + 2 * s.r >= s.d) {
        fail(
          ctx,
          "r",
          `The root radius r = ${mm(s.r)} leaves no straight web: the flanges and fillets take 2 tf + 2 r = ${mm(2 * s.tf + 2 * s.r)} of the ${mm(s.d)} depth.`,
        );
      }
    });
}

/** A tapered flange's own limits: the tip keeps some thickness, the fillet fits the outstand and leaves a straight web. */
function taperedFits(
  shape: "i" | "channel",
  s: { b: number; d: number; tf: number; tw: number; r: number; taper: number },
  ctx: Ctx,
) {
  const outstand = shape === "i" ? (s.b - s.tw) / 2 : s.b - s.tw;
  const change = (s.taper * outstand) / 2;
  if (change >= s.tf) {
    fail(
      ctx,
      "taper",
      `The inner flange slope ${s.taper} thins the flange to nothing at its tip: over half the outstand (${mm(outstand / 2)}) it takes ${mm(change)}, more than tf = ${mm(s.tf)}.`,
    );
    return;
  }
  const root = s.tf + change;
  const reach = filletReach(s.r, s.taper);
  if (exceeds(reach * Math.cos(Math.atan(s.taper)), outstand)) {
    fail(ctx, "r", `The root radius r = ${mm(s.r)} does not fit beside the web: its fillet reaches past the flange's tip.`);
    return;
  }
  if (2 * (root + reach) >= s.d) {
    fail(
      ctx,
      s.r > 0 ? "r" : "tf",
      `The flanges and fillets leave no straight web: at the web they take 2 (tf + ${mm(change)} of slope${s.r > 0 ? " + fillet" : ""}) = ${mm(2 * (root + reach))} of the ${mm(s.d)} depth.`,
    );
  }
}

const n = DIMENSION_LABELS;
export const sectionInputSchema = z.discriminatedUnion("shape", [
  flanged("i"),
  flanged("channel"),
  z
    .object({
      shape: z.literal("rectangular-hollow"),
      b: length(n["rectangular-hollow"].b),
      d: length(n["rectangular-hollow"].d),
      t: length(n["rectangular-hollow"].t),
      ro: radius(n["rectangular-hollow"].ro),
    })
    .superRefine((s, ctx) => {
      for (const [key, side, word] of [
        ["b", s.b, "wide"],
        ["d", s.d, "deep"],
      ] as const) {
        if (2 * s.t >= side) {
          fail(
            ctx,
            "t",
            `The wall thickness t = ${mm(s.t)} leaves no hole in a ${mm(side)} ${word} section: 2 t must be less than ${key}.`,
          );
          return;
        }
      }
      const most = Math.min(s.b, s.d) / 2;
      if (exceeds(s.ro, most)) {
        fail(
          ctx,
          "ro",
          `The outer corner radius ro = ${mm(s.ro)} does not fit: it must not exceed half the smaller side, ${mm(most)}.`,
        );
      }
    }),
  z
    .object({ shape: z.literal("circular-hollow"), D: length(n["circular-hollow"].D), t: length(n["circular-hollow"].t) })
    .superRefine((s, ctx) => {
      if (2 * s.t >= s.D) {
        fail(
          ctx,
          "t",
          `The wall thickness t = ${mm(s.t)} leaves no hole in a ${mm(s.D)} diameter tube: t must be less than D/2 = ${mm(s.D / 2)}.`,
        );
      }
    }),
  z.object({ shape: z.literal("rectangle"), b: length(n.rectangle.b), d: length(n.rectangle.d) }),
  z.object({ shape: z.literal("circle"), D: length(n.circle.D) }),
  z
    .object({
      shape: z.literal("angle"),
      b: length(n.angle.b),
      d: length(n.angle.d),
      t: length(n.angle.t),
      r: radius(n.angle.r),
      r2: radius(n.angle.r2),
    })
    .superRefine((s, ctx) => {
      for (const [key, leg] of [
        ["b", s.b],
        ["d", s.d],
      ] as const) {
        if (s.t >= leg) {
          fail(
            ctx,
            "t",
            `The thickness t = ${mm(s.t)} leaves nothing of the ${mm(leg)} leg ${key}: it must be less than ${key}.`,
          );
          return;
        }
      }
      const most = Math.min(s.b, s.d) - s.t;
      if (exceeds(s.r, most)) {
        fail(
          ctx,
          "r",
          `The root radius r = ${mm(s.r)} does not fit between the legs: it must not exceed the shorter leg less t, ${mm(most)}.`,
        );
        return;
      }
      if (exceeds(s.r2, s.t)) {
        fail(ctx, "r2", `The toe radius r2 = ${mm(s.r2)} does not fit the thickness: it must not exceed t = ${mm(s.t)}.`);
      } else if (exceeds(s.r + s.r2, most)) {
        fail(
          ctx,
          "r2",
          `The toe radius r2 = ${mm(s.r2)} meets the root fillet: r + r2 = ${mm(s.r + s.r2)} must not exceed the shorter leg less t, ${mm(most)}.`,
        );
      }
    }),
]);

export type SectionInput = z.input<typeof sectionInputSchema>;
export type SectionDimensions = z.output<typeof sectionInputSchema>;
