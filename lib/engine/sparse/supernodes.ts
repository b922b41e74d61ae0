import type { CscMatrix } from "./csc";

/** Supernodal structure of L: supernode s owns columns superStart[s] .. superStart[s+1]-1. */
export interface SupernodalStructure {
  n: number;
  count: number;
  superStart: Int32Array;
  /** Parent supernode in the assembly tree, -1 for roots. Children always precede their parent. */
  superParent: Int32Array;
  /** Rows of supernode s: rows[rowPtr[s] .. rowPtr[s+1]-1], its own columns first, then ascending. */
  rowPtr: Int32Array;
  rows: Int32Array;
  /** Offset of s's dense column-major block (rows × columns) in the values array. */
  valuePtr: Int32Array;
  /**
   * For each row of s below its own columns (same layout as `rows`, own-column slots unused), the
   * position of that row within the parent supernode's rows: the extend-add map of the front.
   */
  parentPos: Int32Array;
  /** Largest number of rows of any supernode (the largest frontal matrix). */
  maxRows: number;
  /** Stored entries of L on and below the diagonal, explicit zeros of relaxed supernodes included. */
  storedL: number;
}

// Relaxed amalgamation thresholds (the defaults of CHOLMOD's supernodal analysis, from memory):
// merging a child into its parent adds explicit zeros but gives wider dense kernels.
const RELAX_ALWAYS_COLS = 4;
const RELAX_COLS = [16, 48];
const RELAX_ZEROS = [0.8, 0.1];
const RELAX_ZEROS_ANY = 0.05;

function shouldMerge(cols: number, zeroFraction: number): boolean {
  return (
    cols <= RELAX_ALWAYS_COLS ||
    (cols <= RELAX_COLS[0] && zeroFraction < RELAX_ZEROS[0]) ||
    (cols <= RELAX_COLS[1] && zeroFraction < RELAX_ZEROS[1]) ||
    zeroFraction < RELAX_ZEROS_ANY
  );
}

/** Fundamental supernodes (column j+1 continues j's when L's structure is nested), then relaxed merges. */
function partitionColumns(parent: Int32Array, colCount: Int32Array): Int32Array {
  const n = parent.length;
  // Fundamental partition, as start columns.
  const fundStart: number[] = [];
  for (let j = 0; j < n; j++) {
    const continues = j > 0 && parent[j - 1] === j && colCount[j - 1] === colCount[j] + 1;
    if (!continues) fundStart.push(j);
  }
  const nf = fundStart.length;
  fundStart.push(n);
  const fundOf = new Int32Array(n);
  for (let s = 0; s < nf; s++) for (let j = fundStart[s]; j < fundStart[s + 1]; j++) fundOf[j] = s;

  // Merge top-down: a group (named by its top fundamental supernode) absorbs the child that ends just before it.
  const rep = new Int32Array(nf);
  const groupFirst = new Int32Array(nf);
  const groupCols = new Int32Array(nf);
  const groupRows = new Int32Array(nf); // rows of the group's first column, its own columns included
  const groupZeros = new Float64Array(nf);
  for (let s = nf - 1; s >= 0; s--) {
    const cols = fundStart[s + 1] - fundStart[s];
    const rows = colCount[fundStart[s]];
    const lastParent = parent[fundStart[s + 1] - 1];
    rep[s] = s;
    groupFirst[s] = s;
    groupCols[s] = cols;
    groupRows[s] = rows;
    groupZeros[s] = 0;
    if (lastParent === -1) continue;
    const r = rep[fundOf[lastParent]];
    if (groupFirst[r] !== s + 1) continue;
    const mergedCols = cols + groupCols[r];
    const mergedRows = cols + groupRows[r];
    const zeros = groupZeros[r] + cols * (mergedRows - rows);
    const stored = mergedCols * mergedRows - (mergedCols * (mergedCols - 1)) / 2;
    if (!shouldMerge(mergedCols, zeros / stored)) continue;
    rep[s] = r;
    groupFirst[r] = s;
    groupCols[r] = mergedCols;
    groupRows[r] = mergedRows;
    groupZeros[r] = zeros;
  }
  const starts: number[] = [];
  // Groups are contiguous runs of fundamental supernodes sharing a representative.
  for (let s = 0; s < nf; s++) if (s === 0 || rep[s - 1] !== rep[s]) starts.push(fundStart[s]);
  starts.push(n);
  return Int32Array.from(starts);
}

