/**
 * A firm's section catalogue, read from the CSV file it maintains: the columns are mapped on import (which
 * holds the designation, the shape, each dimension and each listed property), each mapped column states its
 * unit, and every row is built again from its dimensions by the section builder; a listed property that
 * differs from the builder's by more than the tolerance (1 %) is listed, so a lead sees it before publishing.
 *
 * Expect some listed J to differ where a table's convention is not the builder's (sections.ts says which it
 * uses): rolled channels and angles are often tabulated with fillet corrections that the builder's rules 1 do
 * not make. Rows are built by the newest rules unless the options name others, and their entries say so.
 *
 * Nothing here reads files or writes anything: text and mapping in, a typed result out. A result with any
 * problem must import nothing (`ok` is false); its rows and differences are still given for the preview.
 */
import { math, TRADE_UNITS, unitNamesIn } from "@/lib/standards/units";
import { parseCsv } from "./csv";
import { buildSection, LATEST_SECTION_RULES, type Section, type SectionRules } from "./sections";
import { DIMENSION_LABELS, SECTION_SHAPES, SHAPE_NAMES, type DimensionKey, type SectionShape } from "./section-schema";

/** Every property a catalogue may list, with the SI unit it is compared in ("" for ratios). */
export const LISTED_PROPERTY_UNITS = {
  A: "m^2",
  Ix: "m^4",
  Iy: "m^4",
  Sx: "m^3",
  Sy: "m^3",
  Zx: "m^3",
  Zy: "m^3",
  rx: "m",
  ry: "m",
  J: "m^4",
  xc: "m",
  yc: "m",
  xp: "m",
  Ixy: "m^4",
  Iu: "m^4",
  Iv: "m^4",
  alpha: "rad",
  Su: "m^3",
  Sv: "m^3",
  ru: "m",
  rv: "m",
  b_2tf: "",
  b_tf: "",
  h_tw: "",
  b_t: "",
  h_t: "",
  d_t: "",
  c_tf: "",
  bd_2t: "",
  D_t: "",
  e0: "m",
  x0: "m",
  y0: "m",
  Cw: "m^6",
} as const;
export type ListedProperty = keyof typeof LISTED_PROPERTY_UNITS;

/** Properties that may be zero or negative (a product of inertia, an angle, the shear centre's offsets, a Cw taken as 0); every other must be positive. */
const SIGNED: ReadonlySet<ListedProperty> = new Set(["Ixy", "alpha", "x0", "y0", "Cw"]);

export interface ColumnSpec {
  /** The column's header, as the file spells it (compared without surrounding spaces; case counts). */
  column: string;
  /** The unit of its values: "mm", "cm", "in", "mm^2", "mm²", "cm4", "in⁴", "deg"…; "" for a ratio. */
  unit: string;
}

export interface CatalogueMapping {
  designation: string;
  /** A column holding each row's shape (the builder's names, or the file's own through `names`), or one shape for every row. */
  shape: { column: string; names?: Record<string, SectionShape> } | { all: SectionShape };
  dimensions: Partial<Record<DimensionKey, ColumnSpec>>;
  properties: Partial<Record<ListedProperty, ColumnSpec>>;
}

export interface CatalogueOptions {
  /** Largest relative difference accepted without listing it; 0.01 unless given. */
  tolerance?: number;
  /** Most section rows a file may hold; 5000 unless given. */
  maxRows?: number;
  /** Longest text accepted, in characters; 2 000 000 unless given. */
  maxLength?: number;
  /** The section builder's rules the rows are built by; the newest unless given. */
  rules?: SectionRules;
}

export interface CatalogueRow {
  /** The line of the file the row starts on (the header is line 1). */
  row: number;
  designation: string;
  section: Section;
  /** The properties the file lists for the row, in SI units, in the order of LISTED_PROPERTY_UNITS. */
  listed: Partial<Record<ListedProperty, number>>;
}

export interface CatalogueDifference {
  row: number;
  designation: string;
  property: ListedProperty;
  listed: number;
  computed: number;
  /** (listed − computed) / |computed|. */
  relativeDifference: number;
}

