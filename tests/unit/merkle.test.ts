// Merkle trees of RFC 9162 (Certificate Transparency v2) §2.1: lib/integrity/merkle.ts and frontier.ts. The published
// vectors are checked twice, against the module and against `reference` below, a literal restatement of the RFC's
// MTH, PATH and PROOF definitions hashing with node:crypto directly, so a misremembered vector or a shared mistake shows.
import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import {
  consistencyProof,
  consistencyProofRanges,
  createSubtreeHasher,
  emptyTreeHash,
  fromHex,
  hashFromHex,
  inclusionProof,
  inclusionProofRanges,
  leafHash,
  nodeHash,
  rootHash,
  rootHashFromLeafHashes,
  toHex,
  verifyConsistency,
  verifyInclusion,
} from "@/lib/integrity/merkle";
import { Frontier } from "@/lib/integrity/frontier";
import { CONSISTENCY, EMPTY_ROOT, INCLUSION, LEAF_INPUTS, ROOTS } from "@/tests/support/ct-merkle-vectors";

/** RFC 9162 §2.1.1-2.1.4 written out naively (every MTH recomputed from the leaves), for small trees only. */
const reference = {
  sha256: (...parts: Uint8Array[]) => {
    const h = createHash("sha256");
    for (const part of parts) h.update(part);
    return new Uint8Array(h.digest());
  },
  leaf: (entry: Uint8Array) => reference.sha256(Uint8Array.of(0), entry),
  /** MTH over leaf hashes. */
  mth(leaves: Uint8Array[]): Uint8Array {
    if (leaves.length === 0) return reference.sha256();
    if (leaves.length === 1) return leaves[0];
    const k = largestPowerOfTwoBelow(leaves.length);
    return reference.sha256(Uint8Array.of(1), reference.mth(leaves.slice(0, k)), reference.mth(leaves.slice(k)));
  },
  path(m: number, leaves: Uint8Array[]): Uint8Array[] {
    if (leaves.length === 1) return [];
    const k = largestPowerOfTwoBelow(leaves.length);
    return m < k
      ? [...reference.path(m, leaves.slice(0, k)), reference.mth(leaves.slice(k))]
      : [...reference.path(m - k, leaves.slice(k)), reference.mth(leaves.slice(0, k))];
  },
  subproof(m: number, leaves: Uint8Array[], b: boolean): Uint8Array[] {
    const n = leaves.length;
    if (m === n) return b ? [] : [reference.mth(leaves)];
    const k = largestPowerOfTwoBelow(n);
    return m <= k
      ? [...reference.subproof(m, leaves.slice(0, k), b), reference.mth(leaves.slice(k))]
      : [...reference.subproof(m - k, leaves.slice(k), false), reference.mth(leaves.slice(0, k))];
  },
};

function largestPowerOfTwoBelow(n: number): number {
  let k = 1;
  while (k * 2 < n) k *= 2;
  return k;
}

const ceilLog2 = (n: number) => Math.ceil(Math.log2(n));

function flipBit(bytes: Uint8Array, bit: number): Uint8Array {
  const copy = bytes.slice();
  copy[Math.floor(bit / 8) % copy.length] ^= 1 << (bit % 8);
  return copy;
}

/** A check that throws (a tampered index past the tree's end) has rejected the proof as surely as `false`. */
function accepts(check: () => boolean): boolean {
  try {
    return check();
  } catch {
    return false;
  }
}

const hexes = (hashes: Uint8Array[]) => hashes.map(toHex);

