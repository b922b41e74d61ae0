// The verifiable log's half of `npm run bench:audit`: the sealer's rate over a backlog of leaves and the time of a
// full integrity check, on the benchmark database (never the demo's). Runs in the benchmark's own process under
// --conditions=react-server; DATABASE_URL must name the benchmark database before anything from lib/ is imported.

/** Seals every waiting leaf (the load left one per run) and prints leaves per second. */
export async function benchSealer(): Promise<{ leaves: number; seconds: number; perSecond: number }> {
  const { sealAll } = await import("@/lib/jobs/sealer");
  const started = performance.now();
  const heads = await sealAll();
  const seconds = (performance.now() - started) / 1000;
  const leaves = heads.reduce((sum, head) => sum + head.leaves, 0);
  const perSecond = leaves / seconds;
  console.log(
    `  sealer: ${leaves.toLocaleString("en")} leaves under ${heads.length} signed heads in ${seconds.toFixed(1)} s: ` +
      `${Math.round(perSecond).toLocaleString("en")} leaves/s (target ≥ 5,000)`,
  );
  return { leaves, seconds, perSecond };
}

/** The whole integrity check, as the Integrity page and `npm run verify-integrity` run it. */
export async function benchIntegrityCheck(): Promise<{ seconds: number; ok: boolean }> {
  const { checkLogIntegrity } = await import("@/lib/use-cases/integrity-check");
  const { logPublicKeyFromSettings } = await import("@/lib/jobs/log-public-key");
  const { pem, fingerprint } = logPublicKeyFromSettings();
  const started = performance.now();
  const report = await checkLogIntegrity({ publicKeyPem: pem, fingerprint });
  const seconds = (performance.now() - started) / 1000;
  const records = Object.values(report.records).reduce((sum, n) => sum + n, 0);
  console.log(
    `  integrity check: ${records.toLocaleString("en")} records, ${report.leaves.toLocaleString("en")} leaves, ` +
      `${report.nodes.toLocaleString("en")} stored subtrees, ${report.heads} heads in ${seconds.toFixed(1)} s ` +
      `(target ≤ 30 s for 1,000,000): ${report.ok ? "OK" : `${report.problems.length} problem(s), first: ${report.problems[0]?.message}`}`,
  );
  return { seconds, ok: report.ok };
}
