/**
 * Inputs that take an entry of one of the firm's libraries — a section or a material — instead of a number:
 *
 *   beam: { label: Beam section, quantity: section, library: firm-sections, shapes: [i], default: "MF-I 310x165" }
 *   steel: { label: Steel, quantity: material, library: firm-materials, version: 2, default: "ASTM A992" }
 *
 * The value typed is the entry's name. Its values come into the expressions as `<input>_<value>` with their
 * units: `beam_A`, `beam_Ix`, `beam_Zx`, `beam_d`, `steel_E`, `steel_fy`… (`version` is a published version
 * number, or `latest`, which is resolved and pinned when the standard's version is published).
 *
 * The evaluation stays pure: it never reads a library. Whoever evaluates (the server, a script, a test)
 * resolves the entries first and hands them in as data (`LibraryEntries`), each with its library's version
 * and the entry's hash; the evaluation records them beside the input, so a stored run names exactly what it
 * used. lib/libraries turns a library document's entries into this form (`boundEntry`).
 */
import { z } from "@/lib/domain/zod";
import type { Definition, InputDefinition } from "./definition";
import { fromSI, QUANTITIES, type Quantity, type Value } from "./units";

export const LIBRARY_QUANTITIES = ["section", "material"] as const;
export type LibraryQuantity = (typeof LIBRARY_QUANTITIES)[number];

export function isLibraryInput(
  input: InputDefinition,
): input is InputDefinition & { quantity: LibraryQuantity; library: string } {
  return (LIBRARY_QUANTITIES as readonly string[]).includes(input.quantity);
}

/** One entry as the evaluation sees it: plain data, SI values with their quantities. */
export interface BoundEntry {
  /** The entry's name as the library spells it. */
  readonly key: string;
  readonly kind: LibraryQuantity;
  /** A section's shape ("i", "channel", …) or a material's family ("steel", "timber", …). */
  readonly type: string;
  /** sha256 of the entry (lib/libraries libraryEntryHash). */
  readonly hash: string;
  readonly values: Readonly<Record<string, { readonly si: number; readonly quantity: Quantity }>>;
}

/** The entries handed to an evaluation, by library slug; keys normalised (trimmed, single spaces, lower case). */
export type LibraryEntries = Readonly<
  Record<
    string,
    { readonly version: number; readonly contentHash: string; readonly entries: Readonly<Record<string, BoundEntry>> }
  >
>;

const boundEntrySchema = z
  .object({
    key: z.string().min(1).max(80),
    kind: z.enum(LIBRARY_QUANTITIES),
    type: z.string().max(40),
    hash: z.string().regex(/^[0-9a-f]{64}$/),
    values: z.record(
      z.string().regex(/^[A-Za-z][A-Za-z0-9_]{0,23}$/),
      z
        .object({
          si: z.number().refine(Number.isFinite),
          quantity: z.enum(Object.keys(QUANTITIES) as [Quantity, ...Quantity[]]),
        })
        .strict(),
    ),
  })
  .strict();

/** The form entries must have when they cross a boundary (a worker's message): checked, never trusted. */
export const libraryEntriesSchema = z.record(
  z.string().max(80),
  z
    .object({
      version: z.number().int().min(1),
      contentHash: z.string().regex(/^[0-9a-f]{64}$/),
      entries: z.record(z.string().max(80), boundEntrySchema),
    })
    .strict(),
);

/** What a run records of an entry it used. */
export interface UsedEntry {
  readonly library: string;
  readonly version: number;
  readonly contentHash: string;
  readonly key: string;
  readonly hash: string;
  /** The values the evaluation read from it, in SI: a stored run needs nothing else to be printed again. */
  readonly values: BoundEntry["values"];
}

/** The unit an entry's value is printed in, by quantity: what drawings and tables state them in. */
export const LIBRARY_DISPLAY_UNITS: Partial<Record<Quantity, string>> = {
  length: "mm",
  area: "mm^2",
  "second-moment-of-area": "mm^4",
  "section-modulus": "mm^3",
  stress: "MPa",
  density: "kg/m^3",
  angle: "deg",
};

export function normaliseEntryKey(key: string): string {
  return key.trim().replace(/\s+/g, " ").toLowerCase();
}

