/**
 * The section builder: exact properties of a section from its dimensions (SI in and out: m, m², m³, m⁴, rad).
 *
 * Axes: x is the major axis of I sections, channels and hollow sections (horizontal, bending about it uses
 * the depth d); y is vertical. Ix = ∫y² dA about the centroid. S is the elastic modulus to the extreme
 * fibre (the smaller of the two when the section is not symmetric), Z the plastic modulus about the axis
 * that splits the area in two equal halves (the equal-area axis, not the centroidal one, for a channel's
 * y axis and for both axes of an angle). r = √(I/A).
 *
 * Geometry assumed, as tables of rolled sections do: flanges of I sections and channels are parallel unless a
 * taper is given (the inner face's slope; section-tapered.ts, where tf is the mean thickness); the root fillet is a quarter circle tangent to web and flange; flange tips are square. An angle's
 * toes may be rounded (toe radius r2, a quarter circle at the inner edge of each leg's tip, as angle tables
 * draw them); the other shapes have none. Hollow sections have concentric corners: ri = max(ro − t, 0).
 *
 * Rules: the builder's conventions are numbered, and a library entry names the rules its properties follow,
 * so an entry kept before a change of convention keeps its properties and its hash (runs record the hash).
 * - rules 1 (an entry that names none): the properties below, with J as described.
 * - rules 2 (the builder's own screen and every section added since): rules 1's, then a channel's and an
 *   angle's J with El Darwish & Johnston's fillet corrections, and at the end of each shape's list the
 *   shear centre (x0, y0; a channel's e0 too) and the warping constant Cw (section-torsion.ts says how).
 *
 * St Venant torsion constant J, convention by shape:
 * - circle and circular hollow: exact (J = 2I, the polar moment).
 * - rectangle: exact, from the series solution of the Saint-Venant problem (Timoshenko & Goodier, *Theory
 *   of Elasticity*, §109, from memory): J = (b t³/3)[1 − (192/π⁵)(t/b) Σ_{n odd} tanh(nπb/2t)/n⁵], t ≤ b.
 * - rectangular hollow: thin-walled, on the wall's mid-line — Bredt's formula 4Am²t/pm plus the open-wall
 *   term pm·t³/3 (the way EN 10210-2 and EN 10219-2 tabulate It, from memory), with mid-line corner radius
 *   (ro + ri)/2.
 * - I section, channel, angle: thin-walled open section, Σ b t³/3 over the plates (flanges full width,
 *   web clear between flanges; an angle's legs b and d − t). An I section with a root radius adds the
 *   fillet and flange-tip corrections of El Darwish & Johnston (1965), as used for the tables of SCI P363
 *   (from memory; section-torsion.ts); if that fit, made for rolled proportions, is not positive the plain
 *   sum is used. Under rules 1 channels and angles get no fillet correction; under rules 2 they get theirs.
 *   With tapered flanges (either rules): ∫ t³/3 along each tapered plate, no fillet correction (section-tapered.ts).
 *
 * Slenderness ratios (width-to-thickness), as AISC 360-16 Table B4.1b defines them (from memory):
 * - I section: b_2tf = b/(2tf) (case 10, flanges of rolled I-shapes in flexure); h_tw = h/tw with h = d −
 *   2tf − 2r, the clear depth between the fillets (B4.1b(a); between the flanges when r = 0; case 15).
 * - channel: b_tf = b/tf (case 10, the whole flange width for channels); h_tw as for I sections.
 * - rectangular hollow: b_t = (b − 2t − 2ri)/t and h_t = (d − 2t − 2ri)/t, the flat widths (B4.1b(d), case
 *   17 and 19; with t the thickness given — AISC's design thickness of 0.93 t for ERW tubes is not applied).
 * - circular hollow: D_t = D/t (case 20).
 * - angle: b_t = b/t and d_t = d/t, whole leg widths (Table B4.1a case 3).
 * And as EN 1993-1-1:2005 Table 5.2 measures them (from memory), where they differ:
 * - I section: c_tf = c/tf with c = (b − tw − 2r)/2, the outstand flange clear of the fillet (sheet 2); the
 *   web's c/tw is h_tw above (c = d − 2tf − 2r, sheet 1).
 * - channel: c_tf = (b − tw − r)/tf.
 * - angle: bd_2t = (b + d)/(2t) (sheet 3; with h/t, which is d_t or b_t).
 */