describe("the CT reference vectors", () => {
  const entries = LEAF_INPUTS.map(fromHex);
  const leaves = entries.map(leafHash);
  const referenceLeaves = entries.map(reference.leaf);

  it("hashes leaves and nodes with their own prefixes, as the RFC restated literally does", () => {
    expect(hexes(leaves)).toEqual(hexes(referenceLeaves));
    expect(toHex(nodeHash(leaves[0], leaves[1]))).toBe(toHex(reference.sha256(Uint8Array.of(1), leaves[0], leaves[1])));
  });

  it("gives the empty tree SHA-256 of nothing", () => {
    expect(toHex(reference.mth([]))).toBe(EMPTY_ROOT);
    expect(toHex(rootHash([]))).toBe(EMPTY_ROOT);
    expect(toHex(rootHashFromLeafHashes([]))).toBe(EMPTY_ROOT);
    expect(toHex(emptyTreeHash())).toBe(EMPTY_ROOT);
  });

  it.each(ROOTS.map((root, i) => [i + 1, root] as const))("gives the tree of %i leaves its published root", (size, root) => {
    expect(toHex(reference.mth(referenceLeaves.slice(0, size)))).toBe(root);
    expect(toHex(rootHash(entries.slice(0, size)))).toBe(root);
    expect(toHex(rootHashFromLeafHashes(leaves.slice(0, size)))).toBe(root);
  });

  it.each(INCLUSION)("gives leaf $index of $size its published inclusion proof, which verifies", ({ index, size, proof }) => {
    expect(hexes(reference.path(index, referenceLeaves.slice(0, size)))).toEqual(proof);
    expect(hexes(inclusionProof(index, size, leaves))).toEqual(proof);
    expect(verifyInclusion(index, size, leaves[index], proof.map(fromHex), fromHex(ROOTS[size - 1]))).toBe(true);
  });

  it.each(CONSISTENCY)(
    "gives $oldSize → $newSize its published consistency proof, which verifies",
    ({ oldSize, newSize, proof }) => {
      const [oldRoot, newRoot] = [fromHex(ROOTS[oldSize - 1]), fromHex(ROOTS[newSize - 1])];
      const expected = oldSize === newSize ? [] : reference.subproof(oldSize, referenceLeaves.slice(0, newSize), true);
      expect(hexes(expected)).toEqual(proof);
      expect(hexes(consistencyProof(oldSize, newSize, leaves))).toEqual(proof);
      expect(verifyConsistency(oldSize, newSize, oldRoot, newRoot, proof.map(fromHex))).toBe(true);
    },
  );
});

// Brute force over every tree up to these sizes, on leaves of 300 distinct entries. Every proof is generated and
// verified. Every tampering (each proof element, the index, the leaf, the root, the proof's length) is tried on every
// proof of the trees up to ALL_TAMPERINGS_UP_TO leaves; past that, every third proof gets one tampering, the kinds
// taken in turn. All of them on every proof would be O(n log² n) hashes per tree, about 1.7 million for the
// inclusion proofs alone: far past the few seconds this file may take on a busy 2-core machine.
const MAX_LEAVES = 300;
const INCLUSION_UP_TO = 200;
const CONSISTENCY_UP_TO = 130;
const ALL_TAMPERINGS_UP_TO = 32;
const REFERENCE_UP_TO = 32;

const bruteLeaves = Array.from({ length: MAX_LEAVES }, (_, i) => leafHash(new TextEncoder().encode(`audit event ${i}`)));
const bruteHasher = createSubtreeHasher(bruteLeaves);
// The module keeps perfect subtrees only; the test also keeps the trees' right edges, which every proof of one
// tree size asks for again, so that the brute force spends its time verifying.
const edges = new Map<string, Uint8Array>();
const cachedHasher = (start: number, end: number): Uint8Array => {
  const key = `${start}-${end}`;
  const known = edges.get(key) ?? bruteHasher(start, end);
  edges.set(key, known);
  return known;
};
const bruteRoots = Array.from({ length: MAX_LEAVES + 1 }, (_, n) => (n === 0 ? emptyTreeHash() : bruteHasher(0, n)));

type Tampering = [what: string, check: () => boolean];

/** The tamperings to try on one proof: all of them in small trees, else one kind in turn on every third proof. */
function chosen(n: number, turn: number, tamperings: Tampering[]): Tampering[] {
  if (n <= ALL_TAMPERINGS_UP_TO) return tamperings;
  return turn % 3 === 0 ? [tamperings[(turn / 3) % tamperings.length]] : [];
}

