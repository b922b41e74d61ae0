import type { SymmetricCsc } from "./types";

/** Accumulates (i, j, v) entries of a symmetric matrix; either triangle may be given (stored as lower), duplicates are summed. Grows its typed arrays as needed. */
export class SymmetricTripletBuilder {
  readonly n: number;
  private rows: Int32Array;
  private cols: Int32Array;
  private vals: Float64Array;
  private count = 0;

  constructor(n: number, capacityHint?: number) {
    if (!Number.isInteger(n) || n < 0) throw new Error(`SymmetricTripletBuilder: invalid size ${n}`);
    this.n = n;
    const capacity = Math.max(16, Math.floor(capacityHint ?? 16));
    this.rows = new Int32Array(capacity);
    this.cols = new Int32Array(capacity);
    this.vals = new Float64Array(capacity);
  }

  /** Number of triplets added so far (duplicates counted separately). */
  get size(): number {
    return this.count;
  }

  add(i: number, j: number, v: number): void {
    const n = this.n;
    // Cheap bounds guard: a bad index here would silently corrupt the CSC later.
    if (!(i >= 0 && i < n && j >= 0 && j < n) || (i | 0) !== i || (j | 0) !== j) {
      throw new Error(`SymmetricTripletBuilder.add: index (${i}, ${j}) out of range for n = ${n}`);
    }
    if (this.count === this.rows.length) this.grow();
    const k = this.count++;
    // Store in the lower triangle: row >= column.
    if (i >= j) {
      this.rows[k] = i;
      this.cols[k] = j;
    } else {
      this.rows[k] = j;
      this.cols[k] = i;
    }
    this.vals[k] = v;
  }

  private grow(): void {
    const capacity = this.rows.length * 2;
    const rows = new Int32Array(capacity);
    const cols = new Int32Array(capacity);
    const vals = new Float64Array(capacity);
    rows.set(this.rows);
    cols.set(this.cols);
    vals.set(this.vals);
    this.rows = rows;
    this.cols = cols;
    this.vals = vals;
  }

  /** O(nnz + n): two counting-sort passes (by row, then stably by column) give sorted columns, then adjacent duplicates are summed. */
  toCsc(): SymmetricCsc {
    const { n, count, rows, cols, vals } = this;
    // Pass 1: bucket by row so that the stable pass by column leaves rows ascending.
    const rowPtr = new Int32Array(n + 1);
    for (let k = 0; k < count; k++) rowPtr[rows[k] + 1]++;
    for (let r = 0; r < n; r++) rowPtr[r + 1] += rowPtr[r];
    const byRow = new Int32Array(count);
    const next = rowPtr.slice(0, n);
    for (let k = 0; k < count; k++) byRow[next[rows[k]]++] = k;

    // Pass 2: bucket by column in row order.
    const colStart = new Int32Array(n + 1);
    for (let k = 0; k < count; k++) colStart[cols[k] + 1]++;
    for (let c = 0; c < n; c++) colStart[c + 1] += colStart[c];
    const sortedRow = new Int32Array(count);
    const sortedVal = new Float64Array(count);
    const fill = colStart.slice(0, n);
    for (let t = 0; t < count; t++) {
      const k = byRow[t];
      const dst = fill[cols[k]]++;
      sortedRow[dst] = rows[k];
      sortedVal[dst] = vals[k];
    }

    // Pass 3: compact duplicates (now adjacent) in place.
    const colPtr = new Int32Array(n + 1);
    let out = 0;
    for (let c = 0; c < n; c++) {
      const start = out;
      for (let p = colStart[c]; p < colStart[c + 1]; p++) {
        const r = sortedRow[p];
        if (out > start && sortedRow[out - 1] === r) {
          sortedVal[out - 1] += sortedVal[p];
        } else {
          sortedRow[out] = r;
          sortedVal[out] = sortedVal[p];
          out++;
        }
      }
      colPtr[c + 1] = out;
    }
    return { n, colPtr, rowIdx: sortedRow.slice(0, out), values: sortedVal.slice(0, out) };
  }
}
