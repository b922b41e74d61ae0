/** Small builders and checks shared by the engine tests. */
import { analyze, type AnalysisResult, type LoadInput, type ModelInput } from "@/lib/engine";

export type SupportKind = "fixed" | "pin" | "roller" | "free";

const SUPPORTS: Record<SupportKind, { ux: "fixed" | "free"; uy: "fixed" | "free"; rz: "fixed" | "free" }> = {
  fixed: { ux: "fixed", uy: "fixed", rz: "fixed" },
  pin: { ux: "fixed", uy: "fixed", rz: "free" },
  roller: { ux: "free", uy: "fixed", rz: "free" },
  free: { ux: "free", uy: "free", rz: "free" },
};

export const E = 200e9;
export const I = 8e-5;
export const A = 5e-3;

/**
 * A horizontal line of members m1, m2, … between nodes n0, n1, … with the given supports, and one load case
 * "L" holding `loads`. Pins hold x so the axial direction is never a mechanism.
 */
export function lineBeam(spans: number[], supports: SupportKind[], loads: LoadInput[]): ModelInput {
  let x = 0;
  const xs = [0, ...spans.map((s) => (x += s))];
  return {
    nodes: xs.map((xi, i) => ({ id: `n${i}`, x: xi, y: 0, support: SUPPORTS[supports[i]] })),
    members: spans.map((_, i) => ({ id: `m${i + 1}`, start: `n${i}`, end: `n${i + 1}`, E, A, I })),
    loadCases: [{ id: "L", loads }],
  };
}

export function analyzeOrThrow(model: unknown): AnalysisResult {
  const out = analyze(model);
  if (!out.ok) throw new Error(`analysis failed: ${JSON.stringify(out.errors)}`);
  return out.result;
}

/**
 * Guards every comparison: the value under test must be a finite number (not undefined, NaN or ±Infinity), and
 * the expected value and tolerance finite, so a check can never pass vacuously (|x − ∞| ≤ ∞ is true).
 */
function finiteOrThrow(actual: number | undefined, expected: number, tolerance: number): number {
  if (typeof actual !== "number" || !Number.isFinite(actual))
    throw new Error(`expected a finite number near ${expected}, got ${actual}`);
  if (!Number.isFinite(expected) || !Number.isFinite(tolerance) || tolerance < 0) {
    throw new Error(`the expected value ${expected} ± ${tolerance} is not a usable reference`);
  }
  return actual;
}

/** |actual − expected| ≤ rel·max(|expected|, scale): relative, with a floor for expected values near 0. */
export function expectClose(actual: number | undefined, expected: number, rel = 1e-9, scale = 0): void {
  const tol = rel * Math.max(Math.abs(expected), scale);
  const value = finiteOrThrow(actual, expected, tol);
  if (!(Math.abs(value - expected) <= tol)) {
    throw new Error(`expected ${value} to be within ${tol} of ${expected}`);
  }
}

/** Every number reachable from value is finite (typed arrays included). */
export function expectAllFinite(value: unknown, path = "result"): void {
  if (typeof value === "number") {
    if (!Number.isFinite(value)) throw new Error(`${path} is ${value}`);
  } else if (ArrayBuffer.isView(value)) {
    const arr = value as unknown as ArrayLike<number>;
    for (let i = 0; i < arr.length; i++) if (!Number.isFinite(arr[i])) throw new Error(`${path}[${i}] is ${arr[i]}`);
  } else if (value !== null && typeof value === "object") {
    for (const [k, v] of Object.entries(value)) expectAllFinite(v, `${path}.${k}`);
  }
}

/** Deterministic pseudo-random numbers (mulberry32), so failing seeds can be replayed. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** |actual − expected| ≤ tolerance, for checks whose natural scale is not the expected value itself. */
export function expectNear(actual: number | undefined, expected: number, tolerance: number): void {
  const value = finiteOrThrow(actual, expected, tolerance);
  if (!(Math.abs(value - expected) <= tolerance)) {
    throw new Error(`expected ${value} to be within ${tolerance} of ${expected}`);
  }
}

/**
 * fast-check's run count for a property. `npm run mutation:engine` sets GUSSET_MUTATION and runs a quarter
 * of them (with a fixed seed, tests/engine/mutation-setup.ts), so one mutant costs seconds, not minutes;
 * `npm test` runs them all.
 */
export function runs(numRuns: number): { numRuns: number } {
  return { numRuns: process.env.GUSSET_MUTATION ? Math.max(4, Math.ceil(numRuns / 4)) : numRuns };
}

/**
 * A 20-member cantilever zig-zagging along x, fixed at n0 and loaded at its tip in load case A; its members
 * are `ratio` times stiffer axially and `ratio` times softer in bending than the usual section, so a large
 * ratio makes its equations ill-conditioned. Round-off leaves a residual that is not zero even at ratio 1.
 */
export function slenderChain(ratio: number): ModelInput {
  const nodes: NonNullable<ModelInput["nodes"]> = [{ id: "n0", x: 0, y: 0, support: { ux: "fixed", uy: "fixed", rz: "fixed" } }];
  const members: NonNullable<ModelInput["members"]> = [];
  for (let i = 1; i <= 20; i++) {
    nodes.push({ id: `n${i}`, x: i * 0.5, y: (i % 3) * 0.1 });
    members.push({ id: `m${i}`, start: `n${i - 1}`, end: `n${i}`, E: 200e9, A: A * ratio, I: I / ratio });
  }
  return { nodes, members, loadCases: [{ id: "A", loads: [{ kind: "nodal", node: "n20", fx: 1e3, fy: -5e3, mz: 0 }] }] };
}
