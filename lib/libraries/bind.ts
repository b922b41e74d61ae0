/**
 * A library version's entries in the form a standard's evaluation takes them (lib/standards/library-inputs.ts):
 * plain SI values with their quantities, the entry's hash beside each. Sections give their properties (the
 * catalogue's where it lists them) and their dimensions; materials their E, G, density and strengths.
 */
import type { BoundEntry, LibraryEntries } from "@/lib/standards/library-inputs";
import type { Quantity } from "@/lib/standards/units";
import { LISTED_PROPERTY_UNITS, type ListedProperty } from "./catalogue";
import {
  findEntry,
  libraryEntryHash,
  normaliseKey,
  type LibraryDocument,
  type MaterialEntry,
  type SectionEntry,
} from "./document";

const QUANTITY_OF_UNIT: Record<string, Quantity | undefined> = {
  m: "length",
  "m^2": "area",
  "m^3": "section-modulus",
  "m^4": "second-moment-of-area",
  rad: "angle",
  "": "dimensionless",
};

function sectionValues(entry: SectionEntry): BoundEntry["values"] {
  const values: Record<string, { si: number; quantity: Quantity }> = {};
  for (const [name, si] of Object.entries(entry.dimensions))
    if (typeof si === "number") values[name] = { si, quantity: "length" };
  for (const [name, si] of Object.entries(entry.properties)) {
    const unit = LISTED_PROPERTY_UNITS[name as ListedProperty];
    // Cw (m⁶) has no quantity in the standards' list yet: kept in the entry and its hash, but no expression reads it.
    const quantity = unit === undefined ? undefined : QUANTITY_OF_UNIT[unit];
    if (quantity !== undefined) values[name] = { si, quantity };
  }
  return values;
}

const MATERIAL_QUANTITIES = {
  E: "stress",
  G: "stress",
  fy: "stress",
  fu: "stress",
  density: "density",
  nu: "dimensionless",
} as const;
// A further value's unit, as the library states it. 1/K (thermal expansion) has no quantity in the standards'
// list yet: such a value is kept in the library and its hash, but no expression reads it.
const QUANTITY_OF_MATERIAL_UNIT: Record<string, Quantity | undefined> = {
  Pa: "stress",
  "kg/m³": "density",
  "1": "dimensionless",
};

function materialValues(entry: MaterialEntry): BoundEntry["values"] {
  const values: Record<string, { si: number; quantity: Quantity }> = {};
  for (const [name, quantity] of Object.entries(MATERIAL_QUANTITIES)) {
    const value = entry[name as keyof typeof MATERIAL_QUANTITIES];
    if (value) values[name] = { si: value.value, quantity };
  }
  for (const [name, { value, unit }] of Object.entries(entry.values)) {
    const quantity = QUANTITY_OF_MATERIAL_UNIT[unit];
    if (quantity && !(name in values)) values[name] = { si: value, quantity };
  }
  return values;
}

/** One section or material entry, bound; null when the version has no such entry, or for a load-combination set. */
export async function bindEntry(document: LibraryDocument, key: string): Promise<BoundEntry | null> {
  if (document.kind === "combinations") return null;
  const entry = findEntry(document, key);
  if (!entry) return null;
  const hash = await libraryEntryHash(entry);
  return "shape" in entry
    ? { key: entry.key, kind: "section", type: entry.shape, hash, values: sectionValues(entry) }
    : { key: entry.key, kind: "material", type: entry.family, hash, values: materialValues(entry as MaterialEntry) };
}

/**
 * The entries of one library version an evaluation needs, keyed as the evaluation looks them up. `keys`
 * limits them to those named (a run's picks, a standard's defaults); names the version lacks are left out,
 * and the evaluation then says which input names a missing entry.
 */
export async function bindLibrary(
  document: LibraryDocument,
  version: { number: number; contentHash: string },
  keys?: readonly string[],
): Promise<LibraryEntries[string]> {
  const names = keys ?? document.entries.map((entry) => entry.key);
  const entries: Record<string, BoundEntry> = {};
  for (const name of names) {
    const bound = await bindEntry(document, name);
    if (bound) entries[normaliseKey(name)] = bound;
  }
  return { version: version.number, contentHash: version.contentHash, entries };
}
