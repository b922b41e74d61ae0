/**
 * The section builder's torsion and warping (sections.ts): St Venant's J with the root-fillet corrections of
 * rolled sections, the warping constant Cw and the shear centre. SI in and out (m, m⁴, m⁶).
 *
 * J's fillet corrections are El Darwish & Johnston's (1965, "Torsion of structural shapes", J. Struct. Div.
 * ASCE 91(ST1)), each in the form a steel handbook prints it; every one is recalled, not read from the page
 * (from memory), and each is applied only with a root radius (r > 0) and only while it stays positive:
 * - I section, as SCI P363 prints it for rolled I sections:
 *   J = (2/3) b tf³ + (1/3)(d − 2tf) tw³ + 2α₁D₁⁴ − 0.420 tf⁴,
 *   α₁ = −0.042 + 0.2204 tw/tf + 0.1355 r/tf − 0.0865 r tw/tf² − 0.0725 tw²/tf², D₁ = ((tf + r)² + tw(r + tw/4))/(2r + tf).
 * - channel (rules 2), as SCI P363 prints it for parallel flange channels:
 *   J = (2/3) b tf³ + (1/3)(d − 2tf) tw³ + 2α₃D₃⁴ − 0.420 tf⁴,
 *   α₃ = −0.0908 + 0.2621 tw/tf + 0.1231 r/tf − 0.0752 tw r/tf² − 0.0945 tw²/tf², D₃ = 2[(3r + tw + tf) − √(2(2r + tw)(2r + tf))].
 *   The flanges are whole b × tf plates, each with two ends, as an I section's are: hence 0.420 tf⁴ again.
 * - angle (rules 2): J = (b + d − t)t³/3 + α₄D₄⁴ − 0.315 t⁴, α₄ = 0.0768 + 0.0479 r/t,
 *   D₄ = 2[(3r + 2t) − √2(2r + t)] (the diameter of the circle inscribed at the root, as in the channel's D₃).
 *   α₄ is as recalled from SCI P363's notes on angles (from memory, less surely than the others); the end term
 *   counts 0.105 t⁴ at each of the three ends a leg-by-leg count gives (two toes and the heel), as the plates
 *   of Roark's Formulas for Stress and Strain (7th ed., Table 10.7) count them. Neither was read from the page,
 *   so the tests check the whole against Saint-Venant's problem solved on a grid: within 0.3 % on seven angles,
 *   where Roark's own L-section formula, as recalled (α = 0.07 + 0.076 r/t), came out 0.5 to 3.8 % high.
 *
 * Warping constant Cw and shear centre, thin-walled (the wall's mid-line; fillets and flange-tip rounding left
 * out), as steel handbooks tabulate them:
 * - I section, doubly symmetric: shear centre at the centroid; Cw = Iy h0²/4 with Iy the whole section's and
 *   h0 = d − tf the distance between the flanges' centroids.
 * - channel: shear centre on the axis of symmetry, e0 = 3b'²tf/(6b'tf + h'tw) from the web's mid-line, on the
 *   side away from the flanges; Cw = (tf b'³h'²/12)(3b'tf + 2h'tw)/(6b'tf + h'tw), with b' = b − tw/2 the
 *   flange width to the web's mid-line and h' = d − tf the distance between the flanges' mid-lines.
 * - angle: shear centre where the legs' mid-lines meet, (t/2, t/2) from the heel; two straight thin legs
 *   through one point do not warp, so Cw = 0 (the through-thickness warping of thick legs is left out).
 * - rectangular and circular hollow: shear centre at the centroid; closed sections warp so little that Cw is
 *   taken as 0 (exact for a circular tube and for a square one of even wall).
 * - solid rectangle and circle: shear centre at the centroid; Cw = 0 (exact for a circle; a solid rectangle's
 *   is small and conventionally taken as 0).
 * x0, y0 are the shear centre less the centroid along the section's x and y axes (zero where they coincide).
 * With tapered flanges tf is the mean thickness (section-tapered.ts), and these thin-walled forms take it as it is.
 */

export interface ShearCentre {
  /** Shear centre less centroid along x, m. */
  x0: number;
  /** Shear centre less centroid along y, m. */
  y0: number;
}

