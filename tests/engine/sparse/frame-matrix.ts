import { SymmetricTripletBuilder, type SymmetricCsc } from "@/lib/engine/sparse";

/** Stiffness pattern and values of a regular multi-storey, multi-bay 2D frame: 3 equations (u, v, θ) per node, fixed base nodes dropped. */
export interface FrameMatrix {
  matrix: SymmetricCsc;
  storeys: number;
  bays: number;
  members: number;
  /** Equations per node, for FactorOptions.blockSize. */
  blockSize: 3;
}

const E = 2.1e8; // kN/m²
const COLUMN = { area: 1.5e-2, inertia: 2.5e-4, length: 3.5 };
const BEAM = { area: 1.0e-2, inertia: 4.0e-4, length: 6.0 };

/** 6×6 global stiffness of a frame member along the unit direction (c, s). */
export function frameElementStiffness(area: number, inertia: number, length: number, c: number, s: number): number[][] {
  const ea = (E * area) / length;
  const ei = (E * inertia) / length ** 3;
  const L = length;
  const local = [
    [ea, 0, 0, -ea, 0, 0],
    [0, 12 * ei, 6 * L * ei, 0, -12 * ei, 6 * L * ei],
    [0, 6 * L * ei, 4 * L * L * ei, 0, -6 * L * ei, 2 * L * L * ei],
    [-ea, 0, 0, ea, 0, 0],
    [0, -12 * ei, -6 * L * ei, 0, 12 * ei, -6 * L * ei],
    [0, 6 * L * ei, 2 * L * L * ei, 0, -6 * L * ei, 4 * L * L * ei],
  ];
  // T maps global (u, v, θ) to local; K = Tᵀ k T.
  const t = [
    [c, s, 0, 0, 0, 0],
    [-s, c, 0, 0, 0, 0],
    [0, 0, 1, 0, 0, 0],
    [0, 0, 0, c, s, 0],
    [0, 0, 0, -s, c, 0],
    [0, 0, 0, 0, 0, 1],
  ];
  const kt = local.map((row) => t[0].map((_, j) => row.reduce((sum, v, m) => sum + v * t[m][j], 0)));
  return t[0].map((_, i) => t[0].map((_, j) => t.reduce((sum, row, m) => sum + row[i] * kt[m][j], 0)));
}

/**
 * Frame with nodes on a (bays+1) × (storeys+1) grid; node (col, level) has equations 3·id .. 3·id+2.
 * Base nodes are fixed (equations dropped) unless `supported` is false, which leaves a floating,
 * singular structure.
 */
export function buildFrameMatrix(storeys: number, bays: number, { supported = true } = {}): FrameMatrix {
  const perLevel = bays + 1;
  const firstLevel = supported ? 1 : 0;
  const n = 3 * perLevel * (storeys + 1 - firstLevel);
  const builder = new SymmetricTripletBuilder(n, 42 * perLevel * storeys + 16);
  const columnK = frameElementStiffness(COLUMN.area, COLUMN.inertia, COLUMN.length, 0, 1);
  const beamK = frameElementStiffness(BEAM.area, BEAM.inertia, BEAM.length, 1, 0);
  // Fixed base nodes get equation -1 and are dropped.
  const firstEquation = (col: number, level: number): number =>
    level < firstLevel ? -1 : 3 * ((level - firstLevel) * perLevel + col);
  const addMember = (k: number[][], a: number, b: number): void => {
    const dofs = [a, a + 1, a + 2, b, b + 1, b + 2].map((d, idx) => ((idx < 3 ? a : b) < 0 ? -1 : d));
    for (let r = 0; r < 6; r++) {
      if (dofs[r] < 0) continue;
      // Lower triangle only: the builder mirrors, and adding both would double the off-diagonals.
      for (let s = 0; s <= r; s++) if (dofs[s] >= 0) builder.add(dofs[r], dofs[s], k[r][s]);
    }
  };
  let members = 0;
  for (let level = 1; level <= storeys; level++) {
    for (let col = 0; col <= bays; col++) {
      addMember(columnK, firstEquation(col, level - 1), firstEquation(col, level));
      members++;
      if (col < bays) {
        addMember(beamK, firstEquation(col, level), firstEquation(col + 1, level));
        members++;
      }
    }
  }
  return { matrix: builder.toCsc(), storeys, bays, members, blockSize: 3 };
}
