import "server-only";
// The released evaluation bundles — the very file the run page's Web Worker and the server's worker threads load —
// kept in object storage under their sha256, so that a stored run can be evaluated again with the bytes that made it
// ("as issued"), long after the server has moved on to another release. The server's own bundle is stored the first
// time it is needed (a run is stored, a reproduction is asked for), then remembered for the life of the process. An
// object already under the key is left as it is: the key is the content's hash, so correct bytes are the only right
// content, and wrong bytes must be found by the reproduction that reads them (it checks them), not quietly repaired.
import { evaluationPool } from "@/lib/evaluation/pool";
import { sha256Hex } from "@/lib/evaluation/archived-bundle";
import { getObject, objectExists, putObject } from "@/lib/storage/s3";

export const evaluationBundleKey = (sha256: string) => `evaluation-bundles/${sha256}.js`;

const KEPT = Symbol.for("gusset.keptEvaluationBundles");

/** Stores the server's current bundle under its sha256 unless it is there already; once per process. */
export async function keepCurrentEvaluationBundle(): Promise<{ sha256: string }> {
  const pool = evaluationPool();
  const { sha256 } = pool.bundle();
  const holder = globalThis as { [KEPT]?: Map<string, Promise<void>> };
  const kept = (holder[KEPT] ??= new Map());
  let done = kept.get(sha256);
  if (!done) {
    done = (async () => {
      const key = evaluationBundleKey(sha256);
      if (await objectExists({ key })) return;
      const bytes = await pool.bundleBytes();
      if (sha256Hex(bytes) !== sha256) throw new Error("the evaluation bundle changed on disk while it was being kept");
      await putObject({ key, body: bytes, contentType: "text/javascript" });
    })();
    kept.set(sha256, done);
    // A failure (storage unreachable) is not remembered: the next need tries again.
    done.catch(() => kept.delete(sha256));
  }
  await done;
  return { sha256 };
}

/** A kept bundle's bytes as stored (unchecked: the caller compares them with the sha256); null when none is kept. */
export async function readKeptEvaluationBundle(sha256: string): Promise<Uint8Array | null> {
  return (await getObject({ key: evaluationBundleKey(sha256) }))?.body ?? null;
}
