/**
 * npm run verify-standards — runs every verification case of every starting standard (content/standards) on
 * the current engine and prints each case with its source; exits 1 if any version does not compile or any
 * case fails, so an engine change that breaks a published standard is seen before it lands.
 *
 *   --live        also the firm's live versions in the database (DATABASE_URL): published or superseded,
 *                 not withdrawn — what engineers can still run
 *   --live-only   only those (`npm start` runs this and warns about a failure without stopping)
 */
import pg from "pg";
import { compileStandard } from "../lib/standards";
import { runVerification } from "../lib/standards/verify";
import { engineIdentityLabel } from "../lib/engine";
import { startingStandardFiles } from "./lib/starting-standards";

const liveOnly = process.argv.includes("--live-only");
const live = liveOnly || process.argv.includes("--live");

/** The firm's versions that can still be run, newest first within each standard. */
async function liveVersions(): Promise<{ file: string; source: string }[]> {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("--live needs DATABASE_URL (the app's database)");
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    const { rows } = await client.query<{ slug: string; number: number; source: string }>(
      `select s.slug, v.number, v.source from standard_versions v join standards s on s.id = v.standard_id
        where not exists (select 1 from standard_version_events e where e.version_id = v.id and e.kind = 'withdrawn')
        order by s.slug, v.number desc`,
    );
    return rows.map((row) => ({ file: `firm: ${row.slug} v${row.number}`, source: row.source }));
  } finally {
    await client.end();
  }
}

const sources = [...(liveOnly ? [] : startingStandardFiles()), ...(live ? await liveVersions() : [])];
let failed = 0;
let cases = 0;
console.log(
  `Verifying ${liveOnly ? "the firm's live versions" : live ? "the starting standards and the firm's live versions" : "the starting standards"} on ${engineIdentityLabel()}`,
);
for (const { file, source } of sources) {
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
