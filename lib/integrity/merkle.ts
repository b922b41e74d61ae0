/**
 * Merkle tree hashing and proofs of RFC 9162 (Certificate Transparency v2), section 2.1, with SHA-256.
 *
 * Hashing. A leaf's hash is SHA-256(0x00 || entry bytes); an inner node's is SHA-256(0x01 || left || right),
 * both children being 32-byte hashes. The tree over n entries splits at k, the largest power of two below n:
 * its root is the node hash of the root over the first k entries and the root over the rest. The empty tree's
 * root is SHA-256 of nothing (e3b0c442…b855). The distinct prefixes are what make the tree safe against second
 * preimages: without them the 64 bytes `left || right` of an inner node could be presented as an entry of its
 * own, and a log with different entries would have the same root. With them a leaf hash and a node hash are
 * hashes of different inputs, so passing one off as the other needs a SHA-256 collision.
 *
 * Checking an inclusion proof outside Gusset, with standard tools. You need the entry's bytes (entry.bin),
 * its index and the tree size, the proof (its hashes in hex, in order) and the signed root (hex):
 *
 *   h() { xxd -r -p | sha256sum | cut -d' ' -f1; }         # hex bytes in, SHA-256 in hex out
 *   r=$( { printf '00'; xxd -p entry.bin; } | h )          # the leaf hash: 0x00 || entry
 *   fn=$INDEX; sn=$((SIZE - 1)); ok=1
 *   for p in $PROOF; do
 *     if [ "$sn" -eq 0 ]; then ok=0; break; fi              # more hashes than the tree has levels
 *     if [ $((fn % 2)) -eq 1 ] || [ "$fn" -eq "$sn" ]; then
 *       r=$(printf '01%s%s' "$p" "$r" | h)                  # p is the left sibling: 0x01 || p || r
 *       while [ $((fn % 2)) -eq 0 ] && [ "$fn" -ne 0 ]; do fn=$((fn / 2)); sn=$((sn / 2)); done
 *     else
 *       r=$(printf '01%s%s' "$r" "$p" | h)                  # p is the right sibling: 0x01 || r || p
 *     fi
 *     fn=$((fn / 2)); sn=$((sn / 2))
 *   done
 *   [ "$ok" = 1 ] && [ "$sn" -eq 0 ] && [ "$r" = "$ROOT" ] && echo verified || echo "NOT verified"
 *
 * That is the algorithm of RFC 9162 §2.1.3.2, which `verifyInclusion` below follows step by step; any other
 * RFC 6962 / 9162 verifier (Go's transparency-dev/merkle, for one) accepts the same proofs.
 *
 * A proof's hashes do not pin the tree's size (the subtrees in it are opaque): the size must be the one signed
 * together with the root, as in a CT signed tree head, and never taken from whoever hands over the proof.
 *
 * `Frontier` (frontier.ts beside this file) keeps a growing log's root in O(log n) hashes for a sealer to store.
 *
 * Sizes and indices are JavaScript numbers checked to be whole and safe (below 2^53); the bit tests of the
 * RFC are written as `% 2` and halving so they stay exact past 2^31.
 */
import { hash } from "node:crypto";

/** Bytes in a SHA-256 hash, and so in every hash this module takes or returns. */
export const HASH_BYTES = 32;

/** MTH(D[start:end]) over the log's leaves: a later version may fetch these lazily (see `inclusionProofRanges`). */
export type SubtreeHashFn = (start: number, end: number) => Uint8Array;
/** The leaves a proof is computed from: their leaf hashes in log order, or a function giving any subtree's hash. */
export type LeafHashSource = readonly Uint8Array[] | SubtreeHashFn;
/** The leaves [start, end) whose Merkle tree hash is one element of a proof. */
export interface SubtreeRange {
  readonly start: number;
  readonly end: number;
}

function sha256(bytes: Uint8Array): Uint8Array {
  // The digest as "binary" (latin1) text, one character per byte, copied into a small Uint8Array of its own: about
  // twice as fast as a Buffer digest, whose separately allocated memory the garbage collector then spends its time on.
  const digest = hash("sha256", bytes, "binary");
  const out = new Uint8Array(HASH_BYTES);
  for (let i = 0; i < HASH_BYTES; i++) out[i] = digest.charCodeAt(i);
  return out;
}

