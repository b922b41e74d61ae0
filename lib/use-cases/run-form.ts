import "server-only";
// What the run form needs, read for an engineer or lead about to run a published version in a job: the job, the
// version (the newest not withdrawn unless one is asked for), and one field per input — its label, symbol, unit,
// default, bounds and help, the choices or library entries it offers, and the units a person may type with their
// factor to the input's own unit, so the browser can show the converted value without carrying mathjs. With a
// run to start from, its inputs as typed fill the fields (a re-run with changes). The source and the library
// entries go along for the live preview, which runs the same evaluation in a Web Worker.
import { AppError } from "@/lib/domain/errors";
import { z } from "@/lib/domain/zod";
import { slugSchema } from "@/lib/domain/schemas/standards";
import { parseSource } from "@/lib/standards/source";
import { DefinitionSchema, type Definition } from "@/lib/standards/definition";
import { isLibraryInput, type LibraryEntries } from "@/lib/standards/library-inputs";
import { hasDimensionOf, math, QUANTITIES, type Quantity } from "@/lib/standards/units";
import { prettyUnit } from "@/lib/standards/format";
import { readRunRecord } from "@/lib/standards/run-record";
import { getJob, type JobDto } from "@/lib/data/jobs";
import { getStandardBySlug, getVersion, listVersionsOf, type VersionDto } from "@/lib/data/standards";
import { getRun } from "@/lib/data/runs";
import { evaluationPool } from "@/lib/evaluation/pool";
import { publishedLibraryEntries } from "./library-resolution";
import { defineUseCase } from "./use-case";

/** The units offered per quantity, in the order a person thinks of them (SI first, then US customary). */
const UNIT_CHOICES: Partial<Record<Quantity, readonly string[]>> = {
  length: ["m", "mm", "cm", "km", "ft", "in"],
  angle: ["deg", "rad"],
  force: ["kN", "N", "MN", "kip", "lbf"],
  "force-per-length": ["kN/m", "N/m", "N/mm", "kip/ft", "klf", "plf", "lbf/ft"],
  "force-per-area": ["kPa", "Pa", "kN/m^2", "MPa", "psf", "psi", "ksi"],
  stress: ["MPa", "N/mm^2", "GPa", "kPa", "Pa", "ksi", "psi"],
  moment: ["kN m", "N m", "kN*m", "N*m", "kip ft", "kip*ft", "kip in", "lbf ft"],
  area: ["mm^2", "cm^2", "m^2", "in^2", "ft^2"],
  "second-moment-of-area": ["mm^4", "cm^4", "m^4", "in^4"],
  "section-modulus": ["mm^3", "cm^3", "m^3", "in^3"],
  density: ["kg/m^3"],
  "rotational-stiffness": ["kN m/rad", "N m/rad", "kip ft/rad"],
  "translational-stiffness": ["kN/m", "N/m", "kN/mm", "kip/in"],
};

export type RunField =
  | {
      kind: "number";
      key: string;
      label: string;
      symbol?: string;
      quantity: string;
      /** The input's own unit: a bare number means this. */
      unit?: string;
      /** The same, as printed (mm², kN·m). */
      unitShown?: string;
      initial: string;
      min?: string;
      max?: string;
      help?: string;
      /** Unit text → the factor that turns a number in it into the input's own unit. */
      units: Record<string, number>;
    }
  | { kind: "choice"; key: string; label: string; symbol?: string; initial: string; help?: string; choices: string[] }
  | {
      kind: "entry";
      key: string;
      label: string;
      symbol?: string;
      initial: string;
      help?: string;
      library: string;
      libraryVersion: number | null;
      /** Each entry's name with its shape or family, for a searchable picker filtered by shape. */
      options: { key: string; type: string }[];
    };

export type RunFormData = {
  job: JobDto;
  version: Pick<VersionDto, "id" | "slug" | "number" | "title" | "summary" | "status" | "contentHash">;
  newer: { number: number } | null;
  fields: RunField[];
  source: string;
  libraries: LibraryEntries;
  from: { id: string; unitSystem: "si" | "us" } | null;
  /** The evaluation bundle the preview's Web Worker loads (the one the server runs, by its sha256). */
  bundle: { url: string; sha256: string; gzipBytes: number };
};

function unitsFor(quantity: Quantity, unit: string | undefined): Record<string, number> {
  const out: Record<string, number> = {};
  const own = unit ?? QUANTITIES[quantity];
  if (!own) return out;
  for (const text of [...new Set([...(unit ? [unit] : []), ...(UNIT_CHOICES[quantity] ?? [])])]) {
    try {
      const one = math.unit(1, text);
      if (!hasDimensionOf(one, quantity)) continue;
      out[text] = one.toNumber(own);
    } catch {
      // a unit this release does not know is simply not offered
    }
  }
  return out;
}

