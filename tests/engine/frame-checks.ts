/**
 * Model transformations and independent checks shared by the property tests: splitting every member (with its
 * loads) in two, the resultant of a load case computed from the model alone, and node/member equilibrium.
 */
import { expect } from "vitest";
import { memberDiagram, memberEndForces, type AnalysisResult, type LoadInput, type ModelInput } from "@/lib/engine";
import { expectNear, seededRandom } from "./helpers";

type Node = ModelInput["nodes"][number];
type Members = NonNullable<ModelInput["members"]>;

function geometry(model: ModelInput) {
  const byId = new Map(model.nodes.map((n) => [n.id, n]));
  const members = new Map(
    (model.members ?? []).map((m) => {
      const a = byId.get(m.start)!;
      const b = byId.get(m.end)!;
      const L = Math.hypot(b.x - a.x, b.y - a.y);
      return [m.id, { member: m, a, b, L, c: (b.x - a.x) / L, s: (b.y - a.y) / L }];
    }),
  );
  return { byId, members };
}

/**
 * Each member becomes `<id>a` (start → new node) and `<id>b` (new node → end), split at a random 30–70 % of its
 * length; releases stay at the outer ends, and a truss member becomes two frame halves released at the outer ends
 * (the same structure). Every member load is split with it: point loads and couples go to the half they lie on,
 * distributed loads (partial, trapezoidal, projected) are cut at the new node with the intensity interpolated there.
 * Nodal loads, self-weight (via density), supports and settlements are unchanged.
 */
export function splitEveryMember(model: ModelInput, seed: number): { model: ModelInput; splitAt: Map<string, number> } {
  const rand = seededRandom(seed ^ 0x2545f491);
  const { members: geo } = geometry(model);
  const nodes: Node[] = [...model.nodes];
  const members: Members = [];
  const splitAt = new Map<string, number>();
  for (const m of model.members ?? []) {
    const { a, b, L } = geo.get(m.id)!;
    const t = 0.3 + 0.4 * rand();
    splitAt.set(m.id, t * L);
    nodes.push({ id: `${m.id}-mid`, x: a.x + t * (b.x - a.x), y: a.y + t * (b.y - a.y) });
    const truss = m.kind === "truss";
    if (truss && m.I === undefined)
      throw new Error(`splitEveryMember: truss member ${m.id} needs I to be split into frame halves`);
    const { releases, ...rest } = m;
    const startReleased = truss || releases?.startMoment === true;
    const endReleased = truss || releases?.endMoment === true;
    members.push({
      ...rest,
      kind: "frame",
      id: `${m.id}a`,
      end: `${m.id}-mid`,
      ...(startReleased ? { releases: { startMoment: true } } : {}),
    });
    members.push({
      ...rest,
      kind: "frame",
      id: `${m.id}b`,
      start: `${m.id}-mid`,
      ...(endReleased ? { releases: { endMoment: true } } : {}),
    });
  }
  const loadCases = (model.loadCases ?? []).map((lc) => ({
    ...lc,
    loads: (lc.loads ?? []).flatMap((l): LoadInput[] => {
      if (l.kind === "nodal" || l.kind === "self-weight") return [l];
      const cut = splitAt.get(l.member)!;
      if (l.kind === "point" || l.kind === "couple") {
        return l.position <= cut
          ? [{ ...l, member: `${l.member}a` }]
          : [{ ...l, member: `${l.member}b`, position: l.position - cut }];
      }
      const L = geo.get(l.member)!.L;
      const from = l.from ?? 0;
      const to = l.to ?? L;
      const wEnd = l.wEnd ?? l.wStart;
      const at = (x: number) => l.wStart + ((wEnd - l.wStart) * (x - from)) / (to - from);
      const out: LoadInput[] = [];
      if (from < cut - 1e-9 * L)
        out.push({ ...l, member: `${l.member}a`, from, to: Math.min(to, cut), wStart: l.wStart, wEnd: at(Math.min(to, cut)) });
      if (to > cut + 1e-9 * L)
        out.push({
          ...l,
          member: `${l.member}b`,
          from: Math.max(from, cut) - cut,
          to: to - cut,
          wStart: at(Math.max(from, cut)),
          wEnd,
        });
      return out;
    }),
  }));
  return { model: { ...model, nodes, members, loadCases }, splitAt };
}

/** A unit vector of a load's direction, in global axes, on a member with cosines (c, s). */
function globalDirection(direction: "local-x" | "local-y" | "global-x" | "global-y", c: number, s: number): [number, number] {
  return { "local-x": [c, s], "local-y": [-s, c], "global-x": [1, 0], "global-y": [0, 1] }[direction] as [number, number];
}

/**
 * Σ of a load case's applied loads as a force system — fx, fy and the moment about the global origin — computed
 * from the model alone (statics, common practice): a linear load w on [f, t] has resultant (t − f)(w_f + w_t)/2
 * and first moment (t − f)(w_f(2f + t) + w_t(f + 2t))/6 about the start; per projected length it is scaled by the
 * run |c| (global y) or the rise |s| (global x); self-weight is ρ·A·g (g = 9.80665 m/s², 3rd CGPM 1901, from
 * memory) downwards at mid-length. `scale` is the sum of magnitudes, for relative tolerances.
 */
