// How the section library's screens show numbers: SI values from lib/libraries turned into the units
// engineers read on a section table (mm, mm², 10⁶ mm⁴, 10³ mm³, 10⁹ mm⁶, degrees), to four significant figures.
// Every formatter returns "—" for a value that is not a finite number, so no screen ever shows "NaN".
import { DIMENSION_LABELS, type ListedProperty, type Section, type SectionEntry, type SectionShape } from "@/lib/libraries";

export interface PropertyDisplay {
  /** As printed: "Ix", "b/2tf". */
  symbol: string;
  name: string;
  /** The display unit ("" for a ratio). */
  unit: string;
  /** Display value = SI value × scale. */
  scale: number;
}

const area = { unit: "mm²", scale: 1e6 };
const inertia = { unit: "10⁶ mm⁴", scale: 1e6 };
const modulus = { unit: "10³ mm³", scale: 1e6 };
const length = { unit: "mm", scale: 1e3 };
const ratio = { unit: "", scale: 1 };
// 1 m⁶ = 10¹⁸ mm⁶ = 10⁹ × (10⁹ mm⁶).
const warping = { unit: "10⁹ mm⁶", scale: 1e9 };

const PROPERTIES: Record<ListedProperty, PropertyDisplay> = {
  A: { symbol: "A", name: "area", ...area },
  Ix: { symbol: "Ix", name: "second moment of area about x", ...inertia },
  Iy: { symbol: "Iy", name: "second moment of area about y", ...inertia },
  Sx: { symbol: "Sx", name: "elastic modulus about x", ...modulus },
  Sy: { symbol: "Sy", name: "elastic modulus about y", ...modulus },
  Zx: { symbol: "Zx", name: "plastic modulus about x", ...modulus },
  Zy: { symbol: "Zy", name: "plastic modulus about y", ...modulus },
  rx: { symbol: "rx", name: "radius of gyration about x", ...length },
  ry: { symbol: "ry", name: "radius of gyration about y", ...length },
  J: { symbol: "J", name: "torsion constant", ...inertia },
  xc: { symbol: "xc", name: "centroid from the back of the web", ...length },
  yc: { symbol: "yc", name: "centroid from the heel, along leg d", ...length },
  xp: { symbol: "xp", name: "plastic neutral axis (y) from the back of the web", ...length },
  Ixy: { symbol: "Ixy", name: "product of inertia", ...inertia },
  Iu: { symbol: "Iu", name: "second moment of area about u (major principal)", ...inertia },
  Iv: { symbol: "Iv", name: "second moment of area about v (minor principal)", ...inertia },
  alpha: { symbol: "α", name: "angle from x to u, anticlockwise", unit: "°", scale: 180 / Math.PI },
  Su: { symbol: "Su", name: "elastic modulus about u", ...modulus },
  Sv: { symbol: "Sv", name: "elastic modulus about v", ...modulus },
  ru: { symbol: "ru", name: "radius of gyration about u", ...length },
  rv: { symbol: "rv", name: "radius of gyration about v", ...length },
  b_2tf: { symbol: "b/2tf", name: "flange width to thickness", ...ratio },
  b_tf: { symbol: "b/tf", name: "flange width to thickness", ...ratio },
  h_tw: { symbol: "h/tw", name: "web depth clear of the fillets to thickness", ...ratio },
  c_tf: { symbol: "c/tf", name: "flange outstand clear of the fillet to thickness", ...ratio },
  b_t: { symbol: "b/t", name: "width to thickness", ...ratio },
  h_t: { symbol: "h/t", name: "depth to thickness", ...ratio },
  d_t: { symbol: "d/t", name: "leg d to thickness", ...ratio },
  bd_2t: { symbol: "(b + d)/2t", name: "mean leg to thickness", ...ratio },
  D_t: { symbol: "D/t", name: "diameter to thickness", ...ratio },
  e0: { symbol: "e0", name: "shear centre from the web's mid-line, away from the flanges", ...length },
  x0: { symbol: "x0", name: "shear centre from the centroid, along x", ...length },
  y0: { symbol: "y0", name: "shear centre from the centroid, along y", ...length },
  Cw: { symbol: "Cw", name: "warping constant", ...warping },
};

/** Where a shape gives a property another meaning than the table above. */
const BY_SHAPE: Partial<Record<SectionShape, Partial<Record<ListedProperty, Partial<PropertyDisplay>>>>> = {
  angle: {
    xc: { name: "centroid from the heel, along leg b" },
    Zx: { name: "plastic modulus about x (geometric)" },
    Zy: { name: "plastic modulus about y (geometric)" },
  },
  "rectangular-hollow": {
    b_t: { name: "flat width to thickness" },
    h_t: { name: "flat depth to thickness" },
  },
};

export function propertyDisplay(key: string, shape?: SectionShape): PropertyDisplay {
  const base = PROPERTIES[key as ListedProperty] ?? { symbol: key, name: key, ...ratio };
  return { ...base, ...(shape ? BY_SHAPE[shape]?.[key as ListedProperty] : undefined) };
}

