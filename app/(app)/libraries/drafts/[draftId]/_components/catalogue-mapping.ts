// The catalogue import's column mapping as the form holds it: one choice per column of the file (what it
// holds, and the unit its values are in), guessed from the header where a column is named as the library
// names the value ("Designation", "tf", "Ix"), turned into importCatalogue's mapping.
import {
  DIMENSION_LABELS,
  LISTED_PROPERTY_UNITS,
  SECTION_SHAPES,
  type CatalogueMapping,
  type ListedProperty,
  type SectionShape,
} from "@/lib/libraries";

/** What a column holds: nothing imported, the designation, the shape, a dimension or a listed property. */
export type ColumnRole = "" | "designation" | "shape" | `dimension:${string}` | `property:${string}`;
export type ColumnChoice = { column: string; role: ColumnRole; unit: string };

export const DIMENSION_KEYS: string[] = [...new Set(SECTION_SHAPES.flatMap((shape) => Object.keys(DIMENSION_LABELS[shape])))];
export const PROPERTY_KEYS = Object.keys(LISTED_PROPERTY_UNITS) as ListedProperty[];

/** A unit to start from for a value kept in `si`: millimetres and their powers, degrees, none for a ratio. */
const STARTING_UNIT: Record<string, string> = { m: "mm", "m^2": "mm²", "m^3": "mm³", "m^4": "mm⁴", rad: "deg", "": "" };

export function startingUnit(role: ColumnRole): string {
  // A taper is a slope (a ratio); every other dimension a length.
  if (role.startsWith("dimension:")) return role === "dimension:taper" ? "" : "mm";
  if (role.startsWith("property:")) return STARTING_UNIT[LISTED_PROPERTY_UNITS[role.slice(9) as ListedProperty]] ?? "";
  return "";
}

/** The role a header suggests, matched as the library spells its names (case counts: d is not D). */
function guessRole(header: string): ColumnRole {
  const name = header.trim();
  if (/^(designation|name|section)$/i.test(name)) return "designation";
  if (/^(shape|type)$/i.test(name)) return "shape";
  if (DIMENSION_KEYS.includes(name)) return `dimension:${name}`;
  if ((PROPERTY_KEYS as string[]).includes(name)) return `property:${name}`;
  return "";
}

/** A choice per header column, each role given once at most (the first column that suggests it). */
export function guessChoices(headers: string[]): ColumnChoice[] {
  const taken = new Set<ColumnRole>();
  return headers.map((column) => {
    const guessed = guessRole(column);
    const role = guessed !== "" && !taken.has(guessed) ? guessed : "";
    taken.add(role);
    return { column: column.trim(), role, unit: startingUnit(role) };
  });
}

/** The mapping importCatalogue takes, or a sentence saying what the choices still lack. */
export function mappingOf(
  choices: ColumnChoice[],
  everyRow: SectionShape,
): { ok: true; mapping: CatalogueMapping } | { ok: false; message: string } {
  const designation = choices.find((choice) => choice.role === "designation");
  if (!designation) return { ok: false, message: "Choose the column that holds each section's designation." };
  const shape = choices.find((choice) => choice.role === "shape");
  const twice = choices.find((choice, i) => choice.role !== "" && choices.findIndex((c) => c.role === choice.role) !== i);
  if (twice) return { ok: false, message: `Two columns are mapped to the same value (“${twice.column}”); map each value once.` };
  const pick = (prefix: string) =>
    Object.fromEntries(
      choices
        .filter((choice) => choice.role.startsWith(prefix))
        .map((choice) => [choice.role.slice(prefix.length), { column: choice.column, unit: choice.unit }]),
    );
  return {
    ok: true,
    mapping: {
      designation: designation.column,
      shape: shape ? { column: shape.column } : { all: everyRow },
      dimensions: pick("dimension:"),
      properties: pick("property:"),
    },
  };
}
