import "server-only";
/**
 * A released evaluation bundle run again from its bytes, as kept in object storage by their sha256: what
 * reproduces a stored run "as issued". The bytes are checked against the sha256 they were asked for, written to
 * a folder of their own with a manifest that names them, and loaded by a pool of one worker thread (pool.ts,
 * which checks them against the manifest once more as it loads them); the pool and the folder go when the task
 * is done. The server's own pool and bundle are not touched.
 */
import { createHash } from "node:crypto";
import fs from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { createEvaluationPool, type PoolOutcome } from "./pool";
import type { RunResult } from "./protocol";
import type { LibraryEntries } from "@/lib/standards/library-inputs";

export class BundleBytesMismatchError extends Error {
  constructor(expected: string, actual: string) {
    super(`the bundle's bytes hash to ${actual}, not to ${expected}`);
    this.name = "BundleBytesMismatchError";
  }
}

export const sha256Hex = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");

/**
 * Runs one stored run's evaluation again with the bundle `bytes`, which must hash to `sha256` (else
 * BundleBytesMismatchError, before anything runs). `timeoutMs`: a reproduction is asked for by one person and
 * may take longer than a run's own limit on a busy server; default 30 s.
 */
export async function runWithBundleBytes(
  bytes: Uint8Array,
  sha256: string,
  task: {
    readonly source: string;
    readonly inputs: Readonly<Record<string, string | number>>;
    readonly libraries: LibraryEntries;
  },
  options: { readonly timeoutMs?: number } = {},
): Promise<PoolOutcome<RunResult>> {
  const actual = sha256Hex(bytes);
  if (actual !== sha256) throw new BundleBytesMismatchError(sha256, actual);
  const folder = await fs.mkdtemp(path.join(os.tmpdir(), "gusset-bundle-"));
  const file = `evaluation-${sha256.slice(0, 16)}.js`;
  try {
    await fs.writeFile(path.join(folder, file), bytes);
    // The bundle is an ES module; outside the checkout no package.json says so.
    await fs.writeFile(path.join(folder, "package.json"), '{ "type": "module" }\n');
    const manifest = { file, sha256, bytes: bytes.length, gzipBytes: 0, builtFrom: {} };
    await fs.writeFile(path.join(folder, "manifest.json"), `${JSON.stringify(manifest)}\n`);
    const pool = createEvaluationPool({ bundleDir: folder, size: 1, maxQueue: 0, timeoutMs: options.timeoutMs ?? 30_000 });
    try {
      return await pool.run(task.source, task.inputs, task.libraries);
    } finally {
      await pool.close();
    }
  } finally {
    await fs.rm(folder, { recursive: true, force: true });
  }
}