export interface Warping extends ShearCentre {
  /** Warping constant, m⁶. */
  Cw: number;
}

type Flanged = { b: number; d: number; tf: number; tw: number; r: number };

/** Σ b t³/3 over two whole flanges and the web between them. */
export const flangedPlainJ = ({ b, d, tf, tw }: Flanged) => (2 * b * tf ** 3 + (d - 2 * tf) * tw ** 3) / 3;

/** An I section's J with El Darwish & Johnston's fillet and flange-tip corrections (the plain sum without a root radius). */
export function iTorsionConstant(dims: Flanged): number {
  const { tf, tw, r } = dims;
  const plain = flangedPlainJ(dims);
  if (r <= 0) return plain;
  const alpha1 = -0.042 + (0.2204 * tw) / tf + (0.1355 * r) / tf - (0.0865 * r * tw) / tf ** 2 - (0.0725 * tw ** 2) / tf ** 2;
  const D1 = ((tf + r) ** 2 + tw * (r + tw / 4)) / (2 * r + tf);
  const corrected = plain + 2 * alpha1 * D1 ** 4 - 0.42 * tf ** 4;
  // The fit was made for rolled proportions; outside them it may fall below zero, and the plain sum stands.
  return corrected > 0 ? corrected : plain;
}

/** A channel's J with El Darwish & Johnston's fillet and flange-tip corrections (rules 2). */
export function channelTorsionConstant(dims: Flanged): number {
  const { tf, tw, r } = dims;
  const plain = flangedPlainJ(dims);
  if (r <= 0) return plain;
  const alpha3 = -0.0908 + (0.2621 * tw) / tf + (0.1231 * r) / tf - (0.0752 * tw * r) / tf ** 2 - (0.0945 * tw ** 2) / tf ** 2;
  const D3 = 2 * (3 * r + tw + tf - Math.sqrt(2 * (2 * r + tw) * (2 * r + tf)));
  const corrected = plain + 2 * alpha3 * D3 ** 4 - 0.42 * tf ** 4;
  return corrected > 0 ? corrected : plain;
}

/** An angle's J: the plain sum (b + d − t)t³/3 without a root radius, else with the fillet and end terms (rules 2). */
export function angleTorsionConstant({ b, d, t, r }: { b: number; d: number; t: number; r: number }): number {
  const plain = ((b + d - t) * t ** 3) / 3;
  if (r <= 0) return plain;
  const alpha4 = 0.0768 + (0.0479 * r) / t;
  const D4 = 2 * (3 * r + 2 * t - Math.SQRT2 * (2 * r + t));
  const corrected = plain + alpha4 * D4 ** 4 - 0.315 * t ** 4;
  return corrected > 0 ? corrected : plain;
}

/** A doubly symmetric I section: Cw = Iy h0²/4, h0 = d − tf. */
export function iWarping(Iy: number, d: number, tf: number): Warping {
  return { x0: 0, y0: 0, Cw: (Iy * (d - tf) ** 2) / 4 };
}

/** A channel's shear centre (e0 from the web's mid-line, away from the flanges) and Cw; xc is the centroid from the back of the web. */
export function channelWarping({ b, d, tf, tw }: Flanged, xc: number): Warping & { e0: number } {
  const bm = b - tw / 2;
  const hm = d - tf;
  const e0 = (3 * bm * bm * tf) / (6 * bm * tf + hm * tw);
  const Cw = ((tf * bm ** 3 * hm ** 2) / 12) * ((3 * bm * tf + 2 * hm * tw) / (6 * bm * tf + hm * tw));
  // The shear centre sits at x = tw/2 − e0 from the back of the web (x grows towards the flange tips).
  return { e0, x0: tw / 2 - e0 - xc, y0: 0, Cw };
}

/** An angle's shear centre where the legs' mid-lines meet; Cw = 0. xc, yc the centroid from the heel. */
export function angleWarping(t: number, xc: number, yc: number): Warping {
  return { x0: t / 2 - xc, y0: t / 2 - yc, Cw: 0 };
}

/** Shear centre at the centroid and Cw taken as 0: hollow sections, solid rectangles and circles. */
export const CENTRED: Warping = { x0: 0, y0: 0, Cw: 0 };
