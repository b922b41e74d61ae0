import "server-only";
// The sealer: folds the leaves waiting in log_pending into the Merkle tree and signs a new tree head, in batches,
// every few seconds (started by the worker). The leaf's index is given here, not at insert, so a row whose
// transaction commits late is simply sealed in the next batch: nothing is skipped, and writers never wait on a
// lock of the log's. One sealer at a time (an advisory lock); any number of workers may try.
import { getFirmName } from "@/lib/data/firm";
import { getLatestHeadWithFrontier, insertSeal, listPendingLeaves, tryLockSealer } from "@/lib/data/log";
import { runInTransaction } from "@/lib/data/transaction";
import { Frontier } from "@/lib/integrity/frontier";
import { toHex } from "@/lib/integrity/merkle";
import { signTreeHead, treeHeadDigest, treeHeadText, type TreeHead } from "@/lib/integrity/tree-head";
import { renderWitnessMail } from "@/lib/mail/templates";
import { appBaseUrl, serverEnv } from "@/lib/server-env";
import { enqueueJob } from "./enqueue";
import { logPublicKeyFromSettings, logSigningKeyPem } from "./log-keys";

/** Leaves per head: a big backlog (a restore, a batch of re-runs) is sealed as several heads, each transaction short. */
export const SEAL_BATCH = 20_000;

export type SealedHead = TreeHead & { leaves: number; digest: string };

/**
 * Seals one batch of waiting leaves under a new signed head and queues its witness e-mail, in one transaction.
 * Returns null when nothing waits or another sealer holds the lock.
 */
export async function sealOnce({ batch = SEAL_BATCH, now = () => new Date() } = {}): Promise<SealedHead | null> {
  const privateKeyPem = logSigningKeyPem();
  const { fingerprint } = logPublicKeyFromSettings();
  return runInTransaction(async () => {
    if (!(await tryLockSealer())) return null;
    const pending = await listPendingLeaves(batch);
    if (pending.length === 0) return null;
    const last = await getLatestHeadWithFrontier();
    const frontier = last ? Frontier.fromState(last.frontier) : new Frontier();
    const positions: { leafIndex: number; leafId: number }[] = [];
    const nodes: { level: number; index: number; hash: Uint8Array }[] = [];
    const keep = (level: number, index: number, hash: Uint8Array) => nodes.push({ level, index, hash });
    for (const { leafId, leafHash } of pending) {
      positions.push({ leafIndex: frontier.size, leafId });
      frontier.append(new Uint8Array(leafHash), keep);
    }
    const head: TreeHead = { size: frontier.size, rootHash: toHex(frontier.root()), sealedAt: now().toISOString() };
    const signature = signTreeHead(head, privateKeyPem);
    await insertSeal({
      positions,
      nodes,
      head: { ...head, signature, keyFingerprint: fingerprint, frontier: frontier.toState() },
    });
    const digest = treeHeadDigest(head);
    const witness = serverEnv().GUSSET_WITNESS_EMAIL;
    if (witness) {
      await enqueueJob(
        "mail.send",
        renderWitnessMail({
          to: witness,
          firmName: (await getFirmName()) ?? "the firm",
          head: { ...head, signature },
          headText: treeHeadText(head),
          digest,
          keyFingerprint: fingerprint,
          url: `${appBaseUrl()}/audit/integrity`,
        }),
      );
    }
    return { ...head, leaves: pending.length, digest };
  });
}

/** Seals until nothing waits (or another sealer has the lock); returns the heads made. */
export async function sealAll(options: { batch?: number } = {}): Promise<SealedHead[]> {
  const heads: SealedHead[] = [];
  for (;;) {
    const head = await sealOnce(options);
    if (!head) return heads;
    heads.push(head);
  }
}
