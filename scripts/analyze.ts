/**
 * npm run analyze -- model.json [--units kN,m]          a short report for a person
 * npm run -s analyze -- --json model.json [--points N] [--compact]   the full results as JSON
 * npm run -s analyze -- --schema                          the model's JSON Schema
 *
 * The work is in scripts/lib/engine-report/ (cli.ts has the options and the exit codes); this file reads the
 * model file and writes the streams.
 */
import { readFileSync } from "node:fs";
import { runAnalyze } from "./lib/engine-report/cli";

// npm runs scripts from the package root; INIT_CWD is where the person typed the command, so a relative path
// means what they meant.
const cwd = process.env.INIT_CWD ?? process.cwd();
const outcome = runAnalyze(process.argv.slice(2), { readFile: (file) => readFileSync(file, "utf8"), cwd });
process.stdout.write(outcome.stdout);
process.stderr.write(outcome.stderr);
process.exitCode = outcome.code;