export function loadResultant(
  model: ModelInput,
  caseId: string,
): { fx: number; fy: number; mz: number; scaleF: number; scaleM: number } {
  const { byId, members } = geometry(model);
  let [fx, fy, mz, scaleF, scaleM] = [0, 0, 0, 0, 0];
  const force = (X: number, Y: number, x: number, y: number) => {
    fx += X;
    fy += Y;
    mz += x * Y - y * X;
    scaleF += Math.abs(X) + Math.abs(Y);
    scaleM += Math.abs(x * Y) + Math.abs(y * X);
  };
  const lc = (model.loadCases ?? []).find((c) => c.id === caseId);
  if (!lc) throw new Error(`no load case ${caseId}`);
  for (const l of lc.loads ?? []) {
    if (l.kind === "nodal") {
      const n = byId.get(l.node)!;
      force(l.fx ?? 0, l.fy ?? 0, n.x, n.y);
      mz += l.mz ?? 0;
      scaleM += Math.abs(l.mz ?? 0);
      continue;
    }
    if (l.kind === "self-weight") {
      for (const { member, a, b, L } of members.values()) {
        if (!member.density) continue;
        force(0, -member.density * member.A * 9.80665 * (l.factor ?? 1) * L, (a.x + b.x) / 2, (a.y + b.y) / 2);
      }
      continue;
    }
    const { a, L, c, s } = members.get(l.member)!;
    if (l.kind === "couple") {
      mz += l.value;
      scaleM += Math.abs(l.value);
      continue;
    }
    const [ex, ey] = globalDirection(l.direction, c, s);
    if (l.kind === "point") {
      force(l.value * ex, l.value * ey, a.x + l.position * c, a.y + l.position * s);
      continue;
    }
    const scale = !l.projected ? 1 : l.direction === "global-y" ? Math.abs(c) : Math.abs(s);
    const [f, t] = [l.from ?? 0, l.to ?? L];
    const [wf, wt] = [l.wStart * scale, (l.wEnd ?? l.wStart) * scale];
    const W = ((t - f) * (wf + wt)) / 2;
    const first = ((t - f) * (wf * (2 * f + t) + wt * (f + 2 * t))) / 6;
    // Force W·e at a + s·(c, s) summed over s: moment = (a × e)·W + ((c, s) × e)·first.
    fx += W * ex;
    fy += W * ey;
    mz += (a.x * ey - a.y * ex) * W + (c * ey - s * ex) * first;
    scaleF += Math.abs(W);
    scaleM += Math.abs(W) * (Math.hypot(a.x, a.y) + L);
  }
  return { fx, fy, mz, scaleF, scaleM };
}

/**
 * Every node is in equilibrium (Σ member end forces in global axes − nodal loads = reactions, springs included),
 * and every member's N, V, M diagram, integrated from its start with its span loads, lands on its end forces.
 */
export function expectNodeAndMemberEquilibrium(model: ModelInput, r: AnalysisResult, caseId: string): void {
  const res = r.loadCases[caseId];
  const sum = new Float64Array(3 * model.nodes.length);
  const scale = new Float64Array(sum.length);
  const nodeIndex = new Map(model.nodes.map((n, i) => [n.id, i]));
  const { members } = geometry(model);
  expect(members.size).toBeGreaterThan(0);
  for (const { member: m, L, c, s } of members.values()) {
    const f = memberEndForces(r, m.id, caseId);
    for (const [node, end] of [
      [m.start, f.start],
      [m.end, f.end],
    ] as const) {
      const o = 3 * nodeIndex.get(node)!;
      const F = [c * end.fx - s * end.fy, s * end.fx + c * end.fy, end.mz];
      F.forEach((v, d) => {
        sum[o + d] += v;
        scale[o + d] += Math.abs(v);
      });
    }
    const atEnd = memberDiagram(r, m.id, caseId).valueAt(L, "left");
    const tol = 1e-8 * (Math.abs(f.start.fy) + Math.abs(f.end.fy) + Math.abs(f.start.fx) + 1);
    expectNear(atEnd.N, f.end.fx, tol);
    expectNear(atEnd.V, -f.end.fy, tol);
    expectNear(atEnd.M, f.end.mz, tol * L);
  }
  const loads = model.loadCases!.find((lc) => lc.id === caseId)!.loads ?? [];
  expect(loads.length).toBeGreaterThan(0);
  for (const load of loads) {
    if (load.kind !== "nodal") continue;
    const o = 3 * nodeIndex.get(load.node)!;
    [load.fx ?? 0, load.fy ?? 0, load.mz ?? 0].forEach((v, d) => (sum[o + d] -= v));
  }
  sum.forEach((v, i) => {
    const residual = v - res.reactions[i];
    expect(Math.abs(residual)).toBeLessThanOrEqual(1e-9 * (scale[i] + Math.abs(res.reactions[i])) + 1e-6);
  });
}
