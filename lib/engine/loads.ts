/**
 * Loads of one load case: nodal loads (global) and span loads resolved into member-local components, and the
 * fixed-end forces (fef, local) those span loads produce on a member clamped at both ends.
 *
 * Fixed-end forces are member end forces in the stiffness convention (forces the nodes apply to the member,
 * along local axes), so f = k d + fef. The equivalent nodal loads are −FEF (global).
 */
import type { Load, Model } from "./model";
import type { IdLookup } from "./id-index";
import { DOFS_PER_NODE, globalDof, RZ, UX, UY } from "./dofs";
import type { MemberFrame } from "./elements";

/** Standard gravity, m/s², for self-weight from density. */
export const GRAVITY = 9.80665;

export interface DistributedSpanLoad {
  /** 0 = along local x (axial), 1 = along local y (transverse). */
  readonly axis: 0 | 1;
  readonly a: number;
  readonly b: number;
  /** Intensity per member length at a and at b. */
  readonly wa: number;
  readonly wb: number;
}

export interface ConcentratedSpanLoad {
  /** 0 = force along local x, 1 = force along local y, 2 = couple (counter-clockwise). */
  readonly axis: 0 | 1 | 2;
  readonly a: number;
  readonly value: number;
}

export interface SpanLoads {
  readonly distributed: DistributedSpanLoad[];
  readonly concentrated: ConcentratedSpanLoad[];
}

export interface CaseLoads {
  /** Global nodal loads, 3 per node (fx, fy, mz). */
  readonly nodal: Float64Array;
  /** Span loads by member index (absent = unloaded member). */
  readonly span: SpanTable;
}

/**
 * Span loads by member index, iterated in the order members were first loaded (as a Map would be). Members are
 * numbered 0..n−1, so a slot array sized once replaces a Map that regrows and copies as 10,000s of members fill it.
 */
export class SpanTable implements Iterable<[number, SpanLoads]> {
  private readonly slot: Int32Array;
  private readonly loaded: number[] = [];
  private readonly entries: SpanLoads[] = [];

  constructor(members: number) {
    this.slot = new Int32Array(members).fill(-1);
  }

  get size(): number {
    return this.loaded.length;
  }

  get(m: number): SpanLoads | undefined {
    const k = this.slot[m];
    return k >= 0 ? this.entries[k] : undefined;
  }

  /** The member's span loads, created empty on first use. */
  of(m: number): SpanLoads {
    const k = this.slot[m];
    if (k >= 0) return this.entries[k];
    const s: SpanLoads = { distributed: [], concentrated: [] };
    this.slot[m] = this.loaded.length;
    this.loaded.push(m);
    this.entries.push(s);
    return s;
  }

  keys(): IterableIterator<number> {
    return this.loaded.values();
  }

  *[Symbol.iterator](): IterableIterator<[number, SpanLoads]> {
    for (let k = 0; k < this.loaded.length; k++) yield [this.loaded[k], this.entries[k]];
  }
}

/** Local (px, py) of a force given along `direction` with magnitude w. */
function localComponents(direction: string, w: number, f: MemberFrame): [number, number] {
  switch (direction) {
    case "local-x":
      return [w, 0];
    case "local-y":
      return [0, w];
    case "global-x":
      return [w * f.c, -w * f.s];
    default:
      return [w * f.s, w * f.c];
  }
}

function addDistributed(target: SpanLoads, px: [number, number], py: [number, number], a: number, b: number): void {
  if (px[0] !== 0 || px[1] !== 0) target.distributed.push({ axis: 0, a, b, wa: px[0], wb: px[1] });
  if (py[0] !== 0 || py[1] !== 0) target.distributed.push({ axis: 1, a, b, wa: py[0], wb: py[1] });
}

function addLoad(load: Load, model: Model, frames: ReadonlyArray<MemberFrame>, index: IdIndex, out: CaseLoads): void {
  if (load.kind === "nodal") {
    const n = index.node.get(load.node)!;
    out.nodal[globalDof(n, UX)] += load.fx;
    out.nodal[globalDof(n, UY)] += load.fy;
    out.nodal[globalDof(n, RZ)] += load.mz;
    return;
  }
  if (load.kind === "self-weight") {
    model.members.forEach((m, i) => {
      if (!m.density) return;
      const w = -m.density * m.A * GRAVITY * load.factor;
      const [px, py] = localComponents("global-y", w, frames[i]);
      addDistributed(out.span.of(i), [px, px], [py, py], 0, frames[i].length);
    });
    return;
  }
  const m = index.member.get(load.member)!;
  const f = frames[m];
  const target = out.span.of(m);
  if (load.kind === "couple") {
    target.concentrated.push({ axis: 2, a: load.position, value: load.value });
    return;
  }
  if (load.kind === "point") {
    const [px, py] = localComponents(load.direction, load.value, f);
    if (px !== 0) target.concentrated.push({ axis: 0, a: load.position, value: px });
    if (py !== 0) target.concentrated.push({ axis: 1, a: load.position, value: py });
    return;
  }
  // Per projected length: a global-y load is given per horizontal length (|c| of the member length),
  // a global-x load per vertical length (|s|).
  let scale = 1;
  if (load.projected) scale = load.direction === "global-y" ? Math.abs(f.c) : Math.abs(f.s);
  const wa = load.wStart * scale;
  const wb = (load.wEnd ?? load.wStart) * scale;
  const [pxa, pya] = localComponents(load.direction, wa, f);
  const [pxb, pyb] = localComponents(load.direction, wb, f);
  addDistributed(target, [pxa, pxb], [pya, pyb], load.from ?? 0, load.to ?? f.length);
}