describe("brute force over every small tree", () => {
  it("createSubtreeHasher gives the roots of the RFC restated literally", () => {
    const wrong: number[] = [];
    for (let n = 1; n <= 2 * REFERENCE_UP_TO; n++) {
      if (toHex(bruteRoots[n]) !== toHex(reference.mth(bruteLeaves.slice(0, n)))) wrong.push(n);
    }
    expect(wrong).toEqual([]);
  });

  it("every leaf's inclusion proof verifies, has at most ⌈log2 n⌉ hashes, and fails once tampered with", () => {
    const failures: string[] = [];
    for (let n = 1; n <= INCLUSION_UP_TO; n++) {
      const root = bruteRoots[n];
      for (let i = 0; i < n; i++) {
        const leaf = bruteLeaves[i];
        const proof = inclusionProof(i, n, cachedHasher);
        const at = `leaf ${i} of ${n}`;
        // RFC 9162 §2.1.3.1: PATH splits the tree at most ⌈log2 n⌉ times; the leftmost leaf needs every split.
        if (proof.length > ceilLog2(n) || (i === 0 && proof.length !== ceilLog2(n)))
          failures.push(`${at}: ${proof.length} hashes`);
        if (n <= REFERENCE_UP_TO && hexes(proof).join() !== hexes(reference.path(i, bruteLeaves.slice(0, n))).join()) {
          failures.push(`${at}: not the reference PATH`);
        }
        if (!verifyInclusion(i, n, leaf, proof, root)) failures.push(`${at}: does not verify`);
        const tamperings: Tampering[] = [
          ...proof.map((p, j): Tampering => [
            `proof[${j}] flipped`,
            () => verifyInclusion(i, n, leaf, proof.with(j, flipBit(p, i + j)), root),
          ]),
          ["index flipped", () => verifyInclusion(i ^ 1, n, leaf, proof, root)],
          ["leaf flipped", () => verifyInclusion(i, n, flipBit(leaf, i), proof, root)],
          ["root flipped", () => verifyInclusion(i, n, leaf, proof, flipBit(root, i))],
          ["an extra hash", () => verifyInclusion(i, n, leaf, [...proof, root], root)],
          ["a hash left out", () => proof.length > 0 && verifyInclusion(i, n, leaf, proof.slice(1), root)],
          ["the size doubled", () => verifyInclusion(i, 2 * n, leaf, proof, root)],
        ];
        for (const [what, check] of chosen(n, i, tamperings)) if (accepts(check)) failures.push(`${at}: accepted with ${what}`);
      }
    }
    expect(failures).toEqual([]);
  });

  it("every consistency proof verifies, has at most ⌈log2 n⌉ + 1 hashes, and fails once tampered with", () => {
    const failures: string[] = [];
    for (let n = 1; n <= CONSISTENCY_UP_TO; n++) {
      for (let m = 1; m <= n; m++) {
        const [oldRoot, newRoot] = [bruteRoots[m], bruteRoots[n]];
        const proof = consistencyProof(m, n, cachedHasher);
        const at = `${m} → ${n}`;
        // RFC 9162 §2.1.4.1: PROOF has at most ⌈log2 n⌉ + 1 hashes (from memory), none when the sizes are equal.
        if (proof.length > ceilLog2(n) + 1 || (m === n && proof.length !== 0)) failures.push(`${at}: ${proof.length} hashes`);
        if (n <= REFERENCE_UP_TO && m < n) {
          if (hexes(proof).join() !== hexes(reference.subproof(m, bruteLeaves.slice(0, n), true)).join()) {
            failures.push(`${at}: not the reference PROOF`);
          }
        }
        if (!verifyConsistency(m, n, oldRoot, newRoot, proof)) failures.push(`${at}: does not verify`);
        if (m === n) continue;
        // Not "new size + 1": the proof's subtrees are opaque, so it may fit a tree one leaf larger with the same
        // root; the size is pinned by being signed with the root (see the note in merkle.ts).
        const tamperings: Tampering[] = [
          ...proof.map((p, j): Tampering => [
            `proof[${j}] flipped`,
            () => verifyConsistency(m, n, oldRoot, newRoot, proof.with(j, flipBit(p, m + j))),
          ]),
          ["old root flipped", () => verifyConsistency(m, n, flipBit(oldRoot, m), newRoot, proof)],
          ["new root flipped", () => verifyConsistency(m, n, oldRoot, flipBit(newRoot, n), proof)],
          ["roots swapped", () => verifyConsistency(m, n, newRoot, oldRoot, proof)],
          ["old size flipped", () => verifyConsistency(m ^ 1, n, oldRoot, newRoot, proof)],
          ["new size doubled", () => verifyConsistency(m, 2 * n, oldRoot, newRoot, proof)],
          ["a hash left out", () => verifyConsistency(m, n, oldRoot, newRoot, proof.slice(0, -1))],
          ["an extra hash", () => verifyConsistency(m, n, oldRoot, newRoot, [...proof, newRoot])],
        ];
        for (const [what, check] of chosen(n, m, tamperings)) if (accepts(check)) failures.push(`${at}: accepted with ${what}`);
      }
    }
    expect(failures).toEqual([]);
  });

  it("the empty tree is consistent with every tree, with an empty proof and the empty tree's root", () => {
    for (const n of [0, 1, 2, 7, 8, 300]) {
      expect(consistencyProof(0, n, bruteLeaves)).toEqual([]);
      expect(verifyConsistency(0, n, emptyTreeHash(), bruteRoots[n], [])).toBe(true);
      expect(verifyConsistency(0, n, bruteRoots[1], bruteRoots[n], [])).toBe(false);
      expect(verifyConsistency(0, n, emptyTreeHash(), bruteRoots[n], [bruteRoots[1]])).toBe(false);
    }
    expect(verifyConsistency(5, 5, bruteRoots[5], bruteRoots[6], [])).toBe(false);
  });

  it("proof ranges depend on the sizes alone, so a caller can fetch just those subtrees", () => {
    const fetched: string[] = [];
    const lazy = (start: number, end: number) => {
      fetched.push(`${start}-${end}`);
      return rootHashFromLeafHashes(bruteLeaves.slice(start, end));
    };
    expect(hexes(inclusionProof(5, 300, lazy))).toEqual(hexes(inclusionProof(5, 300, bruteLeaves)));
    expect(fetched).toEqual(inclusionProofRanges(5, 300).map(({ start, end }) => `${start}-${end}`));
    expect(hexes(consistencyProof(6, 300, lazy))).toEqual(hexes(consistencyProof(6, 300, bruteLeaves)));
    const growing = bruteLeaves.slice(0, 5);
    const growingHasher = createSubtreeHasher(growing);
    growing.push(bruteLeaves[5]);
    expect(toHex(growingHasher(0, 6))).toBe(toHex(bruteRoots[6]));
    expect(consistencyProofRanges(6, 8)).toEqual([
      { start: 4, end: 6 },
      { start: 6, end: 8 },
      { start: 0, end: 4 },
    ]);
  });
});