const EMPTY_TREE_HASH = sha256(new Uint8Array(0));

/** SHA-256 of the empty string, the root of a tree with no leaves (RFC 9162 §2.1.1). A fresh copy each call. */
export function emptyTreeHash(): Uint8Array {
  return EMPTY_TREE_HASH.slice();
}

/** The leaf hash of an entry: SHA-256(0x00 || bytes). */
export function leafHash(bytes: Uint8Array): Uint8Array {
  if (!(bytes instanceof Uint8Array)) throw new Error(`Merkle leafHash: the entry must be a Uint8Array, got ${describe(bytes)}`);
  const input = new Uint8Array(1 + bytes.length);
  input[0] = 0x00;
  input.set(bytes, 1);
  return sha256(input);
}

/** The hash of an inner node: SHA-256(0x01 || left || right). */
export function nodeHash(left: Uint8Array, right: Uint8Array): Uint8Array {
  return node(hashOrThrow("left", left), hashOrThrow("right", right));
}

// One buffer for every node hash's input: hashing is synchronous, and this is the hot path of every proof.
const nodeInput = new Uint8Array(1 + 2 * HASH_BYTES);
nodeInput[0] = 0x01;

function node(left: Uint8Array, right: Uint8Array): Uint8Array {
  nodeInput.set(left, 1);
  nodeInput.set(right, 1 + HASH_BYTES);
  return sha256(nodeInput);
}

/** MTH over the entries themselves (each is leaf-hashed first). */
export function rootHash(entries: readonly Uint8Array[]): Uint8Array {
  return rootHashFromLeafHashes(entries.map(leafHash));
}

/** MTH over leaf hashes already computed (e.g. stored beside each audit event). O(n) hashes, O(log n) depth. */
export function rootHashFromLeafHashes(leafHashes: readonly Uint8Array[]): Uint8Array {
  if (leafHashes.length === 0) return emptyTreeHash();
  return subtreeOfArray(leafHashes, 0, leafHashes.length);
}

/**
 * The leaves whose subtree hashes make up the inclusion proof of `leafIndex` in a tree of `treeSize` leaves,
 * in proof order (RFC 9162 §2.1.3.1, PATH). The ranges depend on the sizes alone, so a caller whose leaf hashes
 * live in a database can fetch just these subtrees, sync or async, and map each to its hash.
 */
export function inclusionProofRanges(leafIndex: number, treeSize: number): SubtreeRange[] {
  checkIndex(leafIndex, treeSize);
  const ranges: SubtreeRange[] = [];
  let start = 0;
  let end = treeSize;
  // PATH(m, D[n]) = PATH(m, D[0:k]) : MTH(D[k:n]) when m < k, else PATH(m - k, D[k:n]) : MTH(D[0:k]).
  // Walked from the top, so the ranges come out root-first; the proof lists them leaf-first.
  while (end - start > 1) {
    const k = largestPowerOfTwoBelow(end - start);
    if (leafIndex < start + k) {
      ranges.push({ start: start + k, end });
      end = start + k;
    } else {
      ranges.push({ start, end: start + k });
      start += k;
    }
  }
  return ranges.reverse();
}

/**
 * The leaves whose subtree hashes make up the consistency proof from the tree of `oldSize` leaves to the tree of
 * `newSize` (RFC 9162 §2.1.4.1, PROOF and SUBPROOF), in proof order. Empty when oldSize is 0 or equals newSize.
 */
export function consistencyProofRanges(oldSize: number, newSize: number): SubtreeRange[] {
  checkSizes(oldSize, newSize);
  if (oldSize === 0 || oldSize === newSize) return [];
  const ranges: SubtreeRange[] = [];
  let m = oldSize;
  let start = 0;
  let end = newSize;
  let complete = true; // SUBPROOF's b: whether the old tree's root is the subtree at hand, known to the verifier
  for (;;) {
    const n = end - start;
    if (m === n) {
      if (!complete) ranges.push({ start, end });
      break;
    }
    const k = largestPowerOfTwoBelow(n);
    if (m <= k) {
      ranges.push({ start: start + k, end });
      end = start + k;
    } else {
      ranges.push({ start, end: start + k });
      start += k;
      m -= k;
      complete = false;
    }
  }
  return ranges.reverse();
}

