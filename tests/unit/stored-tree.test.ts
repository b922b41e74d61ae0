// Proofs served from stored perfect subtrees (lib/integrity/stored-tree.ts) against the same proofs computed from
// every leaf (lib/integrity/merkle.ts, itself checked against RFC 9162's definitions and published vectors in
// merkle.test.ts), for every tree size up to 130 and a sample of indices: a brute-force recomputation.
import { describe, expect, it } from "vitest";
import { Frontier } from "@/lib/integrity/frontier";
import {
  consistencyProof,
  consistencyProofRanges,
  inclusionProof,
  inclusionProofRanges,
  leafHash,
  nodeHash,
  rootHashFromLeafHashes,
  toHex,
} from "@/lib/integrity/merkle";
import { nodesForRanges, perfectPieces, subtreeFromStore } from "@/lib/integrity/stored-tree";

const MAX = 130;
const leaves = Array.from({ length: MAX }, (_, i) => leafHash(new TextEncoder().encode(`leaf ${i}`)));

/** The nodes a sealer would store while appending the first `n` leaves. */
function storedNodes(n: number): Map<string, Uint8Array> {
  const store = new Map<string, Uint8Array>();
  const frontier = new Frontier();
  for (let i = 0; i < n; i++) frontier.append(leaves[i], (level, index, hash) => store.set(`${level}/${index}`, hash));
  return store;
}

const hex = (hashes: Uint8Array[]) => hashes.map(toHex);

describe("Frontier's perfect subtrees", () => {
  it("are exactly the aligned power-of-two ranges, each with its MTH: 2n − popcount(n) nodes for n leaves", () => {
    for (const n of [1, 2, 3, 7, 8, 13, 64, 100, MAX]) {
      const store = storedNodes(n);
      const popcount = n.toString(2).replaceAll("0", "").length;
      expect(store.size).toBe(2 * n - popcount);
      for (const [key, hash] of store) {
        const [level, index] = key.split("/").map(Number);
        const start = index * 2 ** level;
        expect(start + 2 ** level).toBeLessThanOrEqual(n);
        expect(toHex(hash)).toBe(toHex(rootHashFromLeafHashes(leaves.slice(start, start + 2 ** level))));
      }
    }
  });

  it("reports a node once, when its last leaf arrives (level 0 is the leaf itself)", () => {
    const heard: string[] = [];
    const frontier = new Frontier();
    for (let i = 0; i < 4; i++) frontier.append(leaves[i], (level, index) => heard.push(`${level}/${index}`));
    expect(heard).toEqual(["0/0", "0/1", "1/0", "0/2", "0/3", "1/1", "2/0"]);
    expect(toHex(nodeHash(nodeHash(leaves[0], leaves[1]), nodeHash(leaves[2], leaves[3])))).toBe(toHex(frontier.root()));
  });
});

describe("proofs from stored perfect subtrees", () => {
  it("equal the proofs computed from every leaf, for every size up to 130", () => {
    for (let n = 1; n <= MAX; n++) {
      const store = storedNodes(n);
      const lookup = (level: number, index: number) => store.get(`${level}/${index}`);
      const indices = new Set([0, n - 1, Math.floor(n / 2), Math.floor(n / 3), Math.floor(n * 0.7)]);
      for (const m of indices) {
        const stored = inclusionProofRanges(m, n).map(({ start, end }) => subtreeFromStore(start, end, lookup));
        expect(hex(stored), `inclusion of ${m} in ${n}`).toEqual(hex(inclusionProof(m, n, leaves)));
      }
      for (const old of new Set([1, Math.floor(n / 2), n - 1, n].filter((s) => s >= 1))) {
        const stored = consistencyProofRanges(old, n).map(({ start, end }) => subtreeFromStore(start, end, lookup));
        expect(hex(stored), `consistency ${old} → ${n}`).toEqual(hex(consistencyProof(old, n, leaves)));
      }
      expect(toHex(subtreeFromStore(0, n, lookup))).toBe(toHex(rootHashFromLeafHashes(leaves.slice(0, n))));
    }
  });

  it("read only a few nodes: at most (log₂ n)² for any proof of a 1,000,000-leaf tree", () => {
    const n = 1_000_000;
    for (const m of [0, 1, 524_287, 524_288, 999_999]) {
      const needed = nodesForRanges(inclusionProofRanges(m, n)).length;
      expect(needed).toBeLessThanOrEqual(Math.ceil(Math.log2(n)) ** 2);
      expect(needed).toBeGreaterThanOrEqual(inclusionProofRanges(m, n).length);
    }
  });

  it("name the node that is missing rather than return a wrong hash", () => {
    const store = storedNodes(6);
    store.delete("1/2");
    expect(() => subtreeFromStore(0, 6, (l, i) => store.get(`${l}/${i}`))).toThrow(/level 1, index 2 is missing/);
  });

  it("split a range the way MTH does", () => {
    expect(perfectPieces(0, 7)).toEqual([
      { level: 2, index: 0 },
      { level: 1, index: 2 },
      { level: 0, index: 6 },
    ]);
    expect(perfectPieces(8, 16)).toEqual([{ level: 3, index: 1 }]);
    expect(() => perfectPieces(3, 3)).toThrow(/not a non-empty range/);
  });
});
