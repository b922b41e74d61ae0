/**
 * The demo's section catalogue: invented designations with plausible dimensions, every property computed
 * by the section builder — no manufacturer's table is copied. The names are ours: G + a letter for the
 * shape (I, C channel, R rectangular hollow, T circular tube, L angle), then the main dimensions in mm.
 */
import { importCatalogue, type CatalogueMapping } from "./catalogue";
import { catalogueSectionEntries } from "./document";
import { buildSectionOrThrow, type Section } from "./sections";
import type { SectionInput } from "./section-schema";

/** Dimensions in millimetres, as the catalogue's readers think of them. */
type Millimetres<T> = { [K in keyof T]: K extends "shape" ? T[K] : number };
type DemoEntry = { designation: string; mm: Millimetres<SectionInput> };

const I = (d: number, b: number, tw: number, tf: number, r: number): DemoEntry => ({
  designation: `GI ${d}x${b}x${tf}`,
  mm: { shape: "i", b, d, tf, tw, r },
});

export const DEMO_SECTIONS: readonly DemoEntry[] = [
  I(160, 90, 5, 7.5, 8),
  I(200, 100, 5.5, 8, 10),
  I(250, 125, 6, 9, 12),
  I(300, 150, 7, 10.5, 14),
  I(350, 170, 7.5, 12, 16),
  I(400, 180, 8.5, 13.5, 18),
  I(450, 190, 9.5, 14.5, 20),
  I(500, 200, 10, 16, 20),
  I(600, 220, 12, 19, 22),
  I(200, 200, 9, 14, 16),
  I(250, 250, 10, 16, 20),
  I(300, 300, 11, 18, 24),
  { designation: "GC 150x75x10", mm: { shape: "channel", b: 75, d: 150, tf: 10, tw: 6, r: 10 } },
  { designation: "GC 200x80x11", mm: { shape: "channel", b: 80, d: 200, tf: 11, tw: 7, r: 12 } },
  { designation: "GC 250x90x13", mm: { shape: "channel", b: 90, d: 250, tf: 13, tw: 8, r: 14 } },
  { designation: "GC 300x100x15", mm: { shape: "channel", b: 100, d: 300, tf: 15, tw: 9, r: 15 } },
  { designation: "GR 100x100x5", mm: { shape: "rectangular-hollow", b: 100, d: 100, t: 5, ro: 10 } },
  { designation: "GR 150x100x6", mm: { shape: "rectangular-hollow", b: 100, d: 150, t: 6, ro: 12 } },
  { designation: "GR 200x200x8", mm: { shape: "rectangular-hollow", b: 200, d: 200, t: 8, ro: 20 } },
  { designation: "GR 250x150x10", mm: { shape: "rectangular-hollow", b: 150, d: 250, t: 10, ro: 25 } },
  { designation: "GT 114x5", mm: { shape: "circular-hollow", D: 114, t: 5 } },
  { designation: "GT 168x6", mm: { shape: "circular-hollow", D: 168, t: 6 } },
  { designation: "GT 273x8", mm: { shape: "circular-hollow", D: 273, t: 8 } },
  { designation: "GL 60x60x6", mm: { shape: "angle", b: 60, d: 60, t: 6, r: 8, r2: 4 } },
  { designation: "GL 100x100x10", mm: { shape: "angle", b: 100, d: 100, t: 10, r: 12, r2: 6 } },
  { designation: "GL 100x75x8", mm: { shape: "angle", b: 75, d: 100, t: 8, r: 10, r2: 5 } },
  { designation: "GL 150x90x10", mm: { shape: "angle", b: 90, d: 150, t: 10, r: 12, r2: 6 } },
];

function inMetres(entry: DemoEntry): SectionInput {
  const out: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(entry.mm)) out[key] = key === "shape" ? value : (value as number) / 1000;
  return out as SectionInput;
}