/**
 * The inclusion proof (RFC 9162 §2.1.3.1) of `leafIndex` in the tree of the first `treeSize` leaves. With an
 * array of leaf hashes (at least treeSize of them) this hashes every leaf once: O(n). A `SubtreeHashFn` (e.g.
 * `createSubtreeHasher`, which memoises perfect subtrees) is asked once per proof element instead.
 */
export function inclusionProof(leafIndex: number, treeSize: number, leaves: LeafHashSource): Uint8Array[] {
  const ranges = inclusionProofRanges(leafIndex, treeSize);
  const subtree = subtreeSource(leaves, treeSize);
  return ranges.map(({ start, end }) => subtree(start, end));
}

/** The consistency proof (RFC 9162 §2.1.4.1) from `oldSize` to `newSize` leaves; cost as for `inclusionProof`. */
export function consistencyProof(oldSize: number, newSize: number, leaves: LeafHashSource): Uint8Array[] {
  const ranges = consistencyProofRanges(oldSize, newSize);
  const subtree = subtreeSource(leaves, newSize);
  return ranges.map(({ start, end }) => subtree(start, end));
}

/**
 * MTH(D[start:end]) for any range of the leaves, keeping the hash of every perfect subtree (a power-of-two
 * count of leaves) it computes: in an append-only log those never change, so later proofs reuse them and
 * cost O(log² n) hashes. The memory is one 32-byte hash per inner node computed, at most n - 1.
 */
export function createSubtreeHasher(leafHashes: readonly Uint8Array[] | ((index: number) => Uint8Array)): SubtreeHashFn {
  const leafAt = typeof leafHashes === "function" ? leafHashes : (index: number) => leafHashes[index];
  // Read at each call: the caller's array may grow as the log does.
  const limit = () => (typeof leafHashes === "function" ? Number.MAX_SAFE_INTEGER : leafHashes.length);
  const perfect = new Map<string, Uint8Array>();
  const subtree = (start: number, end: number): Uint8Array => {
    const size = end - start;
    if (size === 1) {
      const leaf = leafAt(start);
      return isHash(leaf) ? leaf : hashOrThrow(`leaf hash ${start}`, leaf);
    }
    const key = isPowerOfTwo(size) ? `${start}+${size}` : undefined;
    const known = key === undefined ? undefined : perfect.get(key);
    if (known) return known;
    const k = largestPowerOfTwoBelow(size);
    const result = node(subtree(start, start + k), subtree(start + k, end));
    if (key !== undefined) perfect.set(key, result);
    return result;
  };
  return (start, end) => {
    checkRange(start, end, limit());
    return subtree(start, end).slice();
  };
}

/**
 * Whether `proof` shows the leaf with hash `leafHash` at `leafIndex` in the tree of `treeSize` leaves whose root is
 * `root`: RFC 9162 §2.1.3.2 as written. Throws on arguments that describe no tree (index not below the size, a hash
 * not 32 bytes); returns false when the proof does not prove the claim.
 */
export function verifyInclusion(
  leafIndex: number,
  treeSize: number,
  leafHash: Uint8Array,
  proof: readonly Uint8Array[],
  root: Uint8Array,
): boolean {
  // 1. leaf_index must be below tree_size.
  checkIndex(leafIndex, treeSize);
  hashOrThrow("leafHash", leafHash);
  checkProof(proof);
  hashOrThrow("root", root);
  // 2. fn = leaf_index, sn = tree_size - 1.
  let fn = leafIndex;
  let sn = treeSize - 1;
  // 3. r = hash.
  let r = leafHash;
  // 4. For each p in inclusion_path:
  for (const p of proof) {
    // a. If sn is 0, fail.
    if (sn === 0) return false;
    // b. If LSB(fn) is set, or fn equals sn:
    if (isOdd(fn) || fn === sn) {
      // i. r = HASH(0x01 || p || r)
      r = node(p, r);
      // ii. If LSB(fn) is not set, right-shift fn and sn equally until LSB(fn) is set or fn is 0.
      if (!isOdd(fn)) {
        while (!isOdd(fn) && fn !== 0) {
          fn = half(fn);
          sn = half(sn);
        }
      }
    } else {
      // Otherwise r = HASH(0x01 || r || p).
      r = node(r, p);
    }
    // c. Right-shift fn and sn once.
    fn = half(fn);
    sn = half(sn);
  }
  // 5. sn must be 0 and r must equal root_hash.
  return sn === 0 && equalBytes(r, root);
}