export interface CatalogueProblem {
  /** The line of the file, or null for a problem of the mapping as a whole. */
  row: number | null;
  /** The column's header as the mapping names it, or null. */
  column: string | null;
  message: string;
}

export interface CatalogueImport {
  ok: boolean;
  rows: CatalogueRow[];
  differences: CatalogueDifference[];
  problems: CatalogueProblem[];
}

const KIND_OF: Record<string, string> = {
  m: "length",
  "m^2": "area (length²)",
  "m^3": "section modulus (length³)",
  "m^4": "second moment of area (length⁴)",
  "m^6": "warping constant (length⁶)",
};

const SUPERSCRIPTS: Record<string, string> = { "²": "^2", "³": "^3", "⁴": "^4", "⁶": "^6" };

const unknownUnit = (unit: string) => `"${unit}" is not a unit this catalogue reads (write mm, cm, in, mm^2, cm4, in⁴…).`;

/**
 * A value times its unit's factor. A factor of 1/n for a whole n (mm, cm², cm⁴…) divides by n instead, so
 * 160 mm becomes 160/1000 m, the double nearest 0.16, as a builder given 0.16 would have it.
 */
export function convertToSI(value: number, factor: number): number {
  const n = Math.round(1 / factor);
  return n > 1 && Math.abs(1 / factor - n) <= 1e-9 * n ? value / n : value * factor;
}

/** The factor from a stated unit to the SI unit, or a sentence saying why the unit cannot be used. */
export function unitFactor(unit: string, si: string): { ok: true; factor: number } | { ok: false; message: string } {
  const text = unit
    .trim()
    .replace(/[²³⁴⁶]/g, (c) => SUPERSCRIPTS[c])
    .replace(/^([a-zA-Z]+)([2346])$/, "$1^$2");
  if (si === "" || si === "rad") {
    if (si === "" && (text === "" || text === "-")) return { ok: true, factor: 1 };
    if (si === "rad" && (text === "rad" || text === "deg")) return { ok: true, factor: text === "deg" ? Math.PI / 180 : 1 };
    return { ok: false, message: si === "" ? `a ratio has no unit: leave it empty or write "-".` : `write "deg" or "rad".` };
  }
  try {
    const u = math.unit(`1 ${text}`);
    if (!unitNamesIn(u).every((name) => TRADE_UNITS.has(name))) return { ok: false, message: unknownUnit(unit) };
    if (!u.equalBase(math.unit(si))) return { ok: false, message: `"${unit}" is not a unit of ${KIND_OF[si] ?? si}.` };
    const factor = u.toNumber(si) as number;
    return Number.isFinite(factor) && factor > 0
      ? { ok: true, factor }
      : { ok: false, message: `"${unit}" cannot be converted.` };
  } catch {
    return { ok: false, message: unknownUnit(unit) };
  }
}

const NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/** A cell as a number: plain decimal notation only ("1,234" could be a thousand or a decimal comma). */
function readNumber(cell: string): number | null {
  const text = cell.trim();
  if (!NUMBER.test(text)) return null;
  const value = Number(text);
  return Number.isFinite(value) ? value : null;
}

/** Dimensions a row may leave empty: radii (a sharp corner) and the flanges' taper (parallel flanges). */
const OPTIONAL_DIMENSIONS: ReadonlySet<string> = new Set(["r", "ro", "r2", "taper"]);