describe("Frontier", () => {
  it("has the root of rootHashFromLeafHashes (and of createSubtreeHasher) after every append, up to 300 leaves", () => {
    const frontier = new Frontier();
    const wrong: number[] = [];
    if (toHex(frontier.root()) !== EMPTY_ROOT) wrong.push(0);
    for (let n = 1; n <= MAX_LEAVES; n++) {
      if (frontier.append(bruteLeaves[n - 1]) !== n || frontier.size !== n) wrong.push(n);
      const root = toHex(frontier.root());
      if (root !== toHex(rootHashFromLeafHashes(bruteLeaves.slice(0, n))) || root !== toHex(bruteRoots[n])) wrong.push(n);
    }
    expect(wrong).toEqual([]);
  });

  it("survives a round trip through its stored state mid-way, and goes on to the same roots", () => {
    for (const cut of [0, 1, 6, 7, 64, 127, 200]) {
      const frontier = new Frontier();
      for (let i = 0; i < cut; i++) frontier.append(bruteLeaves[i]);
      const stored = JSON.parse(JSON.stringify(frontier)) as { size: number; hashes: string[] };
      expect(stored.size).toBe(cut);
      expect(stored.hashes.every((h) => /^[0-9a-f]{64}$/.test(h))).toBe(true);
      const restored = Frontier.fromState(stored);
      expect(toHex(restored.root())).toBe(toHex(bruteRoots[cut]));
      for (let i = cut; i < cut + 60; i++) restored.append(bruteLeaves[i]);
      expect(restored.size).toBe(cut + 60);
      expect(toHex(restored.root())).toBe(toHex(bruteRoots[cut + 60]));
    }
  });

  it("refuses a stored state whose hashes do not fit its size", () => {
    const state = new Frontier().toState();
    expect(() => Frontier.fromState({ size: 3, hashes: state.hashes })).toThrow(
      /3 leaves make 2 perfect subtrees, the state lists 0/,
    );
    expect(() => Frontier.fromState({ size: 1, hashes: ["ab"] })).toThrow(/state.hashes\[0\] must be a 32-byte SHA-256 hash/);
    expect(() => Frontier.fromState({ size: 1, hashes: ["zz".repeat(32)] })).toThrow(/hexadecimal/);
    expect(() => Frontier.fromState({ size: -1, hashes: [] })).toThrow(/state.size must be a whole number/);
  });
});

