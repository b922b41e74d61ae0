/**
 * `npm run analyze`: argument parsing and the outcome of one run as data (stdout, stderr, exit code), so
 * tests run it in-process; scripts/analyze.ts only reads the file and writes the streams.
 *
 * Exit codes: 0 analysed (or --schema, --help); 1 the engine refused the model (each error listed); 2 the
 * command could not run: wrong arguments, a file that cannot be read, or text that is not JSON.
 */
import path from "node:path";
import { analyze, modelJsonSchema, ModelSchema, resultToJson } from "../../../lib/engine";
import { parseJsonText } from "./json-input";
import { unitHints } from "./model-hints";
import { formatReport } from "./report";
import { DEFAULT_UNITS, parseUnitSystem, unitSystemNames, type UnitSystem } from "./units";

export const EXIT = { ok: 0, modelRefused: 1, cannotRun: 2 } as const;

export interface CliOutcome {
  readonly code: number;
  readonly stdout: string;
  readonly stderr: string;
}

export interface CliIo {
  /** The file's text; throws when it cannot be read. */
  readFile(file: string): string;
  /** Where a relative path is read from (the directory npm was started in). */
  readonly cwd: string;
}

export const USAGE = `usage: npm run analyze -- <model.json> [--units ${unitSystemNames().replace(/, /g, "|")}]
       npm run -s analyze -- --json <model.json> [--points N] [--compact]
       npm run -s analyze -- --schema [--compact]

By default prints a short report; --units chooses the display units (default N,m; the model is always SI).
--json prints the full results as JSON and nothing else on stdout (-s keeps npm's own lines out of it).
Exit codes: 0 analysed; 1 the engine refused the model; 2 wrong arguments, an unreadable file or invalid JSON.
`;

interface Options {
  readonly file?: string;
  readonly json: boolean;
  readonly schema: boolean;
  readonly help: boolean;
  readonly compact: boolean;
  readonly points: number;
  readonly units: UnitSystem;
}

/** Options from argv, or the sentence that says what is wrong with them. */
export function parseArguments(argv: ReadonlyArray<string>): Options | string {
  let file: string | undefined;
  let json = false;
  let schema = false;
  let help = false;
  let compact = false;
  let points: number | undefined;
  let units: UnitSystem | undefined;
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    const [flag, inline] =
      arg.startsWith("--") && arg.includes("=")
        ? [arg.slice(0, arg.indexOf("=")), arg.slice(arg.indexOf("=") + 1)]
        : [arg, undefined];
    const valueOf = () => inline ?? argv[++i];
    if (flag === "--json") json = true;
    else if (flag === "--schema") schema = true;
    else if (flag === "--help" || flag === "-h") help = true;
    else if (flag === "--compact") compact = true;
    else if (flag === "--points") {
      const text = valueOf();
      points = Number(text);
      if (!(Number.isInteger(points) && points >= 2))
        return `--points needs a whole number of at least 2, not ${text ?? "nothing"}`;
    } else if (flag === "--units") {
      const text = valueOf();
      if (text === undefined) return `--units needs one of ${unitSystemNames()}`;
      const parsed = parseUnitSystem(text);
      if (!parsed.ok) return parsed.message;
      units = parsed.units;
    } else if (arg.startsWith("-")) return `Unknown option ${arg}`;
    else if (file !== undefined) return `One model at a time: ${file} and ${arg}`;
    else file = arg;
  }
  if (help) return { json, schema, help, compact, points: 0, units: DEFAULT_UNITS };
  if (!json && !schema && (compact || points !== undefined)) return "--points and --compact shape the JSON output: add --json";
  if (units && (json || schema)) return "--units applies to the report; the JSON output is always SI (N, m, Pa)";
  if (!schema && file === undefined) return "Name a model file";
  return { file, json, schema, help, compact, points: points ?? 0, units: units ?? DEFAULT_UNITS };
}

function jsonText(value: unknown, compact: boolean): string {
  return `${JSON.stringify(value, null, compact ? undefined : 2)}\n`;
}

export function runAnalyze(argv: ReadonlyArray<string>, io: CliIo): CliOutcome {
  const options = parseArguments(argv);
  if (typeof options === "string")
    return { code: EXIT.cannotRun, stdout: "", stderr: `${options}\n(npm run analyze -- --help lists the options)\n` };
  if (options.help) return { code: EXIT.ok, stdout: USAGE, stderr: "" };
  if (options.schema) return { code: EXIT.ok, stdout: jsonText(modelJsonSchema(), options.compact), stderr: "" };
  const file = options.file!;
  // In --json mode every outcome is JSON on stdout, as before; the report's problems go to stderr as sentences.
  const fail = (code: number, errors: ReadonlyArray<Record<string, unknown>>, text: string, notes: ReadonlyArray<string> = []) =>
    options.json
      ? { code, stdout: jsonText({ ok: false, errors }, options.compact), stderr: notes.map((n) => `Note: ${n}\n`).join("") }
      : { code, stdout: "", stderr: `${text}\n${notes.map((n) => `Note: ${n}\n`).join("")}` };

  let text: string;
  try {
    text = io.readFile(path.resolve(io.cwd, file));
  } catch (e) {
    const message = `${file}: cannot read the file (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`;
    return fail(EXIT.cannotRun, [{ kind: "unreadable-input", message }], message);
  }
  const parsed = parseJsonText(text);
  if (!parsed.ok) {
    const where = `line ${parsed.line}, column ${parsed.column}`;
    const message = `${file}, ${where}: not valid JSON (${parsed.reason})`;
    return fail(
      EXIT.cannotRun,
      [{ kind: "unreadable-input", line: parsed.line, column: parsed.column, message }],
      `${message}\n${parsed.excerpt}`,
    );
  }
  const hints = unitHints(parsed.value);
  const out = analyze(parsed.value);
  if (!out.ok) {
    const count = out.errors.length;
    const text = `${file}: the engine refused the model (${count} problem${count === 1 ? "" : "s"}):\n${out.errors.map((e) => `  - ${e.message}`).join("\n")}`;
    return fail(EXIT.modelRefused, out.errors, text, hints);
  }
  if (options.json) {
    const body = { ok: true, ...(resultToJson(out.result, { points: options.points }) as object) };
    return { code: EXIT.ok, stdout: jsonText(body, options.compact), stderr: hints.map((n) => `Note: ${n}\n`).join("") };
  }
  const model = ModelSchema.parse(parsed.value);
  return {
    code: EXIT.ok,
    stdout: formatReport({ result: out.result, model, units: options.units, source: file, hints }),
    stderr: "",
  };
}
