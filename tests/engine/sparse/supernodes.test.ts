import { describe, expect, it } from "vitest";
import { computeOrdering, SymmetricTripletBuilder, type OrderingMethod, type SymmetricCsc } from "@/lib/engine/sparse";
import type { CscMatrix } from "@/lib/engine/sparse/csc";
import { analyzeSymbolic } from "@/lib/engine/sparse/symbolic";
import { createRandom, randomSpdMatrix } from "./dense-reference";

// The supernodal structure checked field by field against L's pattern found by brute-force boolean elimination
// of the permuted matrix (common practice: L's column j is A's column j below the diagonal together with the
// columns k < j that have a nonzero in row j, below j).

/** L's pattern (lower triangle, diagonal included) by dense boolean elimination of the lower CSC matrix c. */
function patternOfL(c: CscMatrix): boolean[][] {
  const n = c.n;
  const l = Array.from({ length: n }, () => new Array<boolean>(n).fill(false));
  for (let j = 0; j < n; j++) for (let p = c.colPtr[j]; p < c.colPtr[j + 1]; p++) l[c.rowIdx[p]][j] = true;
  for (let k = 0; k < n; k++) {
    l[k][k] = true;
    const below: number[] = [];
    for (let i = k + 1; i < n; i++) if (l[i][k]) below.push(i);
    for (const i of below) for (const j of below) if (j < i) l[i][j] = true;
  }
  return l;
}

function checkStructure(a: SymmetricCsc, method: OrderingMethod, blockSize: number): void {
  const { permuted, structure: sn, nnzL } = analyzeSymbolic(a, computeOrdering(a, method, blockSize));
  const n = a.n;
  const l = patternOfL(permuted);
  const below = (j: number) => Array.from({ length: n - j - 1 }, (_, k) => j + 1 + k).filter((i) => l[i][j]);
  // Elimination tree: the first row below the diagonal in L's column (Liu 1990, from memory).
  const parent = Array.from({ length: n }, (_, j) => below(j)[0] ?? -1);
  const count = (j: number) => 1 + below(j).length;

  expect(sn.n).toBe(n);
  expect(nnzL).toBe(Array.from({ length: n }, (_, j) => count(j)).reduce((s, c) => s + c, 0));
  expect(sn.superStart[0]).toBe(0);
  expect(sn.superStart[sn.count]).toBe(n);
  expect(sn.superStart).toHaveLength(sn.count + 1);
  const superOf = new Int32Array(n);
  let maxRows = 0;
  let storedL = 0;
  expect(sn.valuePtr[0]).toBe(0);
  expect(sn.rowPtr[0]).toBe(0);
  for (let s = 0; s < sn.count; s++) {
    const first = sn.superStart[s];
    const last = sn.superStart[s + 1] - 1;
    expect(last).toBeGreaterThanOrEqual(first);
    for (let j = first; j <= last; j++) superOf[j] = s;
    const cols = last - first + 1;
    const rows = Array.from(sn.rows.subarray(sn.rowPtr[s], sn.rowPtr[s + 1]));
    // Its own columns first, then the union of its columns' rows below the supernode, ascending.
    expect(rows.slice(0, cols)).toEqual(Array.from({ length: cols }, (_, k) => first + k));
    const union = new Set<number>();
    for (let j = first; j <= last; j++) for (const i of below(j)) if (i > last) union.add(i);
    expect(rows.slice(cols)).toEqual([...union].sort((x, y) => x - y));
    const m = rows.length;
    expect(sn.valuePtr[s + 1] - sn.valuePtr[s]).toBe(m * cols);
    maxRows = Math.max(maxRows, m);
    storedL += m * cols - (cols * (cols - 1)) / 2;
  }
  expect(sn.maxRows).toBe(maxRows);
  expect(sn.storedL).toBe(storedL);
  expect(sn.storedL).toBeGreaterThanOrEqual(nnzL);
  for (let s = 0; s < sn.count; s++) {
    const last = sn.superStart[s + 1] - 1;
    const p = parent[last];
    expect(sn.superParent[s]).toBe(p === -1 ? -1 : superOf[p]);
    if (p === -1) continue;
    expect(sn.superParent[s]).toBeGreaterThan(s);
    // The extend-add map: each row below s sits at parentPos within the parent's rows.
    const cols = last + 1 - sn.superStart[s];
    const parentRows = sn.rows.subarray(sn.rowPtr[sn.superParent[s]], sn.rowPtr[sn.superParent[s] + 1]);
    for (let q = sn.rowPtr[s] + cols; q < sn.rowPtr[s + 1]; q++) expect(parentRows[sn.parentPos[q]]).toBe(sn.rows[q]);
  }
  // A fundamental supernode is never split: j + 1 continues j when it is j's parent and j's column has exactly
  // one row more (Liu, Ng & Peyton 1993, from memory).
  for (let j = 0; j + 1 < n; j++)
    if (parent[j] === j + 1 && count(j) === count(j + 1) + 1) expect(superOf[j + 1]).toBe(superOf[j]);
}

