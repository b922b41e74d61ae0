/**
 * Compiling a standard's source: read the file, validate the definition, check every name, unit and
 * expression, then evaluate it at its default inputs (and at each alternative of each choice) so that an
 * expression adding a force to a length, a capacity in another unit than its demand, or an engine field fed
 * the wrong quantity is refused when the draft is saved — each refusal with its path, line and column.
 *
 * A compiled standard is cached by its source text: a version's expressions are parsed and checked once.
 */
import type { AnalysisResult } from "@/lib/engine";
import { DefinitionSchema, type Definition } from "./definition";
import { checkExpression, ExpressionError, reservedNameReason, type KnownNames } from "./expressions";
import { isLibraryInput, libraryValueNames, type LibraryEntries } from "./library-inputs";
import { evaluateDefinition, type EvaluationOutcome } from "./evaluate";
import { SECTION_NAMES } from "./checks";
import { QUANTITY_OF } from "./extracts";
import { checkNarrative } from "./narrative";
import { formatPath, parseSource, type ParsedSource, type SourceProblem } from "./source";
import { hasDimensionOf, isTradeUnitText, math, QUANTITIES, type Quantity } from "./units";

export interface CompiledStandard {
  readonly definition: Definition;
  readonly narrative: string;
  readonly narrativeLine: number;
  /**
   * Evaluate with the given inputs (the defaults for those left out), finding section and material inputs'
   * entries in `libraries` (those it was compiled with unless others are given).
   */
  evaluate(
    inputs?: Readonly<Record<string, string | number>>,
    libraries?: LibraryEntries,
    analysed?: (result: AnalysisResult) => void,
  ): EvaluationOutcome;
}

export type CompileOutcome = { ok: true; standard: CompiledStandard } | { ok: false; problems: SourceProblem[] };

function problemAt(parsed: ParsedSource, path: ReadonlyArray<PropertyKey>, message: string): SourceProblem {
  const position = parsed.positionOf(path);
  return { path: formatPath(path), message, ...(position ? { line: position.line, column: position.column } : {}) };
}

function unitProblem(unit: string | undefined, quantity: Quantity | "section" | "material"): string | null {
  if (quantity === "section" || quantity === "material")
    return unit ? `a ${quantity} has no unit; remove \`unit: ${unit}\`` : null;
  const si = QUANTITIES[quantity];
  if (si === "") return unit ? `a ${quantity} value has no unit; remove \`unit: ${unit}\`` : null;
  if (!unit) return `a ${quantity.replaceAll("-", " ")} needs a unit (e.g. ${si})`;
  if (!isTradeUnitText(unit)) return `\`${unit}\` is not a unit Gusset knows`;
  if (!hasDimensionOf(math.unit(`1 ${unit}`), quantity)) return `\`${unit}\` is not a unit of ${quantity.replaceAll("-", " ")}`;
  return null;
}