describe("bad input", () => {
  const proof = inclusionProof(2, 8, bruteLeaves);
  it.each([
    [
      "an index at the tree's size",
      () => inclusionProof(8, 8, bruteLeaves),
      /leafIndex 8 is out of range for a tree of 8 leaves/,
    ],
    ["an index in an empty tree", () => inclusionProofRanges(0, 0), /leafIndex 0 is out of range for a tree of 0 leaves/],
    ["a negative index", () => inclusionProof(-1, 8, bruteLeaves), /leafIndex must be a whole number/],
    ["a fractional size", () => inclusionProof(0, 2.5, bruteLeaves), /treeSize must be a whole number/],
    ["fewer leaf hashes than the size", () => inclusionProof(0, 400, bruteLeaves), /needs 400 leaf hashes, 300 given/],
    [
      "verifying past the tree's end",
      () => verifyInclusion(9, 8, bruteLeaves[2], proof, bruteRoots[8]),
      /leafIndex 9 is out of range/,
    ],
    ["oldSize > newSize", () => consistencyProof(9, 8, bruteLeaves), /oldSize 9 is larger than newSize 8/],
    [
      "verifying oldSize > newSize",
      () => verifyConsistency(9, 8, bruteRoots[8], bruteRoots[8], []),
      /oldSize 9 is larger than newSize 8/,
    ],
    [
      "a short leaf hash",
      () => verifyInclusion(2, 8, new Uint8Array(31), proof, bruteRoots[8]),
      /leafHash must be a 32-byte SHA-256 hash.*31 bytes/,
    ],
    [
      "a long root",
      () => verifyInclusion(2, 8, bruteLeaves[2], proof, new Uint8Array(33)),
      /root must be a 32-byte SHA-256 hash.*33 bytes/,
    ],
    [
      "a short proof element",
      () => verifyInclusion(2, 8, bruteLeaves[2], [proof[0].slice(1)], bruteRoots[8]),
      /proof\[0\] must be a 32-byte/,
    ],
    [
      "a short leaf among the leaves",
      () => rootHashFromLeafHashes([bruteLeaves[0], new Uint8Array(3)]),
      /leafHashes\[1\] must be a 32-byte/,
    ],
    [
      "a bad subtree hash from a callback",
      () => inclusionProof(0, 2, () => new Uint8Array(0)),
      /subtree hash of leaves \[1, 2\) must be/,
    ],
    [
      "a hash as a string",
      () => nodeHash("00" as unknown as Uint8Array, bruteLeaves[0]),
      /left must be a 32-byte SHA-256 hash.*string/,
    ],
    ["odd hex", () => fromHex("abc"), /even number of hexadecimal digits/],
    ["a short hash in hex", () => hashFromHex("abcd"), /hash must be a 32-byte SHA-256 hash.*2 bytes/],
    [
      "a range past the leaves",
      () => createSubtreeHasher(bruteLeaves)(0, 301),
      /\[0, 301\) is not a non-empty range of the 300 leaves/,
    ],
  ])("throws a clear error for %s", (_what, call, message) => {
    expect(call).toThrow(message);
  });
});