/**
 * The rules the demo catalogue is built by: 1, the rules it was first published with. Its CSV's values and the
 * seeded entries' hashes (which runs record) stay as they were; a firm's own catalogue takes the newest.
 */
const DEMO_RULES = 1;

/** Every demo section with the builder's properties. */
export function buildDemoCatalogue(): { designation: string; section: Section }[] {
  return DEMO_SECTIONS.map((entry) => ({
    designation: entry.designation,
    section: buildSectionOrThrow(inMetres(entry), DEMO_RULES),
  }));
}

/** The name the demo catalogue's rows cite as their file. */
export const DEMO_CATALOGUE_FILE = "demo-catalogue.csv";

/** The demo catalogue as the document a lead would submit: one entry per CSV row, its listed values kept. */
export function demoSectionsDocument(): unknown {
  const imported = importCatalogue(renderDemoCatalogueCsv(), DEMO_CATALOGUE_MAPPING, { rules: DEMO_RULES });
  if (!imported.ok) throw new Error(`the demo catalogue does not import: ${imported.problems.map((p) => p.message).join("; ")}`);
  return {
    kind: "sections",
    title: "Firm sections",
    description: "The firm's section catalogue (invented demo designations), imported from its CSV table.",
    entries: catalogueSectionEntries(imported.rows, DEMO_CATALOGUE_FILE),
  };
}

/** How the demo's CSV is laid out: dimensions in mm, properties in the units tables print them in. */
export const DEMO_CATALOGUE_MAPPING: CatalogueMapping = {
  designation: "Designation",
  shape: { column: "Shape" },
  dimensions: {
    b: { column: "b", unit: "mm" },
    d: { column: "d", unit: "mm" },
    D: { column: "D", unit: "mm" },
    tf: { column: "tf", unit: "mm" },
    tw: { column: "tw", unit: "mm" },
    t: { column: "t", unit: "mm" },
    r: { column: "r", unit: "mm" },
    ro: { column: "ro", unit: "mm" },
    r2: { column: "r2", unit: "mm" },
  },
  properties: {
    A: { column: "A", unit: "cm²" },
    Ix: { column: "Ix", unit: "cm⁴" },
    Iy: { column: "Iy", unit: "cm⁴" },
    Sx: { column: "Sx", unit: "cm³" },
    Sy: { column: "Sy", unit: "cm³" },
    Zx: { column: "Zx", unit: "cm³" },
    Zy: { column: "Zy", unit: "cm³" },
    J: { column: "J", unit: "cm⁴" },
  },
};

const COLUMNS = [
  "Designation",
  "Shape",
  "b",
  "d",
  "D",
  "tf",
  "tw",
  "t",
  "r",
  "ro",
  "r2",
  "A",
  "Ix",
  "Iy",
  "Sx",
  "Sy",
  "Zx",
  "Zy",
  "J",
] as const;
const CM: Record<string, number> = { A: 1e4, Ix: 1e8, Iy: 1e8, J: 1e8, Sx: 1e6, Sy: 1e6, Zx: 1e6, Zy: 1e6 };

/** The demo catalogue as the CSV a firm would keep, properties rounded to four significant figures. */
export function renderDemoCatalogueCsv(): string {
  const built = buildDemoCatalogue();
  const lines = [COLUMNS.join(",")];
  DEMO_SECTIONS.forEach((entry, i) => {
    const dims = entry.mm as Record<string, unknown>;
    const props = built[i].section.properties as unknown as Record<string, number>;
    const cell = (column: (typeof COLUMNS)[number]): string => {
      if (column === "Designation") return entry.designation;
      if (column === "Shape") return entry.mm.shape;
      if (column in CM) return String(Number((props[column] * CM[column]).toPrecision(4)));
      return typeof dims[column] === "number" ? String(dims[column]) : "";
    };
    lines.push(COLUMNS.map(cell).join(","));
  });
  return lines.join("\r\n") + "\r\n";
}
