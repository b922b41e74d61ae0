/**
 * npm run verify-integrity — the log's integrity check from the command line: recomputes the Merkle tree from the
 * stored records, checks every tree head's signature and consistency, and names the first record that no longer
 * matches (lib/use-cases/integrity-check.ts). Exits 0 when everything matches, 1 when something does not, 2 when it
 * could not run. Reads DATABASE_URL and the log's public key from the environment, else from .env.local (`npm start`
 * writes it).
 *
 *   --public-key <file>   check the heads against this PEM public key (one kept apart from the server) instead
 *   --json                print the report as JSON
 */
import fs from "node:fs";
import { createPublicKey } from "node:crypto";
import { loadEnvLocalDefaults } from "./lib/env.mjs";

loadEnvLocalDefaults();
const args = process.argv.slice(2);
const json = args.includes("--json");
const keyFile = args.includes("--public-key") ? args[args.indexOf("--public-key") + 1] : undefined;

const { checkLogIntegrity } = await import("@/lib/use-cases/integrity-check");
const { logPublicKeyFromSettings } = await import("@/lib/jobs/log-public-key");
const { publicKeyFingerprint } = await import("@/lib/integrity/tree-head");
const { pool } = await import("@/db");

try {
  const key = keyFile
    ? (() => {
        const pem = createPublicKey(fs.readFileSync(keyFile, "utf8")).export({ type: "spki", format: "pem" }).toString();
        return { pem, fingerprint: publicKeyFingerprint(pem) };
      })()
    : logPublicKeyFromSettings();
  const report = await checkLogIntegrity({ publicKeyPem: key.pem, fingerprint: key.fingerprint });
  if (json) {
    console.log(JSON.stringify(report, null, 2));
  } else {
    const records = Object.entries(report.records)
      .map(([kind, n]) => `${n} ${kind}`)
      .join(", ");
    console.log(`Gusset integrity check, ${report.checkedAt}`);
    console.log(`  public key   sha256:${key.fingerprint}`);
    console.log(`  leaves       ${report.leaves} sealed, ${report.pending.count} waiting for the sealer`);
    console.log(`  records      ${records}`);
    console.log(`  tree heads   ${report.heads}, ${report.nodes} stored subtrees`);
    if (report.latestHead) {
      console.log(
        `  latest head  size ${report.latestHead.size}, root ${report.latestHead.rootHash}, ${report.latestHead.sealedAt}`,
      );
    }
    console.log(`  took         ${(report.durationMs / 1000).toFixed(1)} s`);
    if (report.ok) {
      console.log(
        "OK: every record matches its leaf, the tree matches every signed head, and every head extends the one before.",
      );
    } else {
      console.log(`NOT OK: ${report.problems.length}${report.problems.length === 50 ? " or more" : ""} problem(s). The first:`);
      for (const problem of report.problems.slice(0, 20)) {
        const where = problem.leafIndex === null ? "not in the tree" : `leaf ${problem.leafIndex}`;
        console.log(`  - [${where}] ${problem.message}`);
      }
    }
  }
  process.exitCode = report.ok ? 0 : 1;
} catch (error) {
  console.error(`verify-integrity: could not run: ${error instanceof Error ? error.message : String(error)}`);
  process.exitCode = 2;
} finally {
  await pool.end();
}