export function importCatalogue(text: string, mapping: CatalogueMapping, options: CatalogueOptions = {}): CatalogueImport {
  const tolerance = options.tolerance ?? 0.01;
  const maxRows = options.maxRows ?? 5000;
  const maxLength = options.maxLength ?? 2_000_000;
  const problems: CatalogueProblem[] = [];
  const rows: CatalogueRow[] = [];
  const differences: CatalogueDifference[] = [];
  const done = () => ({ ok: problems.length === 0, rows, differences, problems });
  const refuse = (row: number | null, column: string | null, message: string) => problems.push({ row, column, message });

  if (text.length > maxLength) {
    refuse(
      null,
      null,
      `The file is ${text.length} characters long; a catalogue may have at most ${maxLength}. Split it, or remove what it need not hold.`,
    );
    return done();
  }
  const csv = parseCsv(text);
  if (!csv.ok) {
    refuse(csv.line, null, csv.message);
    return done();
  }
  const [header, ...records] = csv.records;
  if (!header) {
    refuse(null, null, "The file is empty: it needs a header line and a line per section.");
    return done();
  }
  if (records.length > maxRows) {
    refuse(
      null,
      null,
      `The file holds ${records.length} sections; a catalogue may hold at most ${maxRows}. Split it into several catalogues.`,
    );
    return done();
  }

  // Columns: where each mapped one is in the header, and the factor of its unit.
  // Headers match exactly (without surrounding spaces): "d" (depth) and "D" (diameter) are different columns.
  const seen = new Map<string, number>();
  header.fields.forEach((field, i) => {
    const name = field.trim();
    if (name !== "" && seen.has(name)) refuse(header.line, name, `The header names the column "${name}" twice.`);
    seen.set(name, i);
  });
  const columnOf = (column: string, what: string): number | null => {
    const index = seen.get(column.trim());
    if (index === undefined) {
      refuse(header.line, column, `The column "${column}" (mapped to ${what}) is not in the file's header.`);
      return null;
    }
    return index;
  };
  const designationAt = columnOf(mapping.designation, "the designation");
  const shapeAt = "column" in mapping.shape ? columnOf(mapping.shape.column, "the shape") : null;
  type Mapped = { key: string; spec: ColumnSpec; index: number; factor: number };
  const mapColumns = (specs: Partial<Record<string, ColumnSpec>>, si: (key: string) => string, what: (key: string) => string) => {
    const out: Mapped[] = [];
    for (const [key, spec] of Object.entries(specs)) {
      if (!spec) continue;
      const index = columnOf(spec.column, what(key));
      const unit = unitFactor(spec.unit, si(key));
      if (!unit.ok) refuse(header.line, spec.column, `The unit of the column "${spec.column}": ${unit.message}`);
      if (index !== null && unit.ok) out.push({ key, spec, index, factor: unit.factor });
    }
    return out;
  };
  const dimensions = mapColumns(
    mapping.dimensions,
    // A taper is a slope, a ratio (its column's unit ""); every other dimension a length.
    (key) => (key === "taper" ? "" : "m"),
    (key) => `the dimension ${key}`,
  );
  const properties = mapColumns(
    mapping.properties,
    (key) => LISTED_PROPERTY_UNITS[key as ListedProperty],
    (key) => `the property ${key}`,
  );
  if (problems.length > 0) return done();

  const firstRowOf = new Map<string, { line: number; text: string }>();
  for (const record of records) {
    const { line, fields } = record;
    const before = problems.length;
    if (fields.length !== header.fields.length) {
      refuse(line, null, `Row ${line} has ${fields.length} fields; the header has ${header.fields.length}.`);
      continue;
    }
    // Designations are compared without case and with runs of spaces as one: a picker would show
    // "GI 300x150x10" and "gi  300x150x10" as the same section.
    const designation = fields[designationAt!].trim();
    const same = designation.toLowerCase().replace(/\s+/g, " ");
    const first = firstRowOf.get(same);
    if (designation === "") refuse(line, mapping.designation, `Row ${line} has no designation.`);
    else if (first !== undefined) {
      refuse(
        line,
        mapping.designation,
        `Row ${line} repeats the designation "${designation}" of row ${first.line} ("${first.text}").`,
      );
    } else firstRowOf.set(same, { line, text: designation });

    const shape = shapeOf(mapping, shapeAt === null ? "" : fields[shapeAt]);
    if (shape === null) {
      const column = (mapping.shape as { column: string }).column;
      refuse(
        line,
        column,
        `Row ${line}: the shape "${fields[shapeAt!].trim()}" is not one the builder knows (${SECTION_SHAPES.join(", ")}).`,
      );
      continue;
    }

    // Dimensions the shape needs, in metres.
    const labels: Record<string, string> = DIMENSION_LABELS[shape];
    const input: Record<string, unknown> = { shape };
    for (const key of Object.keys(labels)) {
      const mapped = dimensions.find((d) => d.key === key);
      if (!mapped) {
        if (!OPTIONAL_DIMENSIONS.has(key))
          refuse(
            line,
            null,
            `Row ${line}: the mapping names no column for the ${labels[key]}, which ${SHAPE_NAMES[shape]} needs.`,
          );
        continue;
      }
      const cell = fields[mapped.index].trim();
      if (cell === "" && OPTIONAL_DIMENSIONS.has(key)) continue; // no radius: a sharp corner; no taper: parallel flanges
      const value = readNumber(cell);
      if (value === null) refuse(line, mapped.spec.column, `Row ${line}: the ${labels[key]} "${cell}" is not a number.`);
      else if (value < 0 && OPTIONAL_DIMENSIONS.has(key)) {
        refuse(
          line,
          mapped.spec.column,
          `Row ${line}: the ${labels[key]} is ${cell} ${mapped.spec.unit}; it must not be negative.`,
        );
      } else if (value <= 0 && !OPTIONAL_DIMENSIONS.has(key)) {
        refuse(
          line,
          mapped.spec.column,
          `Row ${line}: the ${labels[key]} is ${cell} ${mapped.spec.unit}; it must be greater than zero.`,
        );
      } else input[key] = convertToSI(value, mapped.factor);
    }

    // Listed properties, in SI.
    const listed: Partial<Record<ListedProperty, number>> = {};
    for (const p of properties) {
      const cell = fields[p.index].trim();
      if (cell === "") continue; // not listed for this row
      const key = p.key as ListedProperty;
      const value = readNumber(cell);
      if (value === null) refuse(line, p.spec.column, `Row ${line}: ${key} "${cell}" is not a number.`);
      else if (value <= 0 && !SIGNED.has(key))
        refuse(line, p.spec.column, `Row ${line}: ${key} is ${cell} ${p.spec.unit}; it must be greater than zero.`);
      else listed[key] = convertToSI(value, p.factor);
    }
    if (problems.length > before) continue;

    const built = buildSection(input, options.rules ?? LATEST_SECTION_RULES);
    if (!built.ok) {
      for (const problem of built.problems) {
        const column = dimensions.find((d) => d.key === problem.path)?.spec.column ?? null;
        refuse(line, column, `Row ${line} (${designation}): ${problem.message}`);
      }
      continue;
    }
    const computed = built.section.properties as Partial<Record<ListedProperty, number>>;
    const ordered: Partial<Record<ListedProperty, number>> = {};
    for (const key of Object.keys(LISTED_PROPERTY_UNITS) as ListedProperty[]) {
      const value = listed[key];
      if (value === undefined) continue;
      const mine = computed[key];
      const column = mapping.properties[key]!.column;
      if (mine === undefined) {
        refuse(line, column, `Row ${line} (${designation}): ${SHAPE_NAMES[shape]} has no ${key}; leave the cell empty.`);
        continue;
      }
      ordered[key] = value;
      // A computed zero (a shear centre at the centroid, a Cw taken as 0) counts any listed non-zero value as 100 % off.
      const relativeDifference = mine === 0 ? Math.sign(value) : (value - mine) / Math.abs(mine);
      if (!(Math.abs(relativeDifference) <= tolerance)) {
        differences.push({ row: line, designation, property: key, listed: value, computed: mine, relativeDifference });
      }
    }
    rows.push({ row: line, designation, section: built.section, listed: ordered });
  }
  return done();
}

function shapeOf(mapping: CatalogueMapping, cell: string): SectionShape | null {
  if ("all" in mapping.shape) return mapping.shape.all;
  const text = cell.trim();
  const own = mapping.shape.names?.[text];
  if (own) return own;
  const lower = text.toLowerCase();
  return (SECTION_SHAPES as readonly string[]).includes(lower) ? (lower as SectionShape) : null;
}
