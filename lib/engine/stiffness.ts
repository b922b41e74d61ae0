/**
 * The global stiffness K over the free equations, assembled once per analysis (every load case reuses it and
 * its factor). Restrained DOFs drop out; springs add to the diagonal.
 */
import { DOFS_PER_NODE, type DofMap } from "./dofs";
import { toGlobalStiffness } from "./elements";
import { localStiffness, memberDofs, type PreparedMember } from "./members";
import type { SymmetricCsc } from "./sparse";
import { patternPosition, stiffnessPattern } from "./stiffness-pattern";

/**
 * K over the free equations, lower triangle in CSC. Values are added straight into the pattern of
 * `stiffnessPattern`; entries that no member or spring makes nonzero are then squeezed out, so the pattern
 * (and with it the ordering) is the same as adding only nonzero entries one by one.
 */
export function assembleStiffness(members: ReadonlyArray<PreparedMember>, dofs: DofMap): SymmetricCsc {
  const ends = new Int32Array(2 * members.length);
  for (let m = 0; m < members.length; m++) {
    ends[2 * m] = members[m].start;
    ends[2 * m + 1] = members[m].end;
  }
  const pat = stiffnessPattern(ends, dofs);
  const { colPtr, rowIdx } = pat;
  const values = new Float64Array(rowIdx.length);
  const touched = new Uint8Array(rowIdx.length);
  const k = new Float64Array(36);
  const K = new Float64Array(36);
  const g = new Int32Array(6);
  const eq = new Int32Array(6);
  const nodeOf = new Int32Array(6);
  for (let m = 0; m < members.length; m++) {
    const p = members[m];
    toGlobalStiffness(localStiffness(p, k), p.frame.c, p.frame.s, K);
    memberDofs(p, g);
    for (let a = 0; a < 6; a++) {
      eq[a] = dofs.equation[g[a]];
      nodeOf[a] = a < DOFS_PER_NODE ? p.start : p.end;
    }
    for (let a = 0; a < 6; a++) {
      if (eq[a] < 0) continue;
      for (let b = 0; b <= a; b++) {
        if (eq[b] < 0) continue;
        const v = K[a * 6 + b];
        if (v === 0) continue;
        const q =
          eq[a] >= eq[b]
            ? patternPosition(pat, m, nodeOf[a], eq[a], nodeOf[b], eq[b])
            : patternPosition(pat, m, nodeOf[b], eq[b], nodeOf[a], eq[a]);
        values[q] += v;
        touched[q] = 1;
      }
    }
  }
  for (let e = 0; e < dofs.nFree; e++) {
    const s = dofs.spring[dofs.freeToGlobal[e]];
    // The first entry of each column is its diagonal.
    if (s !== 0) {
      values[colPtr[e]] += s;
      touched[colPtr[e]] = 1;
    }
  }
  // Squeeze out untouched entries in place; columns only move towards the front.
  let out = 0;
  let begin = 0; // the column's start before squeezing (colPtr[c] already holds the new one)
  for (let c = 0; c < pat.n; c++) {
    const end = colPtr[c + 1];
    for (let q = begin; q < end; q++) {
      if (!touched[q]) continue;
      rowIdx[out] = rowIdx[q];
      values[out++] = values[q];
    }
    colPtr[c + 1] = out;
    begin = end;
  }
  return { n: pat.n, colPtr, rowIdx: rowIdx.subarray(0, out), values: values.subarray(0, out) };
}