import { angleOutline, centroidalOf, farthestFrom, plasticModulus, rect, spandrel, type Part } from "./section-geometry";
import { SECTION_SHAPES, sectionInputSchema, type SectionDimensions, type SectionShape } from "./section-schema";
import {
  angleTorsionConstant,
  angleWarping,
  CENTRED,
  channelTorsionConstant,
  channelWarping,
  flangedPlainJ,
  iTorsionConstant,
  iWarping,
  type Warping,
} from "./section-torsion";
import { taperedChannelParts, taperedClearDepth, taperedIParts, taperedJ } from "./section-tapered";

/** The builder's rules, numbered (see above); the newest is what the builder's screen and new sections use. */
export const SECTION_RULES = [1, 2] as const;
export type SectionRules = (typeof SECTION_RULES)[number];
export const LATEST_SECTION_RULES: SectionRules = 2;

interface Common {
  A: number;
  Ix: number;
  Iy: number;
  Sx: number;
  Sy: number;
  Zx: number;
  Zy: number;
  rx: number;
  ry: number;
  J: number;
}

/** Rules 2's additions, last in every shape's list: the shear centre from the centroid (m) and Cw (m⁶). */
type Added = Partial<Warping>;

/** Properties by shape, each in a fixed key order (the object is hashed as it is). */
export interface SectionPropertiesByShape {
  i: Common & { b_2tf: number; h_tw: number; c_tf: number } & Added;
  /**
   * xc: centroid from the back of the web; xp: plastic neutral axis (y axis) from the back of the web; e0
   * (rules 2): the shear centre from the web's mid-line, on the side away from the flanges.
   */
  channel: Common & { xc: number; xp: number; b_tf: number; h_tw: number; c_tf: number; e0?: number } & Added;
  "rectangular-hollow": Common & { b_t: number; h_t: number } & Added;
  "circular-hollow": Common & { D_t: number } & Added;
  rectangle: Common & Added;
  circle: Common & Added;
  /**
   * Geometric axes x ∥ leg b and y ∥ leg d; xc, yc the centroid from the heel (the outside corner); Ixy the
   * product of inertia; u, v the principal axes (Iu ≥ Iv), alpha the angle from x to u (radians,
   * anticlockwise, in (−π/2, π/2]). Zx, Zy are about the geometric axes; no plastic moduli are given about
   * the principal axes (for an unequal angle the equal-area axis of such bending is not parallel to them).
   */
  angle: Common & {
    xc: number;
    yc: number;
    Ixy: number;
    Iu: number;
    Iv: number;
    alpha: number;
    Su: number;
    Sv: number;
    ru: number;
    rv: number;
    b_t: number;
    d_t: number;
    bd_2t: number;
  } & Added;
}
export type SectionProperties = SectionPropertiesByShape[SectionShape];

export type Section = {
  [S in SectionShape]: {
    shape: S;
    /** The rules the properties follow (not part of a library entry's properties). */
    rules: SectionRules;
    dimensions: Extract<SectionDimensions, { shape: S }>;
    properties: SectionPropertiesByShape[S];
  };
}[SectionShape];

export interface SectionProblem {
  /** The dimension concerned ("tf"), or "shape". */
  path: string;
  message: string;
}

export type BuildSectionResult = { ok: true; section: Section } | { ok: false; problems: SectionProblem[] };

/**
 * Builds a section from its shape and dimensions (metres) by the rules named (the newest unless named), or says
 * what is wrong with them. Never throws.
 */
export function buildSection(input: unknown, rules: SectionRules = LATEST_SECTION_RULES): BuildSectionResult {
  const shape = (input as { shape?: unknown } | null)?.shape;
  if (typeof shape !== "string" || !(SECTION_SHAPES as readonly string[]).includes(shape)) {
    return { ok: false, problems: [{ path: "shape", message: `Choose the shape: one of ${SECTION_SHAPES.join(", ")}.` }] };
  }
  const parsed = sectionInputSchema.safeParse(input);
  if (!parsed.success) {
    return {
      ok: false,
      problems: parsed.error.issues.map((i) => ({ path: i.path.map(String).join(".") || "shape", message: i.message })),
    };
  }
  if (!(SECTION_RULES as readonly unknown[]).includes(rules))
    return {
      ok: false,
      problems: [{ path: "rules", message: `The section builder's rules are ${SECTION_RULES.join(" or ")}.` }],
    };
  const section = propertiesOf(parsed.data, rules);
  const bad = Object.entries(section.properties).find(([, v]) => !Number.isFinite(v));
  // The schema keeps every input inside the shapes' ranges; this guard only keeps a NaN from ever leaving.
  if (bad) return { ok: false, problems: [{ path: bad[0], message: `The ${bad[0]} of this section could not be computed.` }] };
  return { ok: true, section };
}

