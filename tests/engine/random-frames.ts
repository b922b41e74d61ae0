/** Seeded random plane frames for the property tests. */
import type { LoadInput, ModelInput } from "@/lib/engine";
import { seededRandom } from "./helpers";

export interface RandomFrameOptions {
  /** Leave the structure unsupported (for rigid-body checks). */
  readonly unsupported?: boolean;
  /** Allow moment releases at one end of some beams. */
  readonly releases?: boolean;
}

/** A 1–3 storey, 1–3 bay frame with perturbed node positions, fixed bases and random sections and loads. */
export function randomFrame(seed: number, options: RandomFrameOptions = {}): ModelInput {
  const rand = seededRandom(seed);
  const between = (a: number, b: number) => a + (b - a) * rand();
  const storeys = 1 + Math.floor(rand() * 3);
  const bays = 1 + Math.floor(rand() * 3);
  const id = (s: number, b: number) => `N${s}_${b}`;
  const nodes: ModelInput["nodes"] = [];
  for (let s = 0; s <= storeys; s++) {
    for (let b = 0; b <= bays; b++) {
      const base = s === 0;
      nodes.push({
        id: id(s, b),
        x: b * 5 + (base ? 0 : between(-0.4, 0.4)),
        y: s * 3.2 + (base ? 0 : between(-0.3, 0.3)),
        ...(base && !options.unsupported ? { support: { ux: "fixed", uy: "fixed", rz: "fixed" } } : {}),
      });
    }
  }
  const members: NonNullable<ModelInput["members"]> = [];
  const section = () => ({ E: 200e9 * between(0.5, 1.5), A: between(2e-3, 2e-2), I: between(2e-5, 8e-4) });
  for (let s = 1; s <= storeys; s++) {
    for (let b = 0; b <= bays; b++) members.push({ id: `C${s}_${b}`, start: id(s - 1, b), end: id(s, b), ...section() });
    for (let b = 0; b < bays; b++) {
      const release = options.releases && rand() < 0.4 ? (rand() < 0.5 ? { startMoment: true } : { endMoment: true }) : undefined;
      members.push({
        id: `B${s}_${b}`,
        start: id(s, b),
        end: id(s, b + 1),
        ...section(),
        ...(release ? { releases: release } : {}),
      });
    }
  }
  const loads: LoadInput[] = [];
  for (let s = 1; s <= storeys; s++) {
    loads.push({ kind: "nodal", node: id(s, 0), fx: between(-20e3, 20e3), fy: between(-30e3, 0), mz: between(-5e3, 5e3) });
    for (let b = 0; b < bays; b++) {
      const member = `B${s}_${b}`;
      loads.push({ kind: "distributed", member, direction: "global-y", wStart: between(-30e3, -5e3) });
      loads.push({ kind: "point", member, direction: "local-y", position: between(0.5, 4), value: between(-40e3, 10e3) });
      loads.push({
        kind: "distributed",
        member,
        direction: "local-x",
        wStart: between(-2e3, 2e3),
        wEnd: between(-2e3, 2e3),
        from: 1,
        to: 3.5,
      });
      loads.push({ kind: "couple", member, position: between(0.5, 4), value: between(-8e3, 8e3) });
    }
    loads.push({ kind: "distributed", member: `C${s}_0`, direction: "global-x", wStart: between(1e3, 6e3), projected: true });
  }
  return { nodes, members, loadCases: [{ id: "L", loads }] };
}