/**
 * Supernodes and their row structures for lower-triangular C (postordered) with elimination
 * tree `parent` and column counts `colCount`. A supernode's rows are its columns plus the union of
 * C's rows below them and its children's rows below them.
 */
export function buildSupernodes(c: CscMatrix, parent: Int32Array, colCount: Int32Array): SupernodalStructure {
  const n = c.n;
  const superStart = partitionColumns(parent, colCount);
  const count = superStart.length - 1;
  const superOf = new Int32Array(n);
  for (let s = 0; s < count; s++) for (let j = superStart[s]; j < superStart[s + 1]; j++) superOf[j] = s;
  const superParent = new Int32Array(count);
  const childHead = new Int32Array(count).fill(-1);
  const childNext = new Int32Array(count).fill(-1);
  for (let s = count - 1; s >= 0; s--) {
    const p = parent[superStart[s + 1] - 1];
    superParent[s] = p === -1 ? -1 : superOf[p];
    if (p !== -1) {
      childNext[s] = childHead[superParent[s]];
      childHead[superParent[s]] = s;
    }
  }

  const rowPtr = new Int32Array(count + 1);
  const valuePtr = new Int32Array(count + 1);
  let rows = new Int32Array(Math.max(16, 2 * c.colPtr[n]));
  const mark = new Int32Array(n).fill(-1);
  let top = 0;
  let maxRows = 0;
  let storedL = 0;
  for (let s = 0; s < count; s++) {
    const first = superStart[s];
    const last = superStart[s + 1] - 1;
    const cols = last - first + 1;
    // Upper bound on this supernode's rows, to grow the buffer once.
    let bound = cols;
    for (let j = first; j <= last; j++) bound += c.colPtr[j + 1] - c.colPtr[j];
    for (let ch = childHead[s]; ch !== -1; ch = childNext[ch]) bound += rowPtr[ch + 1] - rowPtr[ch];
    if (top + bound > rows.length) {
      const grown = new Int32Array(Math.max(2 * rows.length, top + bound));
      grown.set(rows.subarray(0, top));
      rows = grown;
    }
    const start = top;
    for (let j = first; j <= last; j++) {
      rows[top++] = j;
      mark[j] = s;
    }
    const below = top;
    for (let j = first; j <= last; j++) {
      for (let p = c.colPtr[j]; p < c.colPtr[j + 1]; p++) {
        const i = c.rowIdx[p];
        if (mark[i] !== s) {
          mark[i] = s;
          rows[top++] = i;
        }
      }
    }
    for (let ch = childHead[s]; ch !== -1; ch = childNext[ch]) {
      for (let p = rowPtr[ch]; p < rowPtr[ch + 1]; p++) {
        const i = rows[p];
        if (i > last && mark[i] !== s) {
          mark[i] = s;
          rows[top++] = i;
        }
      }
    }
    rows.subarray(below, top).sort();
    rowPtr[s + 1] = top;
    const m = top - start;
    maxRows = Math.max(maxRows, m);
    valuePtr[s + 1] = valuePtr[s] + m * cols;
    storedL += m * cols - (cols * (cols - 1)) / 2;
  }
  const finalRows = rows.slice(0, top);
  const parentPos = new Int32Array(top);
  const local = new Int32Array(n);
  for (let s = count - 1; s >= 0; s--) {
    const p = superParent[s];
    if (p === -1) continue;
    for (let q = rowPtr[p]; q < rowPtr[p + 1]; q++) local[finalRows[q]] = q - rowPtr[p];
    const cols = superStart[s + 1] - superStart[s];
    for (let q = rowPtr[s] + cols; q < rowPtr[s + 1]; q++) parentPos[q] = local[finalRows[q]];
  }
  return { n, count, superStart, superParent, rowPtr, rows: finalRows, parentPos, valuePtr, maxRows, storedL };
}