export function buildSectionOrThrow(input: unknown, rules: SectionRules = LATEST_SECTION_RULES): Section {
  const out = buildSection(input, rules);
  if (!out.ok) throw new Error(out.problems.map((p) => p.message).join(" "));
  return out.section;
}

function propertiesOf(dims: SectionDimensions, rules: SectionRules): Section {
  const first = firstProperties(dims);
  // Rules 2: J replaced where its convention changed (the key keeps its place) and the additions appended, so
  // rules 1's keys are always a prefix of rules 2's, in the same order.
  const properties: SectionProperties = rules === 1 ? first : { ...first, ...laterProperties(dims, first) };
  return { shape: dims.shape, rules, dimensions: dims, properties } as Section;
}

function firstProperties(dims: SectionDimensions): SectionProperties {
  switch (dims.shape) {
    case "i":
      return iSection(dims);
    case "channel":
      return channel(dims);
    case "rectangular-hollow":
      return rectangularHollow(dims);
    case "circular-hollow":
      return circularHollow(dims);
    case "rectangle":
      return solidRectangle(dims);
    case "circle":
      return solidCircle(dims);
    case "angle":
      return angle(dims);
  }
}

function laterProperties(dims: SectionDimensions, first: SectionProperties): Partial<SectionProperties> {
  switch (dims.shape) {
    case "i":
      return iWarping(first.Iy, dims.d, dims.tf);
    case "channel": {
      // A tapered channel keeps its thin-walled J: the fillet correction is fitted to parallel flanges.
      const J = dims.taper ? first.J : channelTorsionConstant(dims);
      return { J, ...channelWarping(dims, (first as SectionPropertiesByShape["channel"]).xc) };
    }
    case "angle": {
      const { xc, yc } = first as SectionPropertiesByShape["angle"];
      return { J: angleTorsionConstant(dims), ...angleWarping(dims.t, xc, yc) };
    }
    default:
      return CENTRED;
  }
}
type Dims<S extends SectionShape> = Extract<SectionDimensions, { shape: S }>;

function common(p: { A: number; Ix: number; Iy: number; Sx: number; Sy: number; Zx: number; Zy: number; J: number }): Common {
  return {
    A: p.A,
    Ix: p.Ix,
    Iy: p.Iy,
    Sx: p.Sx,
    Sy: p.Sy,
    Zx: p.Zx,
    Zy: p.Zy,
    rx: Math.sqrt(p.Ix / p.A),
    ry: Math.sqrt(p.Iy / p.A),
    J: p.J,
  };
}

/** A section symmetric about both axes, its centre at the origin, b wide and d deep. */
function doublySymmetric(parts: readonly Part[], b: number, d: number, J: number): Common {
  const g = centroidalOf(parts);
  return common({
    A: g.A,
    Ix: g.Ix,
    Iy: g.Iy,
    Sx: g.Ix / (d / 2),
    Sy: g.Iy / (b / 2),
    Zx: plasticModulus(parts, "y", { lo: -d / 2, hi: d / 2, symmetricAt: 0 }).Z,
    Zy: plasticModulus(parts, "x", { lo: -b / 2, hi: b / 2, symmetricAt: 0 }).Z,
    J,
  });
}

