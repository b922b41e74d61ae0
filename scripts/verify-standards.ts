/**
 * npm run verify-standards — runs every verification case of every starting standard (content/standards) on
 * the current engine and prints each case with its source; exits 1 if any version does not compile or any
 * case fails, so an engine change that breaks a published standard is seen before it lands.
 * The firm's own published versions (in the database) join this list when standards are stored there.
 */
import { compileStandard } from "../lib/standards";
import { runVerification } from "../lib/standards/verify";
import { engineIdentityLabel } from "../lib/engine";
import { startingStandardFiles } from "./lib/starting-standards";

let failed = 0;
let cases = 0;
console.log(`Verifying the starting standards on ${engineIdentityLabel()}`);
for (const { file, source } of startingStandardFiles()) {
  const compiled = compileStandard(source);
  if (!compiled.ok) {
    failed++;
    console.log(`\n✗ ${file}: does not compile`);
    for (const p of compiled.problems) console.log(`    line ${p.line ?? "?"}: ${p.path ? `${p.path}: ` : ""}${p.message}`);
    continue;
  }
  console.log(`\n${file} — ${compiled.standard.definition.title}`);
  for (const r of runVerification(compiled.standard)) {
    cases++;
    if (!r.pass) failed++;
    console.log(`  ${r.pass ? "✓" : "✗"} ${r.name}`);
    console.log(`      source: ${r.source}`);
    if (r.failure) console.log(`      could not evaluate: ${r.failure}`);
    for (const c of r.checks) {
      const error = c.relativeError === null ? "—" : c.relativeError.toExponential(1);
      console.log(
        `      ${c.pass ? "ok  " : "FAIL"} ${c.target}: relative error ${error} (tolerance ${c.tolerance})${c.message ? ` — ${c.message}` : ""}`,
      );
    }
  }
}
console.log(`\n${cases} cases, ${failed === 0 ? "all passed" : `${failed} failed`}.`);
process.exit(failed === 0 ? 0 : 1);
