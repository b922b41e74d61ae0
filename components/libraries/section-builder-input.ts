// The section builder's fields read as the builder's input: text typed in millimetres (a flange's taper in per
// cent), per shape, into metres (a ratio) for buildSection, with a sentence for a field whose text is not a number
// (so none reaches it as NaN).
import { buildSection, type BuildSectionResult, type SectionShape } from "@/lib/libraries";
import { allDimensionKeys, dimensionLabel, SLOPE_DIMENSIONS } from "./format";

/** What the fields hold: text as typed, in mm, per shape (so switching shape and back keeps what was typed). */
export type Typed = Record<SectionShape, Record<string, string>>;

/** Starting values, in mm, for a shape not yet typed: a plausible section of each shape. */
export const STARTING: Typed = {
  i: { b: "150", d: "300", tf: "10.5", tw: "7", r: "14" },
  channel: { b: "75", d: "150", tf: "10", tw: "6", r: "10" },
  "rectangular-hollow": { b: "100", d: "150", t: "6", ro: "12" },
  "circular-hollow": { D: "168", t: "6" },
  rectangle: { b: "100", d: "200" },
  circle: { D: "50" },
  angle: { b: "100", d: "100", t: "10", r: "12", r2: "6" },
};

export const OPTIONAL = new Set(["r", "ro", "r2", "taper"]);
const DECIMAL = /^[+-]?(\d+(\.\d*)?|\.\d+)$/;

/** The builder's input in metres, and the fields whose text is not a number. */
function readTyped(shape: SectionShape, typed: Record<string, string>) {
  const input: Record<string, unknown> = { shape };
  const unreadable: Record<string, string> = {};
  for (const key of allDimensionKeys(shape)) {
    const text = (typed[key] ?? "").trim();
    if (text === "" && OPTIONAL.has(key)) continue; // a sharp corner, or parallel flanges
    if (text === "") {
      input[key] = undefined;
      continue;
    }
    const { name } = dimensionLabel(shape, key);
    if (SLOPE_DIMENSIONS.has(key)) {
      if (!DECIMAL.test(text)) unreadable[key] = `Type the ${name} as a percentage, e.g. 14 (or 16.67 for 1:6).`;
      else if (Number(text) > 50) unreadable[key] = `The ${name} is ${text} %; no rolled flange slopes more than 50 %.`;
      else input[key] = Number(text) / 100;
    } else if (!DECIMAL.test(text)) unreadable[key] = `Type the ${name} as a number of millimetres, e.g. 10.5.`;
    // buildSection's own sentence for this one speaks of metres; the field is in millimetres.
    else if (Number(text) > 10_000) unreadable[key] = `The ${name} is ${text} mm; no section is larger than 10 000 mm.`;
    else input[key] = Number(text) / 1000;
  }
  return { input, unreadable };
}

export function build(
  shape: SectionShape,
  typed: Record<string, string>,
): { result: BuildSectionResult; unreadable: Record<string, string> } {
  const { input, unreadable } = readTyped(shape, typed);
  if (Object.keys(unreadable).length > 0) return { result: { ok: false, problems: [] }, unreadable };
  return { result: buildSection(input), unreadable };
}
