/**
 * A library version's document: what a lead edits in a draft, what a reviewer approves and what is published,
 * hashed and never changed. Three kinds, each a list of entries that standards and runs pick by key:
 *
 *   sections      a section per designation: its shape and dimensions (metres), the properties the builder
 *                 computes from them, and — for a row of the firm's catalogue — the properties the catalogue
 *                 lists, which are the ones used where they are given (the firm's table is its authority; the
 *                 import lists where it differs from the builder by more than 1 % before anything is kept)
 *   materials     a material per name: E, G, density, strengths, each value with the standard it comes from
 *   combinations  a load-combination set per name: the load kinds it knows and its combinations, each a
 *                 factor per load kind
 *
 * Hashes (hex sha256, Web Crypto so the server, the scripts and the browser agree):
 *   content hash  sha256(JCS(document))   — the version's, as standards' content hashes are
 *   entry hash    sha256(JCS(entry))      — what a run records beside the entry it used, so a stored run never
 *                                            depends on the library changing later
 * JCS is RFC 8785 JSON canonicalisation (the `canonicalize` package): key order and spacing do not matter.
 */
import canonicalize from "canonicalize";
import { z } from "@/lib/domain/zod";
import { normaliseEntryKey } from "@/lib/standards/library-inputs";
import { LISTED_PROPERTY_UNITS, type CatalogueRow, type ListedProperty } from "./catalogue";
import { buildSection, SECTION_RULES, type Section } from "./sections";
import { SECTION_SHAPES } from "./section-schema";

export const LIBRARY_KINDS = ["sections", "materials", "combinations"] as const;
export type LibraryKind = (typeof LIBRARY_KINDS)[number];

/** A kind's name in a sentence and a heading. */
export const LIBRARY_KIND_NAMES: Record<LibraryKind, { one: string; many: string }> = {
  sections: { one: "section", many: "Sections" },
  materials: { one: "material", many: "Materials" },
  combinations: { one: "load-combination set", many: "Load-combination sets" },
};

/** Longest key (a designation, a material's or a set's name); most entries in one document. */
export const MAX_KEY_LENGTH = 80;
export const MAX_ENTRIES = 5000;

/** Keys that differ only in case or spacing name the same entry ("MF-I 310x165" and "mf-i  310X165"). */
// One rule, shared with the evaluation that looks entries up (lib/standards/library-inputs.ts).
export const normaliseKey = normaliseEntryKey;

const key = z
  .string({ error: "Give the entry a name." })
  .trim()
  .min(1, "Give the entry a name.")
  .max(MAX_KEY_LENGTH, `A name may have at most ${MAX_KEY_LENGTH} characters.`);
const finite = (what: string) =>
  z.number({ error: `The ${what} must be a finite number.` }).refine(Number.isFinite, `The ${what} must be a finite number.`);
const source = z.string().trim().min(3, "Name the standard or source this value comes from (title, edition, clause).").max(300);

// ---- sections ----------------------------------------------------------------------------------------------

const listedProperties = z
  .record(z.string(), finite("listed property"))
  .superRefine((listed, ctx) => {
    for (const name of Object.keys(listed))
      if (!(name in LISTED_PROPERTY_UNITS))
        ctx.addIssue({ code: "custom", path: [name], message: `“${name}” is not a section property this library keeps.` });
  })
  .transform((listed) => listed as Partial<Record<ListedProperty, number>>);

const sectionEntrySchema = z
  .object({
    key,
    /** Made in the builder, or a row of the firm's catalogue (with the row it came from). */
    origin: z.discriminatedUnion("from", [
      z.object({ from: z.literal("builder") }).strict(),
      z.object({ from: z.literal("catalogue"), file: z.string().max(200), row: z.number().int().min(2) }).strict(),
    ]),
    shape: z.enum(SECTION_SHAPES),
    /**
     * The section builder's rules the properties follow (sections.ts); left out, rules 1 — what every entry was
     * built by before the rules were numbered, so such an entry keeps its properties and its hash.
     */
    rules: z
      .number()
      .refine(
        (n) => (SECTION_RULES as readonly number[]).includes(n),
        `The section builder's rules are ${SECTION_RULES.join(" or ")}.`,
      )
      .optional(),
    /** Metres, as the builder takes them. */
    dimensions: z.record(z.string(), finite("dimension")),
    /** What the catalogue lists for the row, in SI units; empty for a section made in the builder. */
    listed: listedProperties.default({}),
    note: z.string().max(500).optional(),
  })
  .strict();
export type SectionEntryInput = z.input<typeof sectionEntrySchema>;