/** Every library a definition reads, with the version it asks for. */
export function libraryReferencesOf(definition: Definition): { library: string; version: number | "latest"; inputs: string[] }[] {
  const byLibrary = new Map<string, { library: string; version: number | "latest"; inputs: string[] }>();
  for (const [key, input] of Object.entries(definition.inputs)) {
    if (!isLibraryInput(input)) continue;
    const version = input.version ?? "latest";
    const id = `${input.library}@${version}`;
    const hit = byLibrary.get(id) ?? { library: input.library, version, inputs: [] };
    hit.inputs.push(key);
    byLibrary.set(id, hit);
  }
  return [...byLibrary.values()];
}

/** Entry names a definition needs to compile and verify: each library input's default and every verification case's. */
export function entriesNeededBy(definition: Definition): { library: string; keys: string[] }[] {
  const needed = new Map<string, Set<string>>();
  const add = (library: string, key: unknown) => {
    if (typeof key !== "string") return;
    const keys = needed.get(library) ?? new Set<string>();
    keys.add(key);
    needed.set(library, keys);
  };
  for (const [key, input] of Object.entries(definition.inputs)) {
    if (!isLibraryInput(input)) continue;
    add(input.library, input.default);
    for (const v of definition.verification) if (Object.hasOwn(v.inputs, key)) add(input.library, v.inputs[key]);
  }
  return [...needed.entries()].map(([library, keys]) => ({ library, keys: [...keys] }));
}

/** `<input>_<value>`: the name an entry's value takes in the expressions. */
export const valueName = (input: string, value: string) => `${input}_${value}`;

/** Whether a name could be a library value of one of the inputs (`beam_Ix`); the entry decides whether it is one. */
export function libraryValueNames(definition: Definition): { has(name: string): boolean } {
  const prefixes = Object.entries(definition.inputs)
    .filter(([, input]) => isLibraryInput(input))
    .map(([key]) => `${key}_`);
  return { has: (name) => prefixes.some((prefix) => name.startsWith(prefix) && name.length > prefix.length) };
}

export type BoundInput =
  { ok: true; entry: BoundEntry; used: UsedEntry; values: [string, Value][] } | { ok: false; message: string };

const KIND_WORD: Record<LibraryQuantity, string> = { section: "section", material: "material" };

/** Finds a library input's entry among those handed in and gives its values for the scope; or says why not. */
export function bindLibraryInput(
  key: string,
  input: InputDefinition,
  raw: string | number,
  libraries: LibraryEntries,
): BoundInput {
  if (!isLibraryInput(input)) return { ok: false, message: `${input.label}: not a library input` };
  const label = input.label;
  const name = String(raw).trim();
  const word = KIND_WORD[input.quantity];
  if (name === "") return { ok: false, message: `${label}: choose a ${word} from the library “${input.library}”` };
  const library = libraries[input.library];
  if (!library)
    return {
      ok: false,
      message: `${label}: the library “${input.library}” is not available (it has no published version, or it was not loaded)`,
    };
  if (input.version !== undefined && input.version !== "latest" && library.version !== input.version)
    return {
      ok: false,
      message: `${label}: this standard uses version ${input.version} of “${input.library}”, but version ${library.version} was given`,
    };
  const entry = library.entries[normaliseEntryKey(name)];
  if (!entry || entry.kind !== input.quantity)
    return {
      ok: false,
      message: `${label}: there is no ${word} “${name.slice(0, 60)}” in version ${library.version} of “${input.library}”`,
    };
  const allowed = input.quantity === "section" ? input.shapes : input.families;
  if (allowed && !allowed.includes(entry.type))
    return { ok: false, message: `${label}: “${entry.key}” is a ${entry.type}; this input takes ${allowed.join(" or ")}` };
  return {
    ok: true,
    entry,
    used: {
      library: input.library,
      version: library.version,
      contentHash: library.contentHash,
      key: entry.key,
      hash: entry.hash,
      values: entry.values,
    },
    values: Object.entries(entry.values).map(([value, { si, quantity }]) => [valueName(key, value), fromSI(si, quantity)]),
  };
}