/** Names, units and expressions, without evaluating anything. */
function staticProblems(parsed: ParsedSource, d: Definition): SourceProblem[] {
  const problems: SourceProblem[] = [];
  const add = (path: PropertyKey[], message: string) => problems.push(problemAt(parsed, path, message));
  const owner = new Map<string, string>();
  const libraryValues = libraryValueNames(d);
  const claim = (kind: string, key: string) => {
    const reason = reservedNameReason(key);
    if (libraryValues.has(key))
      add([kind, key], `\`${key}\` reads like a value of a section or material input; choose another name`);
    if (reason) add([kind, key], `${reason}; choose another name (an input \`N = 3\` would turn \`5 N\` into 15)`);
    else if ((SECTION_NAMES as ReadonlyArray<string>).includes(key))
      add([kind, key], `\`${key}\` is kept for the section's forces and member in checks for each member; choose another name`);
    else if (owner.has(key)) add([kind, key], `\`${key}\` is already used by ${owner.get(key)}`);
    owner.set(key, `${kind}.${key}`);
  };
  const known = new Set<string>();
  // Besides the names declared, `<input>_<value>` of a section or material input; its entry decides which exist.
  const expression = (path: PropertyKey[], source: string, names: ReadonlySet<string>) => {
    const readable: KnownNames = { has: (name) => names.has(name) || libraryValues.has(name) };
    try {
      checkExpression(source, readable);
    } catch (error) {
      if (error instanceof ExpressionError) add(path, error.message);
      else throw error;
    }
  };

  for (const [key, input] of Object.entries(d.inputs)) {
    claim("inputs", key);
    const libraryOnly = (["library", "version", "shapes", "families"] as const).filter((field) => input[field] !== undefined);
    if (isLibraryInput(input)) {
      if (!input.library) add(["inputs", key], `a ${input.quantity} input names its \`library\` (its short name)`);
      if (typeof input.default !== "string")
        add(["inputs", key, "default"], `the default is the name of a ${input.quantity} in the library`);
      if (input.unit) add(["inputs", key, "unit"], `a ${input.quantity} has no unit`);
      if (input.choices) add(["inputs", key, "choices"], "only a choice has `choices`");
      if (input.min !== undefined || input.max !== undefined)
        add(["inputs", key], `a ${input.quantity} has no \`min\` or \`max\``);
      if (input.quantity === "section" && input.families)
        add(["inputs", key, "families"], "a section has `shapes`, not `families`");
      if (input.quantity === "material" && input.shapes)
        add(["inputs", key, "shapes"], "a material has `families`, not `shapes`");
      continue;
    }
    for (const field of libraryOnly) add(["inputs", key, field], `only a section or material input has \`${field}\``);
    if (input.quantity === "choice") {
      if (!input.choices) add(["inputs", key, "choices"], "a choice needs its `choices`");
      else if (!input.choices.includes(String(input.default)))
        add(["inputs", key, "default"], `the default must be one of ${input.choices.join(", ")}`);
      if (input.unit) add(["inputs", key, "unit"], "a choice has no unit");
    } else {
      const p = unitProblem(input.unit, input.quantity);
      if (p) add(["inputs", key, "unit"], p);
      if (input.choices) add(["inputs", key, "choices"], "only a choice has `choices`");
    }
  }
  for (const key of Object.keys(d.inputs)) known.add(key);
  for (const [key, input] of Object.entries(d.inputs)) {
    if (input.min !== undefined) expression(["inputs", key, "min"], input.min, known);
    if (input.max !== undefined) expression(["inputs", key, "max"], input.max, known);
  }
  for (const [key, derived] of Object.entries(d.derived)) {
    claim("derived", key);
    const p = unitProblem(derived.unit, derived.quantity);
    if (p) add(["derived", key, "unit"], p);
    expression(["derived", key, "expr"], derived.expr, known);
    known.add(key);
  }
  for (const [key, extract] of Object.entries(d.extracts)) {
    claim("extracts", key);
    const quantity =
      "reaction" in extract
        ? QUANTITY_OF[extract.reaction.component]
        : "displacement" in extract
          ? QUANTITY_OF[extract.displacement.component]
          : "max_abs" in extract
            ? QUANTITY_OF[extract.max_abs]
            : QUANTITY_OF[extract.value_at.quantity];
    const p = unitProblem(extract.unit, quantity);
    if (p) add(["extracts", key, "unit"], p);
  }
  const withExtracts = new Set([...known, ...Object.keys(d.extracts)]);
  const withSection = new Set([...withExtracts, ...SECTION_NAMES]);
  for (const [key, check] of Object.entries(d.checks)) {
    claim("checks", key);
    const names = check.for_each ? withSection : withExtracts;
    expression(["checks", key, "demand"], check.demand, names);
    expression(["checks", key, "capacity"], check.capacity, names);
    if (check.unit && !isTradeUnitText(check.unit)) add(["checks", key, "unit"], `\`${check.unit}\` is not a unit Gusset knows`);
  }
  d.assumptions.forEach((a, k) => {
    if ("check" in a) expression(["assumptions", k, "check"], a.check, withExtracts);
  });
  d.verification.forEach((v, k) => {
    for (const key of Object.keys(v.inputs))
      if (!Object.hasOwn(d.inputs, key)) add(["verification", k, "inputs", key], `there is no input \`${key}\``);
    for (const target of Object.keys(v.expect)) {
      const [name, part] = target.split(".");
      const ok =
        part === undefined
          ? Object.hasOwn(d.extracts, name) || Object.hasOwn(d.derived, name)
          : Object.hasOwn(d.checks, name) && ["utilisation", "demand", "capacity"].includes(part);
      if (!ok)
        add(
          ["verification", k, "expect", target],
          `\`${target}\` is neither an extract, a derived value nor a check's utilisation, demand or capacity`,
        );
    }
  });
  return problems;
}