/** The rows a catalogue import built, as a document's entries: each row's dimensions and listed values, and where it came from. */
export function catalogueSectionEntries(rows: readonly CatalogueRow[], file: string): SectionEntryInput[] {
  return rows.map(({ row, designation, section, listed }) => {
    const { shape: _shape, ...dimensions } = section.dimensions as Record<string, unknown>;
    return {
      key: designation,
      origin: { from: "catalogue", file, row },
      shape: section.shape,
      // Rules 1 is what an entry without the field follows: only later rules are written.
      ...(section.rules === 1 ? {} : { rules: section.rules }),
      dimensions: dimensions as Record<string, number>,
      listed,
    };
  });
}

/** A section entry as kept: the builder's properties from its dimensions, and those a run uses. */
export type SectionEntry = Omit<z.output<typeof sectionEntrySchema>, "dimensions"> & {
  dimensions: Section["dimensions"];
  /** The builder's, from the dimensions. */
  computed: Section["properties"];
  /** The listed value where the catalogue gives one, else the builder's: what a run uses. */
  properties: Record<string, number>;
};

// ---- materials ---------------------------------------------------------------------------------------------

export const MATERIAL_FAMILIES = ["steel", "timber", "concrete", "aluminium", "masonry", "other"] as const;

/** A material's value, in SI units (Pa, kg/m³, 1/K), with where it comes from. */
const sourcedValue = (what: string) => z.object({ value: finite(what), source }).strict();
const positiveSourced = (what: string) =>
  sourcedValue(what).refine((v) => v.value > 0, { error: `The ${what} must be greater than zero.`, path: ["value"] });

/** The units a material's further values may be in: SI, so a run never converts. */
export const MATERIAL_VALUE_UNITS = ["Pa", "kg/m³", "1/K", "1"] as const;
/** A further value's symbol, written as a plain identifier: f_ck, f_m_k, E_0_05, rho_k. */
export const valueSymbol = z
  .string()
  .regex(/^[A-Za-z][A-Za-z0-9_]{0,23}$/, "A value's symbol is a short identifier: f_ck, f_m_k, E_0_05, rho_k…");

/** A further value of a material: its value in SI units, the unit, and where it comes from. */
export const furtherValueSchema = z.object({ value: finite("value"), unit: z.enum(MATERIAL_VALUE_UNITS), source }).strict();

export const materialEntrySchema = z
  .object({
    key,
    family: z.enum(MATERIAL_FAMILIES),
    /** Young's modulus, Pa: the mean value where the standard gives a mean and a fractile (timber E0,mean). */
    E: positiveSourced("Young's modulus E"),
    /** Shear modulus, Pa. */
    G: positiveSourced("shear modulus G").optional(),
    /** Poisson's ratio in the elastic range, where the standard gives one (EN 1993-1-1 3.2.6: 0.3). */
    nu: sourcedValue("Poisson's ratio ν")
      .refine((v) => v.value >= 0 && v.value < 0.5, {
        error: "Poisson's ratio ν must be at least 0 and below 0.5.",
        path: ["value"],
      })
      .optional(),
    /** Mass density, kg/m³, for self-weight (weight density is ρg, with g = 9.80665 m/s²). */
    density: positiveSourced("density").optional(),
    /** Metals: yield strength (0.2 % proof strength fo for aluminium), Pa, for the thickness range in the note. */
    fy: positiveSourced("yield strength fy").optional(),
    /** Metals: ultimate tensile strength, Pa. */
    fu: positiveSourced("ultimate strength fu").optional(),
    /** Coefficient of thermal expansion, 1/K. */
    alpha: positiveSourced("thermal expansion coefficient").optional(),
    /**
     * Further values the family's design uses, by symbol: timber's characteristic strengths and 5 % modulus
     * (EN 338: f_m_k, f_c_0_k, E_0_05, rho_k), concrete's (EN 1992-1-1: f_ck, f_cm, f_ctm). SI units.
     */
    values: z.record(valueSymbol, furtherValueSchema).default({}),
    /** What the values mean for this family and where they hold (thickness range, grade, moisture class). */
    note: z.string().max(500).optional(),
  })
  .strict()
  .refine((m) => !m.fy || !m.fu || m.fu.value >= m.fy.value, {
    error: "The ultimate strength fu is below the yield strength fy.",
    path: ["fu"],
  });
export type MaterialEntry = z.output<typeof materialEntrySchema>;

// ---- load-combination sets ---------------------------------------------------------------------------------

