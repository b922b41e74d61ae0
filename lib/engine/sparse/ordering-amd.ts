import { visitPostorder } from "./tree";
import type { AdjacencyGraph } from "./types";

// Approximate minimum degree ordering (Amestoy, Davis & Duff, SIAM J. Matrix Anal. Appl. 1996),
// following the compact quotient-graph formulation of cs_amd in T. A. Davis, Direct Methods for
// Sparse Linear Systems (SIAM 2006), written from memory. Elements and variables share one
// workspace `ci`; a node absorbed into another is marked with flip(parent) in `cp`.

const flip = (i: number): number => -i - 2;

/** Resets the marker array when `mark` would overflow; w[i] == 0 means a dead element. */
function clearMarks(mark: number, lemax: number, w: Int32Array, n: number): number {
  if (mark < 2 || mark + lemax > 0x3fffffff) {
    for (let k = 0; k < n; k++) if (w[k] !== 0) w[k] = 1;
    return 2;
  }
  return mark;
}

/** perm[k] = vertex eliminated k-th, for the graph's n vertices. */
export function orderApproximateMinimumDegree(graph: AdjacencyGraph): Int32Array {
  const n = graph.n;
  if (n === 0) return new Int32Array(0);
  // Rows with more than `dense` entries are ordered last: they would dominate degree updates.
  const dense = Math.min(n - 2, Math.max(16, Math.floor(10 * Math.sqrt(n))));
  let cnz = graph.ptr[n];
  // Elbow room so new elements can be appended before garbage collection is needed.
  const nzmax = cnz + Math.floor(cnz / 5) + 2 * n;
  const ci = new Int32Array(nzmax);
  ci.set(graph.adj.subarray(0, cnz));
  const cp = new Int32Array(n + 1);
  cp.set(graph.ptr.subarray(0, n + 1));

  const len = new Int32Array(n + 1);
  const nv = new Int32Array(n + 1);
  const next = new Int32Array(n + 1);
  const head = new Int32Array(n + 1);
  const elen = new Int32Array(n + 1);
  const degree = new Int32Array(n + 1);
  const w = new Int32Array(n + 1);
  const hhead = new Int32Array(n + 1);
  const last = new Int32Array(n + 1);

  for (let k = 0; k < n; k++) len[k] = cp[k + 1] - cp[k];
  len[n] = 0;
  for (let i = 0; i <= n; i++) {
    head[i] = -1;
    last[i] = -1;
    next[i] = -1;
    hhead[i] = -1;
    nv[i] = 1;
    w[i] = 1;
    elen[i] = 0;
    degree[i] = len[i];
  }
  let mark = clearMarks(0, 0, w, n);
  elen[n] = -2;
  cp[n] = -1;
  w[n] = 0;

  let nel = 0;
  for (let i = 0; i < n; i++) {
    const d = degree[i];
    if (d === 0) {
      elen[i] = -2;
      nel++;
      cp[i] = -1;
      w[i] = 0;
    } else if (d > dense) {
      nv[i] = 0;
      elen[i] = -1;
      nel++;
      cp[i] = flip(n);
      nv[n]++;
    } else {
      if (head[d] !== -1) last[head[d]] = i;
      next[i] = head[d];
      head[d] = i;
    }
  }

  let mindeg = 0;
  let lemax = 0;
  while (nel < n) {
    // Select a node of minimum approximate degree.
    let k = -1;
    for (; mindeg < n && (k = head[mindeg]) === -1; mindeg++);
    if (next[k] !== -1) last[next[k]] = -1;
    head[mindeg] = next[k];
    const elenk = elen[k];
    let nvk = nv[k];
    nel += nvk;

    // Garbage collection: compact live objects to the front of ci.
    if (elenk > 0 && cnz + mindeg >= nzmax) {
      for (let j = 0; j < n; j++) {
        const p = cp[j];
        if (p >= 0) {
          cp[j] = ci[p];
          ci[p] = flip(j);
        }
      }
      let q = 0;
      for (let p = 0; p < cnz;) {
        const j = flip(ci[p++]);
        if (j >= 0) {
          ci[q] = cp[j];
          cp[j] = q++;
          for (let k3 = 0; k3 < len[j] - 1; k3++) ci[q++] = ci[p++];
        }
      }
      cnz = q;
    }

    // Construct the new element Lk from k's variables and the elements it touches.
    let dk = 0;
    nv[k] = -nvk;
    let p = cp[k];
    const pk1 = elenk === 0 ? p : cnz;
    let pk2 = pk1;
    for (let k1 = 1; k1 <= elenk + 1; k1++) {
      let e: number;
      let pj: number;
      let ln: number;
      if (k1 > elenk) {
        e = k;
        pj = p;
        ln = len[k] - elenk;
      } else {
        e = ci[p++];
        pj = cp[e];
        ln = len[e];
      }
      for (let k2 = 1; k2 <= ln; k2++) {
        const i = ci[pj++];
        const nvi = nv[i];
        if (nvi <= 0) continue;
        dk += nvi;
        nv[i] = -nvi;
        ci[pk2++] = i;
        if (next[i] !== -1) last[next[i]] = last[i];
        if (last[i] !== -1) next[last[i]] = next[i];
        else head[degree[i]] = next[i];
      }
      if (e !== k) {
        cp[e] = flip(k);
        w[e] = 0;
      }
    }
    if (elenk !== 0) cnz = pk2;
    degree[k] = dk;
    cp[k] = pk1;
    len[k] = pk2 - pk1;
    elen[k] = -2;

    // Scan 1: w[e] - mark = |Le \ Lk| for every element e adjacent to Lk.
    mark = clearMarks(mark, lemax, w, n);
    for (let pk = pk1; pk < pk2; pk++) {
      const i = ci[pk];
      const eln = elen[i];
      if (eln <= 0) continue;
      const nvi = -nv[i];
      const wnvi = mark - nvi;
      for (let q = cp[i]; q <= cp[i] + eln - 1; q++) {
        const e = ci[q];
        if (w[e] >= mark) w[e] -= nvi;
        else if (w[e] !== 0) w[e] = degree[e] + wnvi;
      }
    }

    // Scan 2: approximate degree update, pruning and hashing of each i in Lk.
    for (let pk = pk1; pk < pk2; pk++) {
      const i = ci[pk];
      const p1 = cp[i];
      const p2 = p1 + elen[i] - 1;
      let pn = p1;
      let h = 0;
      let d = 0;
      for (let q = p1; q <= p2; q++) {
        const e = ci[q];
        if (w[e] !== 0) {
          const dext = w[e] - mark;
          if (dext > 0) {
            d += dext;
            ci[pn++] = e;
            h += e;
          } else {
            // Aggressive absorption: Le is a subset of Lk.
            cp[e] = flip(k);
            w[e] = 0;
          }
        }
      }
      elen[i] = pn - p1 + 1;
      const p3 = pn;
      const p4 = p1 + len[i];
      for (let q = p2 + 1; q < p4; q++) {
        const j = ci[q];
        const nvj = nv[j];
        if (nvj <= 0) continue;
        d += nvj;
        ci[pn++] = j;
        h += j;
      }
      if (d === 0) {
        // Mass elimination: i is adjacent only to k.
        cp[i] = flip(k);
        const nvi = -nv[i];
        dk -= nvi;
        nvk += nvi;
        nel += nvi;
        nv[i] = 0;
        elen[i] = -1;
      } else {
        degree[i] = Math.min(degree[i], d);
        ci[pn] = ci[p3];
        ci[p3] = ci[p1];
        ci[p1] = k;
        len[i] = pn - p1 + 1;
        h %= n;
        next[i] = hhead[h];
        hhead[h] = i;
        last[i] = h;
      }
    }
    degree[k] = dk;
    lemax = Math.max(lemax, dk);
    mark = clearMarks(mark + lemax, lemax, w, n);

    // Supernode detection: merge variables with identical adjacency (same hash bucket first).
    for (let pk = pk1; pk < pk2; pk++) {
      let i = ci[pk];
      if (nv[i] >= 0) continue;
      const h = last[i];
      i = hhead[h];
      hhead[h] = -1;
      for (; i !== -1 && next[i] !== -1; i = next[i], mark++) {
        const ln = len[i];
        const eln = elen[i];
        for (let q = cp[i] + 1; q <= cp[i] + ln - 1; q++) w[ci[q]] = mark;
        let jlast = i;
        for (let j = next[i]; j !== -1;) {
          let same = len[j] === ln && elen[j] === eln;
          for (let q = cp[j] + 1; same && q <= cp[j] + ln - 1; q++) {
            if (w[ci[q]] !== mark) same = false;
          }
          if (same) {
            cp[j] = flip(i);
            nv[i] += nv[j];
            nv[j] = 0;
            elen[j] = -1;
            j = next[j];
            next[jlast] = j;
          } else {
            jlast = j;
            j = next[j];
          }
        }
      }
    }

    // Finalize Lk and put its variables back into the degree lists.
    let pOut = pk1;
    for (let pk = pk1; pk < pk2; pk++) {
      const i = ci[pk];
      const nvi = -nv[i];
      if (nvi <= 0) continue;
      nv[i] = nvi;
      let d = degree[i] + dk - nvi;
      d = Math.min(d, n - nel - nvi);
      if (head[d] !== -1) last[head[d]] = i;
      next[i] = head[d];
      last[i] = -1;
      head[d] = i;
      mindeg = Math.min(mindeg, d);
      degree[i] = d;
      ci[pOut++] = i;
    }
    nv[k] = nvk;
    len[k] = pOut - pk1;
    if (len[k] === 0) {
      cp[k] = -1;
      w[k] = 0;
    }
    if (elenk !== 0) cnz = pOut;
  }

  // Postorder the assembly tree; absorbed variables follow their representative.
  for (let i = 0; i < n; i++) cp[i] = flip(cp[i]);
  for (let j = 0; j <= n; j++) head[j] = -1;
  for (let j = n; j >= 0; j--) {
    if (nv[j] > 0) continue;
    next[j] = head[cp[j]];
    head[cp[j]] = j;
  }
  for (let e = n; e >= 0; e--) {
    if (nv[e] <= 0) continue;
    if (cp[e] !== -1) {
      next[e] = head[cp[e]];
      head[cp[e]] = e;
    }
  }
  const post = new Int32Array(n + 1);
  let k = 0;
  for (let i = 0; i <= n; i++) {
    if (cp[i] === -1) k = visitPostorder(i, k, head, next, post, w);
  }
  // The dense-row placeholder n is a root visited last, so the first n entries are the order.
  return post.slice(0, n);
}
