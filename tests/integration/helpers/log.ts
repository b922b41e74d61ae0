// Waiting for the verifiable log's sealer in a test: seal now, and again until the record is under a head (the
// worker's own sealer may hold the lock for a moment). Returns the first head's size that holds it.
import type { LogLeafKind } from "@/db/schema";
import { getFirstHeadCovering, getLeaf } from "@/lib/data/log";
import { sealAll } from "@/lib/jobs/sealer";

export async function sealedInLog(kind: LogLeafKind, ref: string): Promise<number> {
  const deadline = Date.now() + 15_000;
  for (;;) {
    await sealAll();
    const leaf = await getLeaf(kind, ref);
    const head = leaf?.leafIndex == null ? null : await getFirstHeadCovering(leaf.leafIndex);
    if (head) return head.size;
    if (Date.now() > deadline) throw new Error(`${kind} ${ref} was not sealed within 15 s`);
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
}