/** A load kind's variation in time (EN 1990 4.1.1), and what several cases of it in one model are. */
export const LOAD_ACTIONS = ["permanent", "variable", "accidental"] as const;
export const LOAD_CASE_RULES = ["add", "alternatives"] as const;
/** What a set's combinations are for. */
export const COMBINATION_PURPOSES = ["strength", "allowable-stress", "serviceability", "accidental", "seismic"] as const;

const loadKindId = z.string().regex(/^[A-Za-z][A-Za-z0-9_]{0,11}$/, "A load kind is a short symbol: D, L, Lr, S, W, E_h…");

/**
 * A load kind of a set. `action` is the kind's variation in time (EN 1990 4.1.1: permanent, variable,
 * accidental): only a variable action is ever left out of a combination, and a combination keeps its
 * permanent actions. `cases` says what several load cases of the kind in one model are: `add` (two dead-load
 * cases, the frame's and the cladding's, act together) or `alternatives` (wind from the left or from the
 * right, never both: each makes its own combination).
 */
const loadKindSchema = z
  .object({
    id: loadKindId,
    name: z.string().trim().min(1).max(80),
    action: z.enum(LOAD_ACTIONS, {
      error: "Say whether the load kind is a permanent, variable or accidental action.",
    }),
    cases: z.enum(LOAD_CASE_RULES).default("add"),
  })
  .strict();

const combinationSchema = z
  .object({
    id: z.string().regex(/^[A-Za-z0-9][A-Za-z0-9_.-]{0,23}$/, "A combination's id is short: letters, digits, . _ -"),
    /** As the standard writes it: "1.2D + 1.6L + 0.5(Lr or S or R)". */
    label: z.string().trim().min(1).max(200),
    /** A factor per load kind; a kind left out takes no part. */
    factors: z.record(
      loadKindId,
      finite("factor").refine((f) => f !== 0, "A factor of zero takes no part: leave the load kind out instead."),
    ),
    /**
     * The variable action the combination is written for — EN 1990's leading action; in ASCE 7, the principal
     * load of its companion-action format, or the roof load an "(Lr or S or R)" choice names. A model with no
     * case of that kind leaves the combination out: what remains of it is a weaker copy of another.
     */
    leading: loadKindId.optional(),
  })
  .strict();

export const combinationSetEntrySchema = z
  .object({
    key,
    /** The standard and clause the set follows: "ASCE/SEI 7-16 §2.3.1". */
    reference: source,
    /** What the combinations are for. */
    purpose: z.enum(COMBINATION_PURPOSES),
    loadKinds: z.array(loadKindSchema).min(1, "Name the load kinds the set's factors apply to."),
    combinations: z.array(combinationSchema).min(1, "A set needs at least one combination."),
    note: z.string().max(2000).optional(),
  })
  .strict()
  .superRefine((set, ctx) => {
    const kinds = new Map(set.loadKinds.map((k) => [k.id, k]));
    if (kinds.size !== set.loadKinds.length)
      ctx.addIssue({ code: "custom", path: ["loadKinds"], message: "A load kind is named twice." });
    const ids = new Set<string>();
    set.combinations.forEach((combination, i) => {
      if (ids.has(combination.id))
        ctx.addIssue({
          code: "custom",
          path: ["combinations", i, "id"],
          message: `Two combinations are called “${combination.id}”.`,
        });
      ids.add(combination.id);
      for (const kind of Object.keys(combination.factors))
        if (!kinds.has(kind))
          ctx.addIssue({
            code: "custom",
            path: ["combinations", i, "factors", kind],
            message: `Combination “${combination.id}” has a factor on “${kind}”, which is not one of the set's load kinds.`,
          });
      const leading = combination.leading;
      if (leading !== undefined && (kinds.get(leading)?.action !== "variable" || !Object.hasOwn(combination.factors, leading)))
        ctx.addIssue({
          code: "custom",
          path: ["combinations", i, "leading"],
          message: `Combination “${combination.id}” is led by “${leading}”, which must be a variable load kind of the set with a factor in it.`,
        });
    });
  });
export type CombinationSetEntry = z.output<typeof combinationSetEntrySchema>;

// ---- the document ------------------------------------------------------------------------------------------

const title = z.string().trim().min(3, "Give the library a title.").max(120);
const description = z.string().max(2000).optional();
const entries = <T extends z.ZodType>(entry: T) =>
  z.array(entry).max(MAX_ENTRIES, `A library may hold at most ${MAX_ENTRIES} entries; split it.`);

export const libraryDocumentInputSchema = z.discriminatedUnion("kind", [
  z.object({ kind: z.literal("sections"), title, description, entries: entries(sectionEntrySchema) }).strict(),
  z.object({ kind: z.literal("materials"), title, description, entries: entries(materialEntrySchema) }).strict(),
  z.object({ kind: z.literal("combinations"), title, description, entries: entries(combinationSetEntrySchema) }).strict(),
]);
export type LibraryDocumentInput = z.input<typeof libraryDocumentInputSchema>;