/**
 * Whether `proof` shows that the tree of `newSize` leaves with root `newRoot` extends the tree of `oldSize` leaves
 * with root `oldRoot`. For 0 < oldSize < newSize this is RFC 9162 §2.1.4.2 as written. The RFC leaves out the two
 * trivial cases, handled as its PROOF defines them: the same size needs an empty proof and equal roots; an empty
 * old tree needs an empty proof and the empty tree's hash as its root. Throws on arguments that describe no pair
 * of trees (oldSize > newSize, a hash not 32 bytes); returns false when the proof does not prove the claim.
 */
export function verifyConsistency(
  oldSize: number,
  newSize: number,
  oldRoot: Uint8Array,
  newRoot: Uint8Array,
  proof: readonly Uint8Array[],
): boolean {
  checkSizes(oldSize, newSize);
  hashOrThrow("oldRoot", oldRoot);
  hashOrThrow("newRoot", newRoot);
  checkProof(proof);
  if (oldSize === 0) return proof.length === 0 && equalBytes(oldRoot, EMPTY_TREE_HASH);
  if (oldSize === newSize) return proof.length === 0 && equalBytes(oldRoot, newRoot);
  // 1. An empty consistency_path fails.
  if (proof.length === 0) return false;
  // 2. If first is an exact power of 2, prepend first_hash to the path.
  const path = isPowerOfTwo(oldSize) ? [oldRoot, ...proof] : proof;
  // 3. fn = first - 1, sn = second - 1.
  let fn = oldSize - 1;
  let sn = newSize - 1;
  // 4. If LSB(fn) is set, right-shift fn and sn equally until LSB(fn) is not set.
  while (isOdd(fn)) {
    fn = half(fn);
    sn = half(sn);
  }
  // 5. fr = sr = the path's first value.
  let fr = path[0];
  let sr = path[0];
  // 6. For each subsequent value c in the path:
  for (const c of path.slice(1)) {
    // a. If sn is 0, fail.
    if (sn === 0) return false;
    // b. If LSB(fn) is set, or fn equals sn:
    if (isOdd(fn) || fn === sn) {
      // i., ii. fr = HASH(0x01 || c || fr), sr = HASH(0x01 || c || sr)
      fr = node(c, fr);
      sr = node(c, sr);
      // iii. If LSB(fn) is not set, right-shift fn and sn equally until LSB(fn) is set or fn is 0.
      if (!isOdd(fn)) {
        while (!isOdd(fn) && fn !== 0) {
          fn = half(fn);
          sn = half(sn);
        }
      }
    } else {
      // Otherwise sr = HASH(0x01 || sr || c).
      sr = node(sr, c);
    }
    // c. Right-shift fn and sn once.
    fn = half(fn);
    sn = half(sn);
  }
  // 7. fr must equal first_hash, sr second_hash, and sn must be 0.
  return equalBytes(fr, oldRoot) && equalBytes(sr, newRoot) && sn === 0;
}

export function toHex(bytes: Uint8Array): string {
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString("hex");
}

/** Bytes from hexadecimal (either case, even length); throws on anything else rather than decoding part of it. */
export function fromHex(hex: string): Uint8Array {
  if (typeof hex !== "string" || !/^(?:[0-9a-fA-F]{2})*$/.test(hex)) {
    throw new Error(
      `Merkle fromHex: expected an even number of hexadecimal digits, got ${JSON.stringify(String(hex).slice(0, 80))}`,
    );
  }
  return new Uint8Array(Buffer.from(hex, "hex"));
}

/** A 32-byte hash from its 64 hex digits. */
export function hashFromHex(hex: string, name = "hash"): Uint8Array {
  const bytes = fromHex(hex);
  return hashOrThrow(name, bytes);
}