/** Four significant figures, in plain notation from 0.001 up (12 350, not 1.235e+4); "—" when not finite. */
export function formatNumber(value: number, figures = 4): string {
  if (!Number.isFinite(value)) return "—";
  if (value === 0) return "0";
  const rounded = Number(value.toPrecision(figures));
  const magnitude = Math.floor(Math.log10(Math.abs(rounded)));
  if (magnitude >= figures - 1) return rounded.toFixed(0);
  if (magnitude >= -3) return rounded.toFixed(figures - 1 - magnitude);
  return rounded.toExponential(figures - 1).replace("e", " × 10^");
}

/** A property's SI value in its display unit, four significant figures. */
export function formatProperty(key: string, si: number, shape?: SectionShape): string {
  return formatNumber(si * propertyDisplay(key, shape).scale);
}

/** A property with its unit: "4 532 mm²" style, for sentences. */
export function formatPropertyWithUnit(key: string, si: number, shape?: SectionShape): string {
  const { unit } = propertyDisplay(key, shape);
  return unit ? `${formatProperty(key, si, shape)} ${unit}` : formatProperty(key, si, shape);
}

/** A length given in metres, in millimetres: up to six significant figures, no trailing zeros. */
export function formatMm(metres: number): string {
  return Number.isFinite(metres) ? String(Number((metres * 1000).toPrecision(6))) : "—";
}

/** A relative difference as a signed percentage: "+1.24 %". */
export function formatPercent(fraction: number): string {
  if (!Number.isFinite(fraction)) return "—";
  const text = (fraction * 100).toFixed(2);
  // A difference that rounds to nothing is shown as none, never as "−0.00 %".
  if (Number(text) === 0) return "±0.00 %";
  return `${fraction > 0 ? "+" : ""}${text.replace("-", "−")} %`;
}

/** A shape's name for a table cell or a heading ("I section"). */
export const SHAPE_TITLES: Record<SectionShape, string> = {
  i: "I section",
  channel: "Channel",
  "rectangular-hollow": "Rectangular hollow",
  "circular-hollow": "Circular hollow",
  rectangle: "Solid rectangle",
  circle: "Solid circle",
  angle: "Angle",
};

/** A dimension's symbol ("tf") and name ("flange thickness"), from DIMENSION_LABELS ("flange thickness tf"). */
export function dimensionLabel(shape: SectionShape, key: string): { symbol: string; name: string } {
  const label: string = (DIMENSION_LABELS[shape] as Record<string, string>)[key] ?? key;
  const at = label.lastIndexOf(" ");
  return { symbol: label.slice(at + 1), name: label.slice(0, at) };
}

/** Dimensions that are not lengths: the flanges' taper, a slope (a ratio, shown as a percentage). */
export const SLOPE_DIMENSIONS: ReadonlySet<string> = new Set(["taper"]);

/** The length dimensions a shape takes, in the order DIMENSION_LABELS lists them (the taper, a slope, apart). */
export function dimensionKeys(shape: SectionShape): string[] {
  return Object.keys(DIMENSION_LABELS[shape]).filter((key) => !SLOPE_DIMENSIONS.has(key));
}

/** Every dimension a shape takes, the taper too: the builder's fields. */
export function allDimensionKeys(shape: SectionShape): string[] {
  return Object.keys(DIMENSION_LABELS[shape]);
}

/** A slope (0.14) as a percentage: "14 %". */
export function formatSlope(ratio: number): string {
  return Number.isFinite(ratio) ? `${Number((ratio * 100).toPrecision(6))} %` : "—";
}

/** A section's taper, when it has one, for a sentence: ", inner flange slope 14 %"; "" for parallel flanges. */
export function taperPhrase(dimensions: Record<string, unknown>): string {
  const taper = Number(dimensions.taper ?? 0);
  return taper > 0 ? `, inner flange slope ${formatSlope(taper)}` : "";
}

/** The dimensions that name a section in a list, in mm: "d 300 · b 150 · tf 10.5 · tw 7". Radii are left out. */
export function mainDimensions(shape: SectionShape, dimensions: Record<string, unknown>): string {
  return dimensionKeys(shape)
    .filter((key) => !["r", "ro", "r2"].includes(key))
    .sort((a, b) => (a === "d" ? -1 : b === "d" ? 1 : 0))
    .map((key) => `${key} ${formatMm(Number(dimensions[key]))}`)
    .concat(Number(dimensions.taper ?? 0) > 0 ? [`taper ${formatSlope(Number(dimensions.taper))}`] : [])
    .join(" · ");
}

/** A library entry as the builder's section: its dimensions with the properties the builder computed. */
export function sectionOfEntry(entry: Pick<SectionEntry, "shape" | "dimensions" | "computed"> & { rules?: number }): Section {
  return { shape: entry.shape, rules: entry.rules ?? 1, dimensions: entry.dimensions, properties: entry.computed } as Section;
}