export type LibraryDocument =
  | { kind: "sections"; title: string; description?: string; entries: SectionEntry[] }
  | { kind: "materials"; title: string; description?: string; entries: MaterialEntry[] }
  | { kind: "combinations"; title: string; description?: string; entries: CombinationSetEntry[] };
export type LibraryEntry = LibraryDocument["entries"][number];

export interface LibraryProblem {
  /** Where: "entries.3.dimensions.tf", "title". */
  path: string;
  /** The entry's key when the problem is in one. */
  entry: string | null;
  message: string;
}

export type CheckedLibraryDocument = { ok: true; document: LibraryDocument } | { ok: false; problems: LibraryProblem[] };

/**
 * Checks a document and completes its section entries with the builder's properties. Every problem of the
 * form is given (each with the entry it is in), never only the first; once the form is right, every section
 * the builder refuses and every duplicate key. Nothing here throws.
 */
export function checkLibraryDocument(input: unknown): CheckedLibraryDocument {
  const parsed = libraryDocumentInputSchema.safeParse(input);
  if (!parsed.success) {
    const raw = (input as { entries?: { key?: unknown }[] } | null)?.entries;
    return {
      ok: false,
      problems: parsed.error.issues.map((issue) => {
        const index = issue.path[0] === "entries" && typeof issue.path[1] === "number" ? issue.path[1] : null;
        const entryKey = index !== null && Array.isArray(raw) ? raw[index]?.key : null;
        return {
          path: issue.path.map(String).join("."),
          entry: typeof entryKey === "string" ? entryKey : null,
          message: issue.message,
        };
      }),
    };
  }
  const problems: LibraryProblem[] = [];
  const seen = new Map<string, string>();
  parsed.data.entries.forEach((entry, i) => {
    const normal = normaliseKey(entry.key);
    const first = seen.get(normal);
    if (first !== undefined)
      problems.push({
        path: `entries.${i}.key`,
        entry: entry.key,
        message: `“${entry.key}” is listed twice (as “${first}” too).`,
      });
    else seen.set(normal, entry.key);
  });
  if (parsed.data.kind !== "sections") {
    return problems.length > 0 ? { ok: false, problems } : { ok: true, document: parsed.data as LibraryDocument };
  }
  const sections: SectionEntry[] = [];
  parsed.data.entries.forEach((entry, i) => {
    const built = buildSection({ shape: entry.shape, ...entry.dimensions }, (entry.rules ?? 1) as 1 | 2);
    if (!built.ok) {
      for (const p of built.problems)
        problems.push({ path: `entries.${i}.dimensions.${p.path}`, entry: entry.key, message: p.message });
      return;
    }
    const computed = built.section.properties as unknown as Record<string, number>;
    for (const name of Object.keys(entry.listed))
      if (!(name in computed))
        problems.push({
          path: `entries.${i}.listed.${name}`,
          entry: entry.key,
          message: `${entry.key}: a ${entry.shape} section has no property “${name}”.`,
        });
    sections.push({
      ...entry,
      dimensions: built.section.dimensions,
      computed: built.section.properties,
      properties: { ...computed, ...entry.listed },
    });
  });
  if (problems.length > 0) return { ok: false, problems };
  return { ok: true, document: { ...parsed.data, entries: sections } };
}

async function sha256Hex(text: string): Promise<string> {
  const digest = await globalThis.crypto.subtle.digest("SHA-256", new TextEncoder().encode(text));
  return Array.from(new Uint8Array(digest), (b) => b.toString(16).padStart(2, "0")).join("");
}

function canonical(value: unknown): string {
  const text = canonicalize(value);
  if (text === undefined) throw new Error("The value has no JSON form.");
  return text;
}

/** The version's content hash: sha256 of the RFC 8785 form of the checked document. */
export function libraryContentHash(document: LibraryDocument): Promise<string> {
  return sha256Hex(canonical(document));
}

/** An entry's hash, recorded by every run that uses the entry. */
export function libraryEntryHash(entry: LibraryEntry): Promise<string> {
  return sha256Hex(canonical(entry));
}

/** The entry a key names (case and spacing aside), or null. */
export function findEntry<D extends LibraryDocument>(document: D, entryKey: string): D["entries"][number] | null {
  const wanted = normaliseKey(entryKey);
  return (document.entries as D["entries"][number][]).find((entry) => normaliseKey(entry.key) === wanted) ?? null;
}