export interface IdIndex {
  readonly node: IdLookup;
  readonly member: IdLookup;
}

/** Resolves the loads of one case. The model must have passed validation (references and positions). */
export function resolveCaseLoads(model: Model, caseIndex: number, frames: ReadonlyArray<MemberFrame>, index: IdIndex): CaseLoads {
  const out: CaseLoads = {
    nodal: new Float64Array(DOFS_PER_NODE * model.nodes.length),
    span: new SpanTable(model.members.length),
  };
  for (const load of model.loadCases[caseIndex].loads) addLoad(load, model, frames, index, out);
  return out;
}

// Three-point Gauss–Legendre: exact for the polynomials of degree ≤ 5 integrated below.
const GAUSS_X = [-Math.sqrt(3 / 5), 0, Math.sqrt(3 / 5)];
const GAUSS_W = [5 / 9, 8 / 9, 5 / 9];

function integrateLinear(d: DistributedSpanLoad, g: (s: number) => number): number {
  const half = (d.b - d.a) / 2;
  const mid = (d.a + d.b) / 2;
  let sum = 0;
  for (let k = 0; k < 3; k++) {
    const s = mid + half * GAUSS_X[k];
    const w = d.wa + ((d.wb - d.wa) * (s - d.a)) / (d.b - d.a || 1);
    sum += GAUSS_W[k] * w * g(s);
  }
  return sum * half;
}

/**
 * Fixed-end forces of a member clamped at both ends (local, stiffness convention).
 *
 * Transverse: with LM(x) the moment at x of the loads on [0, x] (so that M(x) = −m_i + x·f_i + LM(x)), the
 * conditions v(L) = v'(L) = 0 on EI v'' = M give f_i = 12·LM₂/L³ − 6·LM₁/L² and m_i = f_i·L/2 + LM₁/L, where
 * LM₁ = ∫₀ᴸ LM = Σ q (L−s)²/2 and LM₂ = ∫₀ᴸ∫ LM = Σ q (L−s)³/6. The j end follows from statics.
 * Axial: N(x) = −f_xi − LN(x) with ∫₀ᴸ N = 0 gives f_xi = −Σ p (L−s)/L. Independent of EI and EA.
 */
export function fixedEndForces(loads: SpanLoads, L: number): Float64Array {
  let lm1 = 0;
  let lm2 = 0;
  let ln1 = 0;
  let totalX = 0;
  let totalY = 0;
  let momentAboutI = 0;
  for (const d of loads.distributed) {
    if (d.axis === 1) {
      lm1 += integrateLinear(d, (s) => (L - s) ** 2 / 2);
      lm2 += integrateLinear(d, (s) => (L - s) ** 3 / 6);
      totalY += integrateLinear(d, () => 1);
      momentAboutI += integrateLinear(d, (s) => s);
    } else {
      ln1 += integrateLinear(d, (s) => L - s);
      totalX += integrateLinear(d, () => 1);
    }
  }
  for (const p of loads.concentrated) {
    const r = L - p.a;
    if (p.axis === 1) {
      lm1 += (p.value * r * r) / 2;
      lm2 += (p.value * r * r * r) / 6;
      totalY += p.value;
      momentAboutI += p.value * p.a;
    } else if (p.axis === 2) {
      // A counter-clockwise couple lowers M to its right (M(x) = … − C for x > a).
      lm1 -= p.value * r;
      lm2 -= (p.value * r * r) / 2;
      momentAboutI += p.value;
    } else {
      ln1 += p.value * r;
      totalX += p.value;
    }
  }
  const fyi = (12 * lm2) / L ** 3 - (6 * lm1) / L ** 2;
  const mi = (fyi * L) / 2 + lm1 / L;
  const fyj = -fyi - totalY;
  const mj = -mi - fyj * L - momentAboutI;
  const fxi = -ln1 / L;
  const fxj = -fxi - totalX;
  return Float64Array.of(fxi, fyi, mi, fxj, fyj, mj);
}
