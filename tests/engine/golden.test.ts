/**
 * Golden results: the canonical results of every starting example (content/engine-examples/*.json), stored in
 * tests/engine/golden/<example>.json with the ENGINE_VERSION that made them. The numbers may not change while
 * ENGINE_VERSION stays the same; when a change is intended, bump ENGINE_VERSION (lib/engine/version.ts) and run
 * `npm run engine:golden`, which rewrites the files (this test with GUSSET_WRITE_GOLDEN=1), then review the diff.
 *
 * Numbers compare at 1e-12 relative. Near zero the scale is the largest value of the same quantity in the file
 * (the same path with ids wildcarded), and for the equilibrium residuals, which are rounding by design, the
 * largest end force or reaction; the dimensionless residuals compare at 1e-12 absolute. The position of an
 * extreme that another sampled point of its diagram ties with is not compared: rounding picks one of them.
 */
import { describe, it, expect } from "vitest";
import { existsSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { analyze, ENGINE_VERSION, resultToCanonicalJson } from "@/lib/engine";

const root = path.resolve(import.meta.dirname, "../..");
const examplesDir = path.join(root, "content/engine-examples");
const goldenDir = path.join(import.meta.dirname, "golden");
const REGENERATE =
  "bump ENGINE_VERSION in lib/engine/version.ts if you have not, then run npm run engine:golden and review the diff";
/** Sampled diagrams are part of the golden results, so a change along members is caught too. */
const POINTS = 5;
const RELATIVE = 1e-12;

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };

interface Golden {
  readonly engineVersion: string;
  readonly example: string;
  readonly points: number;
  readonly result?: Json;
  readonly errors?: Json;
}

function currentOutcome(example: string): Pick<Golden, "result" | "errors"> {
  const out = analyze(JSON.parse(readFileSync(path.join(examplesDir, example), "utf8")));
  if (!out.ok) return { errors: JSON.parse(JSON.stringify(out.errors)) as Json };
  const result = JSON.parse(resultToCanonicalJson(out.result, { points: POINTS })) as { [key: string]: Json };
  // The source hash changes with every edit of the engine; the numbers are what must not.
  delete result.engineSourceHash;
  return { result };
}

/** Keys that hold ids (nodes, members, cases, …) as their children: wildcarded when grouping quantities. */
const ID_CONTAINERS = new Set([
  "loadCases",
  "combinations",
  "envelopes",
  "displacements",
  "reactions",
  "endForces",
  "diagramExtremes",
  "diagrams",
  "factors",
]);

function walkNumbers(value: Json, at: string[], visit: (path: string[], v: number) => void): void {
  if (typeof value === "number") visit(at, value);
  else if (Array.isArray(value)) value.forEach((v, i) => walkNumbers(v, [...at, String(i)], visit));
  else if (value !== null && typeof value === "object")
    for (const [k, v] of Object.entries(value)) walkNumbers(v, [...at, k], visit);
}

function groupOf(at: string[]): string {
  return at.map((seg, i) => (i > 0 && ID_CONTAINERS.has(at[i - 1]) ? "*" : /^\d+$/.test(seg) ? "#" : seg)).join(".");
}

/** Scale below which a value counts as zero, per quantity. */
function scales(golden: Json): (at: string[]) => number {
  const byGroup = new Map<string, number>();
  let forces = 0;
  walkNumbers(golden, [], (at, v) => {
    const g = groupOf(at);
    byGroup.set(g, Math.max(byGroup.get(g) ?? 0, Math.abs(v)));
    if (at.includes("reactions") || at.includes("endForces")) forces = Math.max(forces, Math.abs(v));
  });
  return (at) => {
    const last = at[at.length - 1];
    if (last === "relativeResidual" || (at.includes("equilibrium") && last === "relative")) return 1;
    if (at.includes("equilibrium")) return forces;
    return byGroup.get(groupOf(at)) ?? 0;
  };
}

type JsonObject = { [key: string]: Json };

function lookup(value: Json, segments: ReadonlyArray<string>): Json | undefined {
  let v: Json | undefined = value;
  for (const seg of segments) v = v !== null && typeof v === "object" && !Array.isArray(v) ? (v as JsonObject)[seg] : undefined;
  return v;
}

