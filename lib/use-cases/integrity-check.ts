import "server-only";
// The integrity check: recomputes the log from the stored records and names the first thing that no longer matches.
//  1. every evidence row still hashes to the sha256 its leaf sealed, and every such row has a leaf (in the database,
//     on a snapshot shared with step 2: lib/data/log-check.ts);
//  2. every sealed leaf's entry is well formed and hashes to its stored leaf hash; the positions run 0, 1, 2, … with
//     no gap; the tree is rebuilt from the leaves (Frontier), every stored perfect subtree (what proofs are served
//     from) equals the rebuilt one, and every tree head's root equals the rebuilt root at its size;
//  3. every head is signed by the log's key, and each head is consistent with the one before (RFC 9162 proof).
// Used by the integrity page (as an auditor) and `npm run verify-integrity`.
import { withLogSnapshot, type RecordProblem, type StoredLeaf } from "@/lib/data/log-check";
import type { TreeHeadDto } from "@/lib/data/log";
import type { LogLeafKind } from "@/db/schema";
import { Frontier } from "@/lib/integrity/frontier";
import { consistencyProof, leafHash, toHex, verifyConsistency, hashFromHex } from "@/lib/integrity/merkle";
import { subtreeFromStore } from "@/lib/integrity/stored-tree";
import { LEAF_KINDS, verifyTreeHead } from "@/lib/integrity/tree-head";

export type IntegrityProblem = {
  /** Where it is in the log (null for a row that has no sealed leaf). */
  leafIndex: number | null;
  what: "record" | "unlogged" | "leaf" | "position" | "node" | "head" | "signature";
  kind?: string;
  ref?: string;
  message: string;
};

export type IntegrityReport = {
  ok: boolean;
  checkedAt: string;
  durationMs: number;
  leaves: number;
  heads: number;
  nodes: number;
  records: Record<LogLeafKind, number>;
  /** Leaves not yet folded into a head (the sealer runs every few seconds): not a fault unless they grow old. */
  pending: { count: number; oldest: string | null };
  latestHead: TreeHeadDto | null;
  /** The first problem in log order, then the rest (at most 50). */
  problems: IntegrityProblem[];
};

const MAX_PROBLEMS = 50;
const ENTRY =
  /^\{"at":"(\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z)","kind":"([a-z-]+)","ref":"([0-9A-Za-z-]+)","sha256":"([0-9a-f]{64})"\}$/;
const KINDS = new Set<string>(LEAF_KINDS);

const RECORD_MESSAGES: Record<RecordProblem["problem"], string> = {
  missing: "the sealed row is gone",
  altered: "the row no longer hashes to the sha256 its leaf sealed: it was changed after it was written",
  time: "the row's time differs from the time its leaf sealed",
};

