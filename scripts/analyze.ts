/**
 * npm run analyze -- model.json [--points N] [--compact]
 * npm run analyze -- --schema
 *
 * Reads a frame model (the JSON format of lib/engine/model.ts), analyses it and prints the results as JSON.
 * On a model error prints { ok: false, errors } and exits with 1; an unreadable file or invalid JSON exits with 2.
 */
import { readFileSync } from "node:fs";
import { analyze, modelJsonSchema, resultToJson } from "../lib/engine";

function usage(): never {
  console.error("usage: npm run analyze -- <model.json> [--points N] [--compact]\n       npm run analyze -- --schema");
  process.exit(2);
}

function main(argv: string[]): number {
  const compact = argv.includes("--compact");
  const indent = compact ? undefined : 2;
  if (argv.includes("--schema")) {
    console.log(JSON.stringify(modelJsonSchema(), null, indent));
    return 0;
  }
  const pointsAt = argv.indexOf("--points");
  const points = pointsAt >= 0 ? Number(argv[pointsAt + 1]) : 0;
  if (pointsAt >= 0 && !(Number.isInteger(points) && points >= 2)) usage();
  const file = argv.find((a, i) => !a.startsWith("--") && (pointsAt < 0 || i !== pointsAt + 1));
  if (!file) usage();
  let input: unknown;
  try {
    input = JSON.parse(readFileSync(file, "utf8"));
  } catch (e) {
    console.log(
      JSON.stringify(
        { ok: false, errors: [{ kind: "unreadable-input", message: `${file}: ${(e as Error).message}` }] },
        null,
        indent,
      ),
    );
    return 2;
  }
  const out = analyze(input);
  if (!out.ok) {
    console.log(JSON.stringify({ ok: false, errors: out.errors }, null, indent));
    return 1;
  }
  console.log(JSON.stringify({ ok: true, ...(resultToJson(out.result, { points }) as object) }, null, indent));
  return 0;
}

process.exitCode = main(process.argv.slice(2));