/**
 * The position of an extreme is ambiguous when another sampled point of the same diagram reaches the same value
 * (a constant diagram, a relative deflection that is zero at both ends, equal end moments of a symmetric beam):
 * rounding then decides which of them is reported. Envelope extremes are checked on the governing result.
 */
function ambiguousPosition(golden: Json, keys: string[], tolerance: (value: number) => number): boolean {
  const n = keys.length;
  if (keys[n - 1] !== "x" || !["max", "min"].includes(keys[n - 2])) return false;
  const extreme = lookup(golden, keys.slice(0, -1)) as { value?: Json; x?: Json; from?: Json } | undefined;
  if (typeof extreme?.value !== "number" || typeof extreme.x !== "number") return false;
  const quantity = keys[n - 3];
  let samples: Json | undefined;
  const d = keys.indexOf("diagrams");
  if (d >= 0 && keys[d + 2] === "extremes") samples = lookup(golden, [...keys.slice(0, d + 2), "samples"]);
  const e = keys.indexOf("diagramExtremes");
  if (e >= 0 && keys[e - 2] === "envelopes" && typeof extreme.from === "string") {
    const from = extreme.from;
    const base = keys.slice(0, e - 2);
    for (const kind of ["loadCases", "combinations"])
      samples ??= lookup(golden, [...base, kind, from, "diagrams", keys[e + 1], "samples"]);
  }
  const xs = lookup(samples ?? null, ["x"]);
  const values = lookup(samples ?? null, [quantity]);
  if (!Array.isArray(xs) || !Array.isArray(values)) return false;
  const length = Number(xs[xs.length - 1]);
  const tol = tolerance(extreme.value);
  const x = extreme.x;
  const v = extreme.value;
  return values.some((s, i) => typeof s === "number" && Math.abs(s - v) <= tol && Math.abs(Number(xs[i]) - x) > 1e-9 * length);
}

/** Every difference between the golden and the current JSON, as readable lines. */
function differences(golden: Json, current: Json): string[] {
  const out: string[] = [];
  const scaleOf = scales(golden);
  const visit = (g: Json, c: Json, at: string[]) => {
    const where = at.join(".") || "(the whole file)";
    if (typeof g === "number" && typeof c === "number") {
      const valueScale = scaleOf([...at.slice(0, -1), "value"]);
      if (ambiguousPosition(golden, at, (v) => 1e-9 * Math.max(Math.abs(v), valueScale))) return;
      const tol = RELATIVE * Math.max(Math.abs(g), scaleOf(at));
      if (!(Math.abs(c - g) <= tol)) out.push(`${where}: ${g} in the golden results, now ${c}`);
    } else if (Array.isArray(g) && Array.isArray(c)) {
      if (g.length !== c.length) out.push(`${where}: ${g.length} entries in the golden results, now ${c.length}`);
      else g.forEach((v, i) => visit(v, c[i], [...at, String(i)]));
    } else if (
      g !== null &&
      c !== null &&
      typeof g === "object" &&
      typeof c === "object" &&
      !Array.isArray(g) &&
      !Array.isArray(c)
    ) {
      for (const k of new Set([...Object.keys(g), ...Object.keys(c)])) {
        if (!(k in c)) out.push(`${[...at, k].join(".")}: in the golden results, now missing`);
        else if (!(k in g)) out.push(`${[...at, k].join(".")}: new, not in the golden results`);
        else visit(g[k], c[k], [...at, k]);
      }
    } else if (JSON.stringify(g) !== JSON.stringify(c))
      out.push(`${where}: ${JSON.stringify(g)} in the golden results, now ${JSON.stringify(c)}`);
  };
  visit(golden, current, []);
  return out;
}

const examples = readdirSync(examplesDir)
  .filter((f) => f.endsWith(".json"))
  .sort();