/** Origin at the centre; flanges full width, web between them, four root fillets. */
function iSection({ b, d, tf, tw, r, taper }: Dims<"i">): SectionPropertiesByShape["i"] {
  // A taper left out (or zero) takes exactly the parallel-flange path below, so such a section is what it always was.
  if (taper) {
    const tapered = { b, d, tf, tw, r, taper };
    return {
      ...doublySymmetric(taperedIParts(tapered), b, d, taperedJ("i", tapered)),
      b_2tf: b / (2 * tf),
      h_tw: taperedClearDepth("i", tapered) / tw,
      c_tf: (b - tw - 2 * r) / (2 * tf),
    };
  }
  const yi = d / 2 - tf;
  const parts: Part[] = [rect(-b / 2, b / 2, yi, d / 2), rect(-b / 2, b / 2, -d / 2, -yi), rect(-tw / 2, tw / 2, -yi, yi)];
  if (r > 0)
    for (const sx of [1, -1] as const)
      for (const sy of [1, -1] as const) parts.push(spandrel((sx * tw) / 2, sy * yi, sx, -sy as 1 | -1, r));
  return {
    ...doublySymmetric(parts, b, d, iTorsionConstant({ b, d, tf, tw, r })),
    b_2tf: b / (2 * tf),
    h_tw: (d - 2 * tf - 2 * r) / tw,
    c_tf: (b - tw - 2 * r) / (2 * tf),
  };
}

/** Origin at the back of the web, mid-depth; flanges point towards +x. */
function channel({ b, d, tf, tw, r, taper }: Dims<"channel">): SectionPropertiesByShape["channel"] {
  const yi = d / 2 - tf;
  const tapered = taper ? { b, d, tf, tw, r, taper } : null;
  // A taper left out (or zero) builds exactly the parallel-flange parts, so such a section is what it always was.
  const parts: Part[] = tapered
    ? taperedChannelParts(tapered)
    : [rect(0, b, yi, d / 2), rect(0, b, -d / 2, -yi), rect(0, tw, -yi, yi)];
  if (r > 0 && !tapered) parts.push(spandrel(tw, yi, 1, -1, r), spandrel(tw, -yi, 1, 1, r));
  const g = centroidalOf(parts);
  const zy = plasticModulus(parts, "x", { lo: 0, hi: b });
  return {
    ...common({
      A: g.A,
      Ix: g.Ix,
      Iy: g.Iy,
      Sx: g.Ix / (d / 2),
      Sy: g.Iy / Math.max(g.xc, b - g.xc),
      Zx: plasticModulus(parts, "y", { lo: -d / 2, hi: d / 2, symmetricAt: 0 }).Z,
      Zy: zy.Z,
      J: tapered ? taperedJ("channel", tapered) : flangedPlainJ({ b, d, tf, tw, r }),
    }),
    xc: g.xc,
    xp: zy.c,
    b_tf: b / tf,
    h_tw: (tapered ? taperedClearDepth("channel", tapered) : d - 2 * tf - 2 * r) / tw,
    c_tf: (b - tw - r) / tf,
  };
}

/** Origin at the centre: the outer outline less its rounded corners, less the hole with its own rounded corners. */
function rectangularHollow({ b, d, t, ro }: Dims<"rectangular-hollow">): SectionPropertiesByShape["rectangular-hollow"] {
  const ri = Math.max(ro - t, 0);
  const bi = b / 2 - t;
  const di = d / 2 - t;
  const parts: Part[] = [rect(-b / 2, b / 2, -d / 2, d / 2), rect(-bi, bi, -di, di, -1)];
  for (const sx of [1, -1] as const) {
    for (const sy of [1, -1] as const) {
      const inward = [-sx as 1 | -1, -sy as 1 | -1] as const;
      if (ro > 0) parts.push(spandrel((sx * b) / 2, (sy * d) / 2, ...inward, ro, -1));
      if (ri > 0) parts.push(spandrel(sx * bi, sy * di, ...inward, ri, 1));
    }
  }
  // Mid-line of the wall: a rectangle (b − t) × (d − t) with corners of radius rm.
  const rm = (ro + ri) / 2;
  const Am = (b - t) * (d - t) - (4 - Math.PI) * rm * rm;
  const pm = 2 * (b - t + (d - t)) - 2 * (4 - Math.PI) * rm;
  return {
    ...doublySymmetric(parts, b, d, (4 * Am * Am * t) / pm + (pm * t ** 3) / 3),
    b_t: (b - 2 * t - 2 * ri) / t,
    h_t: (d - 2 * t - 2 * ri) / t,
  };
}

