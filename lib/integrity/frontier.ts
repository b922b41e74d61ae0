// The Frontier: the incremental side of lib/integrity/merkle.ts, so a sealer can keep a log's root up to date in one
// database row instead of rereading every leaf.
import { emptyTreeHash, half, hashFromHex, hashOrThrow, isOdd, nodeHash, sizeOrThrow, toHex } from "./merkle";

/** A Frontier as stored in a database row: the leaf count and the perfect subtrees' roots in hex, left to right. */
export interface FrontierState {
  size: number;
  hashes: string[];
}

/**
 * The log's right edge: the roots of the perfect subtrees that its size splits into (one per set bit of the size,
 * largest first). Appending a leaf merges equal-sized subtrees like a binary counter's carry, so a sealer folds new
 * leaves in with O(log n) memory and amortised two hashes per leaf, without rereading the log; `root()` is then
 * MTH of every leaf appended so far.
 */
export class Frontier {
  #size = 0;
  #hashes: Uint8Array[] = [];

  get size(): number {
    return this.#size;
  }

  /**
   * Folds in the next leaf's hash (`leafHash(entry)`); returns the new size. `onNode`, when given, hears of every
   * perfect subtree the leaf completes: level L, index i covers leaves [i·2^L, (i+1)·2^L) (level 0 is the leaf).
   */
  append(leafHashValue: Uint8Array, onNode?: (level: number, index: number, hash: Uint8Array) => void): number {
    let carry: Uint8Array = hashOrThrow("leafHash", leafHashValue).slice();
    if (this.#size === Number.MAX_SAFE_INTEGER) throw new Error("Merkle Frontier: the tree is full (2^53 - 1 leaves)");
    let index = this.#size;
    let level = 0;
    onNode?.(level, index, carry);
    for (let s = this.#size; isOdd(s); s = half(s)) {
      carry = nodeHash(this.#hashes.pop()!, carry);
      index = half(index);
      level += 1;
      onNode?.(level, index, carry);
    }
    this.#hashes.push(carry);
    this.#size += 1;
    return this.#size;
  }

  /** MTH of the leaves appended so far: the subtree roots folded right to left, as MTH splits at the largest one. */
  root(): Uint8Array {
    if (this.#hashes.length === 0) return emptyTreeHash();
    let r = this.#hashes[this.#hashes.length - 1];
    for (let i = this.#hashes.length - 2; i >= 0; i--) r = nodeHash(this.#hashes[i], r);
    return r.slice();
  }

  toState(): FrontierState {
    return { size: this.#size, hashes: this.#hashes.map(toHex) };
  }

  toJSON(): FrontierState {
    return this.toState();
  }

  /** Restores a stored state, checking that it has one 32-byte hash per set bit of its size. */
  static fromState(state: FrontierState): Frontier {
    if (typeof state !== "object" || state === null || !Array.isArray(state.hashes)) {
      throw new Error("Merkle Frontier.fromState: the state must be an object { size, hashes: string[] }");
    }
    sizeOrThrow("state.size", state.size);
    const [expected, listed] = [bitCount(state.size), state.hashes.length];
    if (listed !== expected) {
      throw new Error(
        `Merkle Frontier.fromState: ${state.size} leaves make ${expected} perfect subtrees, the state lists ${listed}`,
      );
    }
    const frontier = new Frontier();
    frontier.#hashes = state.hashes.map((hex, i) => hashFromHex(hex, `state.hashes[${i}]`));
    frontier.#size = state.size;
    return frontier;
  }
}

function bitCount(x: number): number {
  let count = 0;
  for (; x > 0; x = half(x)) if (isOdd(x)) count++;
  return count;
}