/** A chain 0–1–…–(length − 1) in natural order, equation 0 coupled to each of the `rows` equations after the chain. */
function chainWithRows(length: number, rows: number): SymmetricCsc {
  const n = length + rows;
  const builder = new SymmetricTripletBuilder(n);
  for (let j = 0; j < n; j++) builder.add(j, j, 100);
  for (let j = 0; j + 1 < length; j++) builder.add(j + 1, j, -1);
  for (let t = length; t < n; t++) builder.add(t, 0, -1);
  return builder.toCsc();
}

/** Tridiagonal matrix of size n (a path), in its natural order. */
function tridiagonal(n: number): SymmetricCsc {
  const builder = new SymmetricTripletBuilder(n);
  for (let i = 0; i < n; i++) {
    builder.add(i, i, 4);
    if (i > 0) builder.add(i, i - 1, -1);
  }
  return builder.toCsc();
}

describe("buildSupernodes", () => {
  it("matches L's pattern by brute-force elimination: rows, parents, extend-add map, sizes (random matrices, three orderings)", () => {
    const random = createRandom(555);
    for (const method of ["amd", "rcm", "natural"] as const)
      for (let trial = 0; trial < 10; trial++) {
        const blockSize = trial % 3 === 0 ? 1 : 3;
        checkStructure(randomSpdMatrix(random, 2 + Math.floor(random() * 30), blockSize, random() * 0.35), method, blockSize);
      }
  });

  it("checks a diagonal matrix and one with a single equation", () => {
    const builder = new SymmetricTripletBuilder(5);
    for (let i = 0; i < 5; i++) builder.add(i, i, 1 + i);
    checkStructure(builder.toCsc(), "natural", 1);
    checkStructure(tridiagonal(1), "natural", 1);
  });

  it("grows its row buffer when the supernodes' rows outnumber twice C's entries (a chain that inherits 70 rows)", () => {
    // Natural order: a chain 0–1–…–299, and equation 0 coupled to each of 300 … 369. Elimination gives every column
    // of the chain the 70 rows 300 … 369, but C holds them once; the chain's supernodes stay narrow (their diagonal
    // blocks are mostly zeros), so their rows add up to more than the 2·nnz(C) the buffer starts with.
    const a = chainWithRows(300, 70);
    const n = a.n;
    const { structure } = analyzeSymbolic(a, computeOrdering(a, "natural"));
    expect(structure.rowPtr[structure.count]).toBeGreaterThan(2 * a.colPtr[n]);
    checkStructure(a, "natural", 1);
  });

  it("merges a path's columns into supernodes of 16 from the top, by the relaxed amalgamation rule", () => {
    // Tridiagonal, natural order: column j of L has rows j and j + 1, so the fundamental supernodes are single
    // columns but for the last two. Merging c columns of such a chain into a group whose last row is its own
    // (the top group) stores c(c + 1)/2 entries of which (c − 1)(c − 2)/2 are zeros: 210/272 = 0.77 at c = 16, under
    // the 0.8 allowed up to 16 columns; at 17 columns only 0.1 or less is allowed (CHOLMOD's defaults, from
    // memory, as in supernodes.ts). A lower group with one row below holds c(c + 3)/2 entries, (c − 1)c/2 zeros:
    // 15/19 = 0.79 at 16 columns. So 40 columns split as 8, 16, 16 (by hand).
    const { structure } = analyzeSymbolic(tridiagonal(40), computeOrdering(tridiagonal(40), "natural"));
    expect(Array.from(structure.superStart)).toEqual([0, 8, 24, 40]);
    // Stored: m·c − c(c − 1)/2 for m rows and c columns: 9·8 − 28, 17·16 − 120, 16·16 − 120.
    expect(structure.storedL).toBe(44 + 152 + 136);
    checkStructure(tridiagonal(40), "natural", 1);
  });

  it("merges a chain that carries 100 rows below into groups of 23, and its top into the last 100 columns, by the relaxed rule", () => {
    // Chain 0–…–299, equation 0 coupled to 300 … 399 (natural order). Column j < 299 of L has rows j, j + 1 and the 100,
    // so 299 and 300 … 399 form one fundamental supernode of 101 columns and every other column is one on its own.
    // Going down, the top group absorbs chain columns while its zero fraction k(k − 1) / ((101 + k)(102 + k)) stays
    // under 0.05 (it is over 48 columns): 812/17030 at k = 29, 870/17292 at k = 30, so it starts at 270. Below, a group
    // of c chain columns with 101 rows below stores c(c + 101) − c(c − 1)/2 entries of which c(c − 1)/2 are zeros:
    // (c − 1)/(c + 203), 0.097 at c = 23 and 0.101 at c = 24, so groups of 23 while the 0.1 allowed up to 48 columns
    // holds (CHOLMOD's defaults, from memory, as in supernodes.ts); 270 = 11 × 23 + 17. By hand.
    const a = chainWithRows(300, 100);
    const { structure } = analyzeSymbolic(a, computeOrdering(a, "natural"));
    expect(Array.from(structure.superStart)).toEqual([0, 17, ...Array.from({ length: 11 }, (_, k) => 40 + 23 * k), 400]);
    checkStructure(a, "natural", 1);
  });
});
