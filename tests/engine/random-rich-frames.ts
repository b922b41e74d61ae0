/**
 * Seeded random plane frames with everything the engine supports, for the property tests: up to the given number
 * of storeys and bays, members drawn in either direction (so direction cosines take every sign), beams released
 * at one or both ends, truss diagonals, fixed, pinned, spring and settling supports, self-weight and every kind
 * of member load.
 */
import type { LoadInput, ModelInput } from "@/lib/engine";
import { seededRandom } from "./helpers";

export interface RichFrameOptions {
  readonly maxStoreys: number;
  readonly maxBays: number;
}

type Members = NonNullable<ModelInput["members"]>;
type Support = NonNullable<ModelInput["nodes"][number]["support"]>;

export function randomRichFrame(seed: number, { maxStoreys, maxBays }: RichFrameOptions): ModelInput {
  const rand = seededRandom(seed);
  const between = (a: number, b: number) => a + (b - a) * rand();
  const chance = (p: number) => rand() < p;
  const storeys = 1 + Math.floor(rand() * maxStoreys);
  const bays = 1 + Math.floor(rand() * maxBays);
  const id = (s: number, b: number) => `N${s}_${b}`;
  const where = new Map<string, { x: number; y: number }>();
  const nodes: ModelInput["nodes"] = [];
  for (let s = 0; s <= storeys; s++) {
    for (let b = 0; b <= bays; b++) {
      const base = s === 0;
      const x = b * 5 + (base ? 0 : between(-0.4, 0.4));
      const y = s * 3.2 + (base ? 0 : between(-0.3, 0.3));
      where.set(id(s, b), { x, y });
      nodes.push({ id: id(s, b), x, y, ...(base ? { support: baseSupport(b, rand) } : {}) });
    }
  }

  const members: Members = [];
  const lengths = new Map<string, number>();
  const section = () => ({
    E: 200e9 * between(0.5, 1.5),
    A: between(2e-3, 2e-2),
    I: between(2e-5, 8e-4),
    density: between(2400, 7850),
  });
  const add = (memberId: string, a: string, b: string, extra: Partial<Members[number]> = {}) => {
    const [start, end] = chance(0.3) ? [b, a] : [a, b];
    const p = where.get(start)!;
    const q = where.get(end)!;
    lengths.set(memberId, Math.hypot(q.x - p.x, q.y - p.y));
    members.push({ id: memberId, start, end, ...section(), ...extra });
  };
  const releaseOptions = [undefined, { startMoment: true }, { endMoment: true }, { startMoment: true, endMoment: true }];
  for (let s = 1; s <= storeys; s++) {
    for (let b = 0; b <= bays; b++) add(`C${s}_${b}`, id(s - 1, b), id(s, b));
    for (let b = 0; b < bays; b++) {
      const release = releaseOptions[Math.floor(rand() * 4)];
      add(`B${s}_${b}`, id(s, b), id(s, b + 1), release ? { releases: release } : {});
      // A truss diagonal in some panels; with I, so its bending under span loads (and its split halves) are defined.
      if (chance(0.3)) add(`D${s}_${b}`, id(s - 1, b), id(s, b + 1), { kind: "truss" });
    }
  }

  const loads: LoadInput[] = [{ kind: "self-weight", factor: between(0.8, 1.35) }];
  const position = (m: string) => between(0.05, 0.95) * lengths.get(m)!;
  const range = (m: string) => {
    const L = lengths.get(m)!;
    const from = between(0, 0.6) * L;
    return { from, to: from + between(0.1, 0.4) * L };
  };
  for (let s = 1; s <= storeys; s++) {
    loads.push({
      kind: "nodal",
      node: id(s, Math.floor(rand() * (bays + 1))),
      fx: between(-20e3, 20e3),
      fy: between(-30e3, 0),
      mz: between(-5e3, 5e3),
    });
  }
  // A load straight onto a support: it goes to the reaction without straining anything.
  loads.push({ kind: "nodal", node: id(0, Math.floor(rand() * (bays + 1))), fx: between(-5e3, 5e3), fy: between(-10e3, 10e3) });
  for (const m of members) {
    const member = m.id;
    if (member.startsWith("B")) {
      if (chance(0.6)) loads.push({ kind: "distributed", member, direction: "global-y", wStart: between(-30e3, -5e3) });
      if (chance(0.5))
        loads.push({
          kind: "distributed",
          member,
          direction: "local-y",
          wStart: between(-20e3, 5e3),
          wEnd: between(-20e3, 5e3),
          ...range(member),
        });
      if (chance(0.5))
        loads.push({
          kind: "distributed",
          member,
          direction: "local-x",
          wStart: between(-4e3, 4e3),
          wEnd: between(-4e3, 4e3),
          ...range(member),
        });
      if (chance(0.5))
        loads.push({
          kind: "distributed",
          member,
          direction: "global-y",
          wStart: between(-8e3, 0),
          wEnd: between(-8e3, 0),
          projected: true,
          ...range(member),
        });
      if (chance(0.5))
        loads.push({ kind: "point", member, direction: "local-y", position: position(member), value: between(-40e3, 10e3) });
      if (chance(0.4))
        loads.push({ kind: "point", member, direction: "global-y", position: position(member), value: between(-40e3, 0) });
      if (chance(0.4))
        loads.push({ kind: "point", member, direction: "global-x", position: position(member), value: between(-10e3, 10e3) });
      if (chance(0.4))
        loads.push({ kind: "point", member, direction: "local-x", position: position(member), value: between(-20e3, 20e3) });
      if (chance(0.5)) loads.push({ kind: "couple", member, position: position(member), value: between(-8e3, 8e3) });
    } else if (member.startsWith("C")) {
      if (chance(0.5))
        loads.push({ kind: "distributed", member, direction: "global-x", wStart: between(1e3, 6e3), projected: true });
      if (chance(0.3))
        loads.push({
          kind: "distributed",
          member,
          direction: "global-x",
          wStart: between(-3e3, 3e3),
          wEnd: between(-3e3, 3e3),
          ...range(member),
        });
      if (chance(0.3))
        loads.push({ kind: "point", member, direction: "global-x", position: position(member), value: between(-10e3, 10e3) });
      if (chance(0.2)) loads.push({ kind: "couple", member, position: position(member), value: between(-5e3, 5e3) });
    } else {
      if (chance(0.5))
        loads.push({ kind: "distributed", member, direction: "global-y", wStart: between(-3e3, 0), projected: true });
      if (chance(0.3))
        loads.push({
          kind: "distributed",
          member,
          direction: "global-x",
          wStart: between(-2e3, 2e3),
          wEnd: between(-2e3, 2e3),
          ...range(member),
        });
      if (chance(0.3))
        loads.push({ kind: "point", member, direction: "local-y", position: position(member), value: between(-5e3, 5e3) });
    }
  }
  return { nodes, members, loadCases: [{ id: "L", loads }] };
}

/** The first base node is always fully fixed (the frame can never sway freely); the others vary. */
function baseSupport(b: number, rand: () => number): Support {
  const r = b === 0 ? 0 : rand();
  const between = (lo: number, hi: number) => lo + (hi - lo) * rand();
  if (r < 0.3) return { ux: "fixed", uy: "fixed", rz: "fixed" };
  if (r < 0.5) return { ux: "fixed", uy: "fixed" };
  if (r < 0.75)
    return {
      ux: "fixed",
      uy: { kind: "spring", stiffness: between(5e7, 5e8) },
      rz: { kind: "spring", stiffness: between(1e6, 1e8) },
    };
  return { ux: "fixed", uy: { kind: "prescribed", value: between(-0.02, -0.002), loadCase: "L" }, rz: "fixed" };
}