export async function checkLogIntegrity({
  publicKeyPem,
  fingerprint,
}: {
  publicKeyPem: string;
  fingerprint: string;
}): Promise<IntegrityReport> {
  const started = performance.now();
  const checkedAt = new Date().toISOString();
  return withLogSnapshot(async (snapshot) => {
    const problems: IntegrityProblem[] = [];
    const add = (problem: IntegrityProblem) => problems.push(problem);

    // The database compares records with their leaves while this process rebuilds the tree.
    // (One after another on that connection: a pg client runs one query at a time.)
    const databaseSide = (async () =>
      [
        await snapshot.findRecordProblems(MAX_PROBLEMS),
        await snapshot.findUnloggedRows(MAX_PROBLEMS),
        await snapshot.countRecords(),
      ] as const)();
    const heads = await snapshot.heads();
    const pending = await snapshot.pending();

    for (const head of heads) {
      const signed = head.keyFingerprint === fingerprint && verifyTreeHead(head, head.signature, publicKeyPem);
      if (!signed) {
        add({
          leafIndex: head.size - 1,
          what: "signature",
          message:
            head.keyFingerprint === fingerprint
              ? `the tree head of size ${head.size} does not carry a valid signature of the log's key`
              : `the tree head of size ${head.size} names key ${head.keyFingerprint.slice(0, 16)}…, not the log's key ${fingerprint.slice(0, 16)}…`,
        });
      }
    }

    // Rebuild the tree from the leaves, keeping every perfect subtree level by level (32 bytes each): to compare with the
    // stored ones, and to make the consistency proofs between heads.
    const frontier = new Frontier();
    const levels: Buffer[] = [];
    const levelCounts: number[] = [];
    const keep = (level: number, index: number, hash: Uint8Array) => {
      let buffer = levels[level];
      if (!buffer || buffer.length < (index + 1) * 32) {
        const grown = Buffer.alloc(Math.max(64 * 32, (index + 1) * 64));
        if (buffer) buffer.copy(grown);
        levels[level] = buffer = grown;
      }
      buffer.set(hash, index * 32);
      levelCounts[level] = index + 1;
    };
    const rootsAt = new Map<number, Uint8Array>();
    const headSizes = new Set(heads.map((head) => head.size));
    let expectedIndex = 0;
    const checkLeaf = (leaf: StoredLeaf) => {
      if (leaf.leafIndex !== expectedIndex) {
        add({
          leafIndex: expectedIndex,
          what: "position",
          message: `no leaf holds index ${expectedIndex} (the next one found is ${leaf.leafIndex})`,
        });
        expectedIndex = leaf.leafIndex;
      }
      const match = ENTRY.exec(leaf.entry);
      const hash = leafHash(Buffer.from(leaf.entry, "utf8"));
      const hashMatches = leaf.leafHash.equals(hash);
      if (!match || !KINDS.has(match[2]) || match[2] !== leaf.kind || match[3] !== leaf.ref) {
        add({
          leafIndex: leaf.leafIndex,
          what: "leaf",
          kind: leaf.kind,
          ref: leaf.ref,
          message: "the leaf's entry is not the canonical entry of its row",
        });
      } else if (!hashMatches) {
        add({
          leafIndex: leaf.leafIndex,
          what: "leaf",
          kind: leaf.kind,
          ref: leaf.ref,
          message: "the leaf's stored hash is not the hash of its entry",
        });
      }
      if (!leaf.node.equals(hash)) {
        add({
          leafIndex: leaf.leafIndex,
          what: "node",
          kind: leaf.kind,
          ref: leaf.ref,
          message: "the tree's stored leaf node differs from the leaf's hash",
        });
      }
      // The tree is rebuilt from the entries themselves: a stored hash that was changed with them changes the root.
      frontier.append(hash, keep);
      expectedIndex += 1;
      if (headSizes.has(frontier.size)) rootsAt.set(frontier.size, frontier.root());
    };
    for await (const batch of snapshot.leaves()) batch.forEach(checkLeaf);

    let nodes = 0;
    for await (const run of snapshot.nodes()) {
      nodes += run.count;
      const rebuilt = levels[run.level];
      const known = levelCounts[run.level] ?? 0;
      if (run.hashes.length !== run.count * 32) {
        // Only with the table's check constraint dropped: the hashes cannot be told apart, so the block is reported.
        add({
          leafIndex: run.first * 2 ** run.level,
          what: "node",
          message: `a stored subtree at level ${run.level}, from index ${run.first}, is not a 32-byte hash`,
        });
        continue;
      }
      // A run without a gap is compared in one piece; only a run that differs is looked at subtree by subtree.
      if (!run.idx && rebuilt && run.first + run.count <= known) {
        if (rebuilt.subarray(run.first * 32, (run.first + run.count) * 32).equals(run.hashes)) continue;
      }
      for (let k = 0; k < run.count; k++) {
        const idx = run.idx ? run.idx[k] : run.first + k;
        if (
          !rebuilt ||
          idx >= known ||
          !rebuilt.subarray(idx * 32, idx * 32 + 32).equals(run.hashes.subarray(k * 32, k * 32 + 32))
        ) {
          add({
            leafIndex: idx * 2 ** run.level,
            what: "node",
            message: `the stored subtree at level ${run.level}, index ${idx} (served in proofs) differs from the one rebuilt from the leaves`,
          });
        }
      }
    }
    const rebuiltNodes = levelCounts.slice(1).reduce((sum, count) => sum + (count ?? 0), 0);
    if (nodes < rebuiltNodes) {
      add({ leafIndex: null, what: "node", message: `${rebuiltNodes - nodes} of the tree's stored subtrees are missing` });
    }

    let previous: TreeHeadDto | null = null;
    for (const head of heads) {
      const root = rootsAt.get(head.size);
      if (!root || toHex(root) !== head.rootHash) {
        add({
          leafIndex: head.size - 1,
          what: "head",
          message: root
            ? `the tree head of size ${head.size} has root ${head.rootHash.slice(0, 16)}…; the leaves give ${toHex(root).slice(0, 16)}…`
            : `the tree head of size ${head.size} is larger than the ${frontier.size} sealed leaves`,
        });
      } else if (previous && rootsAt.has(previous.size)) {
        const lookup = (level: number, index: number) =>
          index < (levelCounts[level] ?? 0) ? new Uint8Array(levels[level].subarray(index * 32, index * 32 + 32)) : undefined;
        const proof = consistencyProof(previous.size, head.size, (start, end) => subtreeFromStore(start, end, lookup));
        if (!verifyConsistency(previous.size, head.size, hashFromHex(previous.rootHash), hashFromHex(head.rootHash), proof)) {
          add({
            leafIndex: head.size - 1,
            what: "head",
            message: `the tree head of size ${head.size} is not consistent with the head of size ${previous.size}`,
          });
        }
      }
      previous = head;
    }

    const [recordProblems, unlogged, records] = await databaseSide;
    for (const problem of recordProblems) {
      add({
        leafIndex: problem.leafIndex,
        what: "record",
        kind: problem.kind,
        ref: problem.ref,
        message: `${problem.kind} ${problem.ref}: ${RECORD_MESSAGES[problem.problem]}`,
      });
    }
    for (const row of unlogged) {
      add({
        leafIndex: null,
        what: "unlogged",
        kind: row.kind,
        ref: row.ref,
        message: `${row.kind} ${row.ref} has no leaf in the log`,
      });
    }

    problems.sort((a, b) => (a.leafIndex ?? Number.MAX_SAFE_INTEGER) - (b.leafIndex ?? Number.MAX_SAFE_INTEGER));
    return {
      ok: problems.length === 0,
      checkedAt,
      durationMs: Math.round(performance.now() - started),
      leaves: frontier.size,
      heads: heads.length,
      nodes,
      records,
      pending,
      latestHead: heads.at(-1) ?? null,
      problems: problems.slice(0, MAX_PROBLEMS),
    };
  });
}