describe("golden results of the starting examples", () => {
  it("covers every example", () => {
    expect(examples.length).toBeGreaterThan(0);
  });

  for (const example of examples) {
    const goldenFile = path.join(goldenDir, example);
    it(`${example}: the same numbers as tests/engine/golden/${example} while ENGINE_VERSION is unchanged`, () => {
      const current = currentOutcome(example);
      if (process.env.GUSSET_WRITE_GOLDEN) {
        const golden: Golden = {
          engineVersion: ENGINE_VERSION,
          example: `content/engine-examples/${example}`,
          points: POINTS,
          ...current,
        };
        writeFileSync(goldenFile, `${JSON.stringify(golden, null, 1)}\n`);
        return;
      }
      if (!existsSync(goldenFile))
        throw new Error(`no golden results for ${example}: run npm run engine:golden and commit tests/engine/golden/${example}`);
      const golden = JSON.parse(readFileSync(goldenFile, "utf8")) as Golden;
      if (golden.engineVersion !== ENGINE_VERSION) {
        throw new Error(
          `ENGINE_VERSION is ${ENGINE_VERSION} but tests/engine/golden/${example} was made by ${golden.engineVersion}: run npm run engine:golden and review the diff`,
        );
      }
      const diffs = differences(
        { result: golden.result ?? null, errors: golden.errors ?? null },
        { result: current.result ?? null, errors: current.errors ?? null },
      );
      if (diffs.length > 0) {
        const shown = diffs.slice(0, 12).join("\n  ");
        throw new Error(
          `${example}: the results changed while ENGINE_VERSION is still ${ENGINE_VERSION} (${diffs.length} differences):\n  ${shown}\nIf the change is intended, ${REGENERATE}.`,
        );
      }
    });
  }
});

describe("the golden comparison", () => {
  const golden: Json = {
    loadCases: {
      G: {
        displacements: { A: { ux: 1e-3, uy: 0 }, B: { ux: 2e-3, uy: -5e-4 } },
        equilibrium: { fx: 1e-11, relative: 1e-16 },
        endForces: { m: { start: { fx: 1e5 } } },
      },
    },
  };
  /** The differences after setting (or, with undefined, deleting) one entry of a copy. */
  const change = (keys: string[], value: Json | undefined): string[] => {
    const copy = JSON.parse(JSON.stringify(golden)) as JsonObject;
    const parent = lookup(copy, keys.slice(0, -1)) as JsonObject;
    if (value === undefined) delete parent[keys[keys.length - 1]];
    else parent[keys[keys.length - 1]] = value;
    return differences(golden, copy);
  };
  const A = ["loadCases", "G", "displacements", "A"];
  const equilibrium = ["loadCases", "G", "equilibrium"];

  it("accepts rounding-level changes and rejects anything larger", () => {
    expect(change([...A, "ux"], 1e-3)).toEqual([]);
    expect(change([...A, "ux"], 1e-3 * (1 + 5e-13))).toEqual([]);
    expect(change([...A, "ux"], 1e-3 * (1 + 1e-9))).toHaveLength(1);
    // A zero compares against the largest value of the same quantity, and a residual against the forces.
    expect(change([...A, "uy"], 1e-19)).toEqual([]);
    expect(change([...A, "uy"], 1e-12)).toHaveLength(1);
    expect(change([...equilibrium, "fx"], -3e-11)).toEqual([]);
    expect(change([...equilibrium, "fx"], 1)).toHaveLength(1);
    expect(change([...equilibrium, "relative"], 4e-16)).toEqual([]);
  });

  it("does not compare the position of an extreme that another sampled point ties with", () => {
    const beam = (xMax: number, xMin: number) => ({
      loadCases: {
        G: {
          diagrams: {
            b: {
              extremes: { M: { max: { value: 10, x: xMax }, min: { value: -20, x: xMin } } },
              samples: { x: [0, 2, 4], M: [-20, 10, -20] },
            },
          },
        },
      },
    });
    // Both ends reach the minimum: either may be reported. The maximum is unique.
    expect(differences(beam(2, 0), beam(2, 4))).toEqual([]);
    expect(differences(beam(2, 0), beam(2.5, 0))).toEqual([
      "loadCases.G.diagrams.b.extremes.M.max.x: 2 in the golden results, now 2.5",
    ]);
  });

  it("rejects changed structure and text", () => {
    expect(change(["loadCases", "G", "displacements", "B"], undefined)).toEqual([
      "loadCases.G.displacements.B: in the golden results, now missing",
    ]);
    expect(change(["loadCases", "G", "displacements", "B", "rz"], 0)).toEqual([
      "loadCases.G.displacements.B.rz: new, not in the golden results",
    ]);
    expect(change([...A, "ux"], "1e-3")).toHaveLength(1);
  });
});
