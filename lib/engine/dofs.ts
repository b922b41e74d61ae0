/**
 * Degrees of freedom: their names and the node → equation map, in this one place.
 *
 * Each node has three global DOFs, in this order: ux (translation in X), uy (translation in Y), rz
 * (rotation about Z, counter-clockwise positive). The global DOF index of (node n, direction d) is 3n + d.
 *
 * Equations are numbered node-major over the FREE DOFs only (restrained ones drop out of K entirely), so a
 * node that keeps all three DOFs occupies three consecutive equations. When every node keeps the same number
 * of DOFs (or none), the sparse solver can order the compressed node graph (blockSize = that number).
 */
import type { Model, Restraint } from "./model";

export const DOF_NAMES = ["ux", "uy", "rz"] as const;
export type DofName = (typeof DOF_NAMES)[number];
export const DOFS_PER_NODE = DOF_NAMES.length;

/** Direction indices within a node's three DOFs. */
export const UX = 0;
export const UY = 1;
export const RZ = 2;

export function globalDof(node: number, direction: number): number {
  return DOFS_PER_NODE * node + direction;
}

/** The node and direction of a global DOF index (inverse of `globalDof`). */
export function dofLocation(g: number): { node: number; direction: number } {
  return { node: Math.floor(g / DOFS_PER_NODE), direction: g % DOFS_PER_NODE };
}

/** How a global DOF is treated. */
export const DofKind = {
  Free: 0,
  Fixed: 1,
  Spring: 2,
  Prescribed: 3,
  /** A rotation nothing resists (only truss members or released ends meet there): removed, not unstable. */
  NoStiffness: 4,
} as const;
export type DofKind = (typeof DofKind)[keyof typeof DofKind];

export interface DofMap {
  readonly nNodes: number;
  readonly nFree: number;
  /** Per global DOF: the equation number if free (≥ 0), else −1. */
  readonly equation: Int32Array;
  /** Equation → global DOF. */
  readonly freeToGlobal: Int32Array;
  readonly kind: Uint8Array;
  /** Spring stiffness per global DOF (0 where none). */
  readonly spring: Float64Array;
  /**
   * Free equations per node when every node that has any has the same number (3 for a frame with fixed
   * supports, 2 for a pin-jointed truss), else 1: the solver may then order the compressed node graph.
   */
  readonly blockSize: number;
}

function restraintKind(r: Restraint): DofKind {
  if (r === "free") return DofKind.Free;
  if (r === "fixed") return DofKind.Fixed;
  return r.kind === "spring" ? DofKind.Spring : DofKind.Prescribed;
}

/**
 * @param rotationallyStiff per node: whether any member end or support resists its rotation.
 */
export function buildDofMap(model: Model, rotationallyStiff: ReadonlyArray<boolean>): DofMap {
  const nNodes = model.nodes.length;
  const nDofs = DOFS_PER_NODE * nNodes;
  const equation = new Int32Array(nDofs).fill(-1);
  const kind = new Uint8Array(nDofs);
  const spring = new Float64Array(nDofs);
  const freeToGlobal: number[] = [];
  let blockSize = 0;
  model.nodes.forEach((node, n) => {
    let freeHere = 0;
    DOF_NAMES.forEach((name, d) => {
      const g = globalDof(n, d);
      const r: Restraint = node.support?.[name] ?? "free";
      let k: DofKind = restraintKind(r);
      if (k === DofKind.Free && name === "rz" && !rotationallyStiff[n]) k = DofKind.NoStiffness;
      kind[g] = k;
      if (typeof r === "object" && r.kind === "spring") spring[g] = r.stiffness;
      // Springs keep the DOF free: they add stiffness to K, and their reaction is −k·u.
      if (k === DofKind.Free || k === DofKind.Spring) {
        equation[g] = freeToGlobal.length;
        freeToGlobal.push(g);
        freeHere++;
      }
    });
    if (freeHere !== 0) blockSize = blockSize === 0 || blockSize === freeHere ? freeHere : 1;
  });
  return {
    nNodes,
    nFree: freeToGlobal.length,
    equation,
    freeToGlobal: Int32Array.from(freeToGlobal),
    kind,
    spring,
    blockSize: blockSize || 1,
  };
}

/** Prescribed displacement of a DOF in a load case (0 when fixed or not prescribed in that case). */
export function prescribedValue(model: Model, node: number, direction: number, loadCase: string): number {
  const r = model.nodes[node].support?.[DOF_NAMES[direction]];
  if (typeof r !== "object" || r.kind !== "prescribed") return 0;
  return r.loadCase === undefined || r.loadCase === loadCase ? r.value : 0;
}