const SUPERSCRIPT: Record<string, string> = { "2": "²", "3": "³", "4": "⁴", "-1": "⁻¹", "-2": "⁻²" };
/** `1e5 mm^4` → `1e5 mm⁴`: bounds as a person reads them. */
const superscripts = (text: string) => text.replace(/\^(-?\d)/g, (whole, p: string) => SUPERSCRIPT[p] ?? whole);

function initialText(value: string | number, unit: string | undefined): string {
  return typeof value === "number" && unit ? `${value} ${unit}` : String(value);
}

function fieldsOf(definition: Definition, libraries: LibraryEntries, typed: Record<string, string | number>): RunField[] {
  return Object.entries(definition.inputs).map(([key, input]): RunField => {
    const common = {
      key,
      label: input.label,
      ...(input.symbol ? { symbol: input.symbol } : {}),
      ...(input.help ? { help: input.help } : {}),
    };
    const given = Object.hasOwn(typed, key) ? typed[key] : undefined;
    if (isLibraryInput(input)) {
      const library = libraries[input.library];
      return {
        ...common,
        kind: "entry",
        initial: String(given ?? input.default),
        library: input.library,
        libraryVersion: library?.version ?? null,
        options: Object.values(library?.entries ?? {})
          .filter((entry) => entry.kind === input.quantity)
          .map((entry) => ({ key: entry.key, type: entry.type })),
      };
    }
    if (input.quantity === "choice")
      return { ...common, kind: "choice", initial: String(given ?? input.default), choices: input.choices ?? [] };
    const quantity = input.quantity as Quantity;
    return {
      ...common,
      kind: "number",
      quantity,
      ...(input.unit ? { unit: input.unit, unitShown: prettyUnit(input.unit) } : {}),
      initial: given !== undefined ? String(given) : initialText(input.default, input.unit),
      ...(input.min ? { min: superscripts(input.min) } : {}),
      ...(input.max ? { max: superscripts(input.max) } : {}),
      units: unitsFor(quantity, input.unit),
    };
  });
}

export const readRunForm = defineUseCase({
  name: "runs.form",
  permission: "runs.create",
  input: z.object({
    jobNumber: z.string().trim().min(1).max(30),
    slug: slugSchema,
    version: z.coerce.number().int().min(1).optional(),
    from: z.uuid().optional(),
  }),
  prepare: async ({ jobNumber, slug, version: wanted, from }): Promise<RunFormData> => {
    const job = await getJob({ jobNumber });
    if (!job) throw new AppError("not-found", `There is no job ${jobNumber}.`);
    const standard = await getStandardBySlug(slug);
    if (!standard) throw new AppError("not-found", `There is no standard ${slug}.`);
    const versions = await listVersionsOf(standard.id);
    const usable = versions.filter((v) => v.status !== "withdrawn");
    const summary = wanted ? versions.find((v) => v.number === wanted) : usable[0];
    if (!summary) throw new AppError("not-found", `No version of ${slug} can be run.`);
    if (summary.status === "withdrawn")
      throw new AppError("conflict", `Version ${summary.number} of ${summary.title} is withdrawn and cannot be run.`);
    const version = (await getVersion({ id: summary.id }))!;
    const read = parseSource(version.source);
    const parsed = read.ok ? DefinitionSchema.safeParse(read.parsed.data) : null;
    if (!read.ok || !parsed?.success) throw new AppError("conflict", `Version ${version.number} of ${slug} no longer reads.`);
    const definition = parsed.data;
    const all: Record<string, "all"> = {};
    for (const input of Object.values(definition.inputs)) if (isLibraryInput(input)) all[input.library] = "all";
    const { entries: libraries } = await publishedLibraryEntries(version, all, { forRun: true });

    let typed: Record<string, string | number> = {};
    let fromRun: RunFormData["from"] = null;
    if (from) {
      const run = await getRun(from);
      if (!run || run.jobId !== job.id) throw new AppError("not-found", "That run is not a run of this job.");
      const record = readRunRecord(run.record);
      typed = { ...record.typed };
      // A run's inputs are kept only where this version still has them.
      for (const key of Object.keys(typed)) if (!Object.hasOwn(definition.inputs, key)) delete typed[key];
      fromRun = { id: run.id, unitSystem: record.unitSystem };
    }
    const newest = usable[0];
    const manifest = evaluationPool().bundle();
    return {
      bundle: { url: `/evaluation/${manifest.file}`, sha256: manifest.sha256, gzipBytes: manifest.gzipBytes },
      job,
      version: {
        id: version.id,
        slug: version.slug,
        number: version.number,
        title: version.title,
        summary: version.summary,
        status: version.status,
        contentHash: version.contentHash,
      },
      newer: newest && newest.number > version.number ? { number: newest.number } : null,
      fields: fieldsOf(definition, libraries, typed),
      source: version.source,
      libraries,
      from: fromRun,
    };
  },
  run: async (_input, { prepared }) => prepared,
  audit: null,
});
