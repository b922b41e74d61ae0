// Proofs from a tree kept as its perfect subtrees (one stored hash per node whose subtree has 2^level leaves and
// starts at a multiple of 2^level; a log of n leaves has fewer than 2n). Every element of an RFC 9162 proof is
// MTH of some range, and MTH splits a range at the largest power of two below its size, so each range is a handful
// of stored perfect subtrees folded right to left: a proof reads O(log² n) rows instead of the whole log.
import { hashOrThrow, isPowerOfTwo, largestPowerOfTwoBelow, nodeHash, sizeOrThrow, type SubtreeRange } from "./merkle";

/** A stored perfect subtree: 2^level leaves from index·2^level. */
export interface NodeKey {
  readonly level: number;
  readonly index: number;
}

export type NodeLookup = (level: number, index: number) => Uint8Array | undefined;

/** The stored perfect subtrees MTH(D[start:end]) is folded from, left to right. */
export function perfectPieces(start: number, end: number): NodeKey[] {
  sizeOrThrow("start", start);
  sizeOrThrow("end", end);
  if (end <= start) throw new Error(`stored tree: [${start}, ${end}) is not a non-empty range`);
  const pieces: NodeKey[] = [];
  const walk = (a: number, b: number): void => {
    const size = b - a;
    if (isPowerOfTwo(size) && a % size === 0) {
      pieces.push({ level: Math.log2(size), index: a / size });
      return;
    }
    const k = largestPowerOfTwoBelow(size);
    walk(a, a + k);
    walk(a + k, b);
  };
  walk(start, end);
  return pieces;
}

/** MTH(D[start:end]) from stored perfect subtrees; throws naming the first one that is missing. */
export function subtreeFromStore(start: number, end: number, lookup: NodeLookup): Uint8Array {
  const size = end - start;
  if (isPowerOfTwo(size) && start % size === 0) {
    const level = Math.log2(size);
    const index = start / size;
    const stored = lookup(level, index);
    if (!stored) throw new Error(`stored tree: the node at level ${level}, index ${index} is missing`);
    return hashOrThrow(`node ${level}/${index}`, stored);
  }
  const k = largestPowerOfTwoBelow(size);
  return nodeHash(subtreeFromStore(start, start + k, lookup), subtreeFromStore(start + k, end, lookup));
}

/** Every stored node the given proof ranges need, each once. */
export function nodesForRanges(ranges: readonly SubtreeRange[]): NodeKey[] {
  const seen = new Map<string, NodeKey>();
  for (const { start, end } of ranges) {
    for (const piece of perfectPieces(start, end)) seen.set(`${piece.level}/${piece.index}`, piece);
  }
  return [...seen.values()];
}