/** Exact: A = π(D² − Di²)/4, I = π(D⁴ − Di⁴)/64, Z = (D³ − Di³)/6, J = 2I. */
function circularHollow({ D, t }: Dims<"circular-hollow">): SectionPropertiesByShape["circular-hollow"] {
  const Di = D - 2 * t;
  const A = (Math.PI * (D * D - Di * Di)) / 4;
  const I = (Math.PI * (D ** 4 - Di ** 4)) / 64;
  const S = I / (D / 2);
  const Z = (D ** 3 - Di ** 3) / 6;
  return { ...common({ A, Ix: I, Iy: I, Sx: S, Sy: S, Zx: Z, Zy: Z, J: 2 * I }), D_t: D / t };
}

function solidRectangle({ b, d }: Dims<"rectangle">): SectionPropertiesByShape["rectangle"] {
  return common({
    A: b * d,
    Ix: (b * d ** 3) / 12,
    Iy: (d * b ** 3) / 12,
    Sx: (b * d * d) / 6,
    Sy: (d * b * b) / 6,
    Zx: (b * d * d) / 4,
    Zy: (d * b * b) / 4,
    J: rectangleTorsion(b, d),
  });
}

/** Saint-Venant's series for a solid rectangle; the terms fall as 1/n⁵, so 500 of them leave < 1e-13. */
export function rectangleTorsion(side1: number, side2: number): number {
  const long = Math.max(side1, side2);
  const t = Math.min(side1, side2);
  let sum = 0;
  for (let n = 1; n < 1000; n += 2) sum += Math.tanh((n * Math.PI * long) / (2 * t)) / n ** 5;
  return ((long * t ** 3) / 3) * (1 - ((192 / Math.PI ** 5) * t * sum) / long);
}

/** Exact: A = πD²/4, I = πD⁴/64, S = πD³/32, Z = D³/6, J = πD⁴/32. */
function solidCircle({ D }: Dims<"circle">): SectionPropertiesByShape["circle"] {
  const I = (Math.PI * D ** 4) / 64;
  const S = (Math.PI * D ** 3) / 32;
  const Z = D ** 3 / 6;
  return common({ A: (Math.PI * D * D) / 4, Ix: I, Iy: I, Sx: S, Sy: S, Zx: Z, Zy: Z, J: (Math.PI * D ** 4) / 32 });
}

/** Origin at the heel; leg d up the y axis (x from 0 to t), leg b along the x axis, the root fillet at (t, t). */
function angle({ b, d, t, r, r2 }: Dims<"angle">): SectionPropertiesByShape["angle"] {
  const parts: Part[] = [rect(0, t, 0, d), rect(t, b, 0, t)];
  if (r > 0) parts.push(spandrel(t, t, 1, 1, r));
  if (r2 > 0) parts.push(spandrel(b, t, -1, -1, r2, -1), spandrel(t, d, -1, -1, r2, -1));
  const g = centroidalOf(parts);
  const mean = (g.Ix + g.Iy) / 2;
  const radius = Math.hypot((g.Ix - g.Iy) / 2, g.Ixy);
  const Iu = mean + radius;
  // Iv by the product IuIv = IxIy − Ixy² (no cancellation when the two are close to each other).
  const Iv = (g.Ix * g.Iy - g.Ixy * g.Ixy) / Iu;
  const alpha = g.Ixy === 0 && g.Ix >= g.Iy ? 0 : Math.atan2(-2 * g.Ixy, g.Ix - g.Iy) / 2;
  const [c, s] = [Math.cos(alpha), Math.sin(alpha)];
  const outline = angleOutline(b, d, t, r2, g.xc, g.yc);
  const [toU, toV] = [farthestFrom(outline, -s, c), farthestFrom(outline, c, s)];
  const A = g.A;
  return {
    ...common({
      A,
      Ix: g.Ix,
      Iy: g.Iy,
      Sx: g.Ix / Math.max(g.yc, d - g.yc),
      Sy: g.Iy / Math.max(g.xc, b - g.xc),
      Zx: plasticModulus(parts, "y", { lo: 0, hi: d }).Z,
      Zy: plasticModulus(parts, "x", { lo: 0, hi: b }).Z,
      J: ((b + d - t) * t ** 3) / 3,
    }),
    xc: g.xc,
    yc: g.yc,
    Ixy: g.Ixy,
    Iu,
    Iv,
    alpha,
    Su: Iu / toU,
    Sv: Iv / toV,
    ru: Math.sqrt(Iu / A),
    rv: Math.sqrt(Iv / A),
    b_t: b / t,
    d_t: d / t,
    bd_2t: (b + d) / (2 * t),
  };
}
