/**
 * I sections and channels with tapered flanges (section-schema.ts, `taper`): the parts the builder integrates and the
 * thin-walled J. The inner face of each flange slopes by `taper` (rise over run), the flange thicker at the web; tf
 * is the thickness half-way along the outstand, so the flange is tf + taper·o/2 thick at the web's face and
 * tf − taper·o/2 at its tip, o the outstand ((b − tw)/2 for an I section, b − tw for a channel). The root fillet
 * is tangent to the web and to the sloped face (section-curves.ts); flange tips are square.
 *
 * J with a taper, thin-walled: Σ ∫ t³/3 along each plate — an outstand whose thickness runs from t₁ to t₂ gives
 * o(t₁ + t₂)(t₁² + t₂²)/12, the flange over the web tw·t₁³/3, the web between the flanges' roots (d − 2t₁)tw³/3.
 * No fillet correction: El Darwish & Johnston's fits are for parallel flanges.
 */
import { fillet, poly, type Pt } from "./section-curves";
import { filletReach } from "./section-schema";
import { rect, type Part } from "./section-geometry";

type Tapered = { b: number; d: number; tf: number; tw: number; r: number; taper: number };

/** The flange's thickness at the web's face and at the tip, and the outstand. */
function flangeOf({ tf, taper }: Tapered, outstand: number) {
  return { root: tf + (taper * outstand) / 2, tip: tf - (taper * outstand) / 2 };
}

const outstandOf = (shape: "i" | "channel", s: Tapered) => (shape === "i" ? (s.b - s.tw) / 2 : s.b - s.tw);

/** An outstand's ∫ t³/3 dx with t running linearly from t1 to t2 over length o. */
const outstandJ = (o: number, t1: number, t2: number) => (o * (t1 + t2) * (t1 * t1 + t2 * t2)) / 12;

/** Parts of a tapered I section, origin at the centre (as iSection in sections.ts). */
export function taperedIParts(s: Tapered): Part[] {
  const { root, tip } = flangeOf(s, outstandOf("i", s));
  const [hb, hd, xw] = [s.b / 2, s.d / 2, s.tw / 2];
  const [yRoot, yTip] = [hd - root, hd - tip];
  const parts: Part[] = [rect(-xw, xw, -yRoot, yRoot)];
  for (const sy of [1, -1] as const) {
    const flange: Pt[] = [
      [-hb, sy * yTip],
      [-xw, sy * yRoot],
      [xw, sy * yRoot],
      [hb, sy * yTip],
      [hb, sy * hd],
      [-hb, sy * hd],
    ];
    parts.push(poly(flange));
  }
  if (s.r > 0) parts.push(...fillets(s, [1, -1], xw, yRoot));
  return parts;
}

/** Parts of a tapered channel, origin at the back of the web at mid-depth, flanges towards +x (as channel in sections.ts). */
export function taperedChannelParts(s: Tapered): Part[] {
  const { root, tip } = flangeOf(s, outstandOf("channel", s));
  const hd = s.d / 2;
  const [yRoot, yTip] = [hd - root, hd - tip];
  const parts: Part[] = [rect(0, s.tw, -yRoot, yRoot)];
  for (const sy of [1, -1] as const) {
    const flange: Pt[] = [
      [0, sy * yRoot],
      [s.tw, sy * yRoot],
      [s.b, sy * yTip],
      [s.b, sy * hd],
      [0, sy * hd],
    ];
    parts.push(poly(flange));
  }
  if (s.r > 0) parts.push(...fillets(s, [1], s.tw, yRoot));
  return parts;
}

/** The root fillets at the web's faces x = ±xw (the sides given) under each flange. */
function fillets(s: Tapered, sides: readonly (1 | -1)[], xw: number, yRoot: number): Part[] {
  const theta = Math.atan(s.taper);
  const out: Part[] = [];
  for (const sx of sides)
    for (const sy of [1, -1] as const)
      out.push(fillet([sx * xw, sy * yRoot], [0, -sy], [sx * Math.cos(theta), sy * Math.sin(theta)], s.r));
  return out;
}

/** Thin-walled J of a tapered I section or channel (see above). */
export function taperedJ(shape: "i" | "channel", s: Tapered): number {
  const o = outstandOf(shape, s);
  const { root, tip } = flangeOf(s, o);
  const outstands = shape === "i" ? 2 : 1;
  const flange = (s.tw * root ** 3) / 3 + outstands * outstandJ(o, root, tip);
  return 2 * flange + ((s.d - 2 * root) * s.tw ** 3) / 3;
}

/** The web's depth clear of the flanges and fillets: d − 2(t at the web + the fillet's reach along it). */
export function taperedClearDepth(shape: "i" | "channel", s: Tapered): number {
  const { root } = flangeOf(s, outstandOf(shape, s));
  return s.d - 2 * (root + filletReach(s.r, s.taper));
}