function subtreeOfArray(leafHashes: readonly Uint8Array[], start: number, end: number): Uint8Array {
  if (end - start === 1)
    return isHash(leafHashes[start]) ? leafHashes[start] : hashOrThrow(`leafHashes[${start}]`, leafHashes[start]);
  const k = largestPowerOfTwoBelow(end - start);
  return node(subtreeOfArray(leafHashes, start, start + k), subtreeOfArray(leafHashes, start + k, end));
}

function subtreeSource(leaves: LeafHashSource, treeSize: number): SubtreeHashFn {
  if (typeof leaves === "function") {
    return (start, end) => {
      const subtree = leaves(start, end);
      return isHash(subtree) ? subtree : hashOrThrow(`the subtree hash of leaves [${start}, ${end})`, subtree);
    };
  }
  if (!Array.isArray(leaves)) throw new Error("Merkle: leaves must be an array of leaf hashes or a subtree hash function");
  if (leaves.length < treeSize) {
    throw new Error(`Merkle: a tree of ${treeSize} leaves needs ${treeSize} leaf hashes, ${leaves.length} given`);
  }
  return (start, end) => subtreeOfArray(leaves, start, end);
}

/** `value` if it is a 32-byte hash, else an Error naming `name` and what it was instead. */
export function hashOrThrow(name: string, value: unknown): Uint8Array {
  if (!isHash(value)) {
    throw new Error(`Merkle: ${name} must be a ${HASH_BYTES}-byte SHA-256 hash (Uint8Array), got ${describe(value)}`);
  }
  return value;
}

function checkProof(proof: readonly Uint8Array[]): void {
  if (!Array.isArray(proof)) throw new Error(`Merkle: the proof must be an array of hashes, got ${describe(proof)}`);
  proof.forEach((element, i) => isHash(element) || hashOrThrow(`proof[${i}]`, element));
}

/** Throws unless `value` is a whole number from 0 to 2^53 - 1 (a tree size or leaf index). */
export function sizeOrThrow(name: string, value: unknown): asserts value is number {
  if (typeof value !== "number" || !Number.isSafeInteger(value) || value < 0) {
    throw new Error(`Merkle: ${name} must be a whole number from 0 to 2^53 - 1, got ${String(value)}`);
  }
}

function checkIndex(leafIndex: number, treeSize: number): void {
  sizeOrThrow("leafIndex", leafIndex);
  sizeOrThrow("treeSize", treeSize);
  if (leafIndex >= treeSize) {
    throw new Error(
      `Merkle: leafIndex ${leafIndex} is out of range for a tree of ${treeSize} leaves (it must be below treeSize)`,
    );
  }
}

function checkSizes(oldSize: number, newSize: number): void {
  sizeOrThrow("oldSize", oldSize);
  sizeOrThrow("newSize", newSize);
  if (oldSize > newSize) {
    throw new Error(`Merkle: oldSize ${oldSize} is larger than newSize ${newSize}; an append-only log never shrinks`);
  }
}

function checkRange(start: number, end: number, limit: number): void {
  sizeOrThrow("start", start);
  sizeOrThrow("end", end);
  if (start >= end || end > limit) {
    const of = limit === Number.MAX_SAFE_INTEGER ? "" : ` of the ${limit} leaves`;
    throw new Error(`Merkle: [${start}, ${end}) is not a non-empty range${of}`);
  }
}

function isHash(value: unknown): value is Uint8Array {
  return value instanceof Uint8Array && value.length === HASH_BYTES;
}

function describe(value: unknown): string {
  if (value instanceof Uint8Array) return `${value.length} bytes`;
  if (Array.isArray(value)) return "an array";
  return value === null ? "null" : typeof value;
}

function equalBytes(a: Uint8Array, b: Uint8Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/** The RFC's LSB test and right shift, as arithmetic: exact for every safe integer, unlike `& 1` and `>> 1`. */
export const isOdd = (x: number): boolean => x % 2 === 1;
export const half = (x: number): number => Math.floor(x / 2);

export function isPowerOfTwo(x: number): boolean {
  if (x < 1) return false;
  while (x % 2 === 0) x /= 2;
  return x === 1;
}

/** k of RFC 9162 §2.1.1: the largest power of two smaller than n (n ≥ 2). */
export function largestPowerOfTwoBelow(n: number): number {
  let k = 1;
  while (k * 2 < n) k *= 2;
  return k;
}