/** Evaluate at the defaults, then at each other alternative of each choice, to find dimension errors in every branch. */
function probeProblems(parsed: ParsedSource, d: Definition, libraries: LibraryEntries): SourceProblem[] {
  const variations: Record<string, string>[] = [{}];
  for (const [key, input] of Object.entries(d.inputs))
    if (input.quantity === "choice") for (const c of input.choices ?? []) if (c !== input.default) variations.push({ [key]: c });
  const problems: SourceProblem[] = [];
  const seen = new Set<string>();
  for (const inputs of variations) {
    const out = evaluateDefinition(d, inputs, libraries);
    if (out.ok) continue;
    const when =
      Object.keys(inputs).length === 0
        ? "with the default inputs"
        : `with ${Object.entries(inputs).map(([k, v]) => `${k} = ${v}`)[0]}`;
    const found: SourceProblem[] =
      out.stage === "definition"
        ? [
            problemAt(
              parsed,
              out.path
                .split(/\.|\[|\]/)
                .filter(Boolean)
                .map((p) => (/^\d+$/.test(p) ? Number(p) : p)),
              `${out.message} (${when})`,
            ),
          ]
        : out.stage === "inputs"
          ? out.problems.map((p) => problemAt(parsed, ["inputs", p.input, "default"], `${p.message} (${when})`))
          : out.errors.map((e) => problemAt(parsed, ["model"], `The model ${when} cannot be analysed: ${e.message}`));
    for (const p of found) {
      const key = `${p.path}\u0000${p.message}`;
      if (!seen.has(key)) problems.push(p);
      seen.add(key);
    }
  }
  return problems;
}

const cache = new Map<string, CompileOutcome>();
const CACHE_LIMIT = 200;

/**
 * Compiles a source; `libraries` holds the entries its section and material inputs' defaults and verification
 * cases name (none needed when it has no such input).
 */
export function compileStandard(source: string, libraries: LibraryEntries = {}): CompileOutcome {
  const key = `${librariesDigest(libraries)}\u0000${source}`;
  const hit = cache.get(key);
  if (hit) return hit;
  const outcome = compileUncached(source, libraries);
  if (cache.size >= CACHE_LIMIT) cache.clear();
  cache.set(key, outcome);
  return outcome;
}

/** What tells two sets of handed-in entries apart: each library's version, content hash and entry hashes. */
function librariesDigest(libraries: LibraryEntries): string {
  const slugs = Object.keys(libraries).sort();
  if (slugs.length === 0) return "";
  return JSON.stringify(
    slugs.map((slug) => {
      const library = libraries[slug];
      const entries = Object.keys(library.entries).sort();
      return [slug, library.version, library.contentHash, entries.map((entry) => library.entries[entry].hash)];
    }),
  );
}

function compileUncached(source: string, libraries: LibraryEntries): CompileOutcome {
  const read = parseSource(source);
  if (!read.ok) return { ok: false, problems: read.problems };
  const parsed = read.parsed;
  const valid = DefinitionSchema.safeParse(parsed.data);
  if (!valid.success)
    return {
      ok: false,
      problems: valid.error.issues.map((issue) =>
        issue.code === "unrecognized_keys"
          ? problemAt(parsed, [...(issue.path as PropertyKey[]), issue.keys[0]], `unknown field \`${issue.keys.join("`, `")}\``)
          : problemAt(parsed, issue.path as PropertyKey[], issue.message),
      ),
    };
  const definition = valid.data;
  const problems = [...staticProblems(parsed, definition), ...checkNarrative(parsed.narrative, definition, parsed.narrativeLine)];
  if (problems.length > 0) return { ok: false, problems };
  const probed = probeProblems(parsed, definition, libraries);
  if (probed.length > 0) return { ok: false, problems: probed };
  return {
    ok: true,
    standard: {
      definition,
      narrative: parsed.narrative,
      narrativeLine: parsed.narrativeLine,
      evaluate: (inputs = {}, entries = libraries, analysed) => evaluateDefinition(definition, inputs, entries, analysed),
    },
  };
}
