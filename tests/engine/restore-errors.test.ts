/**
 * restoreResult refuses a stored result that does not fit its model, and says where: each case spoils one
 * thing in the stored JSON of a small run and expects every error, word for word, in order. A calc sheet
 * that cannot be drawn again must say which stored value is at fault. (common practice)
 */
import { describe, expect, it } from "vitest";
import { analyze, restoreResult, resultToJson, type AnalysisResult, type ModelInput } from "@/lib/engine";
import { A, E, I } from "./helpers";

const MODEL: ModelInput = {
  nodes: [
    { id: "A", x: 0, y: 0, support: { ux: "fixed", uy: "fixed", rz: "fixed" } },
    { id: "B", x: 4, y: 0 },
  ],
  members: [{ id: "AB", start: "A", end: "B", E, A, I }],
  loadCases: [
    { id: "G", loads: [{ kind: "nodal", node: "B", fy: -1000 }] },
    { id: "Q", loads: [{ kind: "nodal", node: "B", fx: 500 }] },
  ],
  combinations: [{ id: "C", factors: { G: 1.35, Q: 1.5 } }],
  envelopes: [{ id: "E", of: ["G", "C"] }],
};

type Json = Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any

/**
 * The small run and its stored JSON, analysed afresh inside each test that asks (not at module level), so that
 * mutation testing's per-test coverage sees which test reaches which line of the engine.
 */
function smallRun(): { original: AnalysisResult; stored: string } {
  const analysed = analyze(MODEL);
  if (!analysed.ok) throw new Error(JSON.stringify(analysed.errors));
  return { original: analysed.result, stored: JSON.stringify(resultToJson(analysed.result)) };
}

/** The messages restoreResult gives after `spoil` changes the stored JSON; each must start with its own path. */
function messagesAfter(spoil: (stored: Json) => void): string[] {
  const stored = JSON.parse(smallRun().stored) as Json;
  spoil(stored);
  const out = restoreResult(MODEL, stored);
  if (out.ok) throw new Error("expected restoreResult to refuse");
  for (const e of out.errors) {
    expect(e.kind).toBe("invalid-stored-result");
    if (e.kind === "invalid-stored-result") expect(e.message.startsWith(`${e.path}: `)).toBe(true);
  }
  return out.errors.map((e) => e.message);
}

const NUMBER = "expected a finite number";

/** Everything readCase says about a stored case that is not an object at all. */
function wholeCaseMissing(path: string, kind: string): string[] {
  return [
    `${path}: expected an object`,
    `${path}.kind: expected "${kind}"`,
    ...(kind === "combination" ? [`${path}.factors: expected an object`] : []),
    `${path}.equilibrium: expected an object`,
    ...["fx", "fy", "mz", "relative"].map((f) => `${path}.equilibrium.${f}: ${NUMBER}`),
    `${path}.displacements: expected an object`,
    `${path}.reactions: expected an object`,
    `${path}.endForces: expected an object`,
    `${path}.relativeResidual: ${NUMBER}`,
  ];
}

/** Everything said about envelope E when it is not stored at all. */
const ENVELOPE_E_MISSING = [
  "envelopes.E: missing",
  "envelopes.E: expected an object",
  'envelopes.E.of: expected ["G","C"], the model\'s envelope',
  "envelopes.E.displacements: expected an object",
  "envelopes.E.reactions: expected an object",
  "envelopes.E.endForces: expected an object",
];

const CASES: [string, (s: Json) => void, string[]][] = [
  [
    "the analysis of another kind",
    (s) => (s.analysis.kind = "p-delta"),
    ['analysis.kind: expected "linear", the model\'s analysis'],
  ],
  ["the analysis not an object", (s) => (s.analysis = "linear"), ["analysis: expected an object"]],
  ["a load case the model does not have", (s) => (s.loadCases.X = s.loadCases.G), ["loadCases.X: not in the model"]],
  ["a load case missing", (s) => delete s.loadCases.Q, ["loadCases.Q: missing", ...wholeCaseMissing("loadCases.Q", "load-case")]],
  [
    "the load cases an array",
    (s) => (s.loadCases = [s.loadCases.G]),
    [
      "loadCases: expected an object",
      "loadCases.G: missing",
      "loadCases.Q: missing",
      ...wholeCaseMissing("loadCases.G", "load-case"),
      ...wholeCaseMissing("loadCases.Q", "load-case"),
    ],
  ],
  [
    "a load case stored as a combination",
    (s) => (s.loadCases.G.kind = "combination"),
    ['loadCases.G.kind: expected "load-case"'],
  ],
  [
    "a combination stored as a load case",
    (s) => (s.combinations.C.kind = "load-case"),
    ['combinations.C.kind: expected "combination"'],
  ],
  [
    "a combination missing",
    (s) => delete s.combinations.C,
    ["combinations.C: missing", ...wholeCaseMissing("combinations.C", "combination")],
  ],
  [
    "the combinations not an object",
    (s) => (s.combinations = null),
    ["combinations: expected an object", "combinations.C: missing", ...wholeCaseMissing("combinations.C", "combination")],
  ],
  ["a combination the model does not have", (s) => (s.combinations.D = s.combinations.C), ["combinations.D: not in the model"]],
  ["a factor changed", (s) => (s.combinations.C.factors.Q = 1.6), ["combinations.C.factors.Q: stored 1.6, the model says 1.5"]],
  [
    "a factor stored as text",
    (s) => (s.combinations.C.factors.G = "1.35"),
    ["combinations.C.factors.G: stored 1.35, the model says 1.35"],
  ],
  ["a factor missing", (s) => delete s.combinations.C.factors.G, ["combinations.C.factors.G: missing"]],
  [
    "a factor for a case the combination does not use",
    (s) => (s.combinations.C.factors.X = 1),
    ["combinations.C.factors.X: not in the model"],
  ],
  ["the factors not an object", (s) => (s.combinations.C.factors = null), ["combinations.C.factors: expected an object"]],
  ["an equilibrium sum stored as text", (s) => (s.loadCases.G.equilibrium.fy = "0"), [`loadCases.G.equilibrium.fy: ${NUMBER}`]],
  [
    "an equilibrium sum that is not finite",
    (s) => (s.loadCases.Q.equilibrium.mz = Infinity),
    [`loadCases.Q.equilibrium.mz: ${NUMBER}`],
  ],
  [
    "the relative equilibrium residual missing",
    (s) => delete s.combinations.C.equilibrium.relative,
    [`combinations.C.equilibrium.relative: ${NUMBER}`],
  ],
  [
    "the equilibrium residual missing",
    (s) => delete s.loadCases.G.equilibrium,
    [
      "loadCases.G.equilibrium: expected an object",
      ...["fx", "fy", "mz", "relative"].map((f) => `loadCases.G.equilibrium.${f}: ${NUMBER}`),
    ],
  ],
  [
    "the solver residual not a number",
    (s) => (s.loadCases.G.relativeResidual = null),
    [`loadCases.G.relativeResidual: ${NUMBER}`],
  ],
  [
    "a node the model does not have",
    (s) => (s.loadCases.G.displacements.Z = { ux: 0, uy: 0, rz: 0 }),
    ["loadCases.G.displacements.Z: not in the model"],
  ],
  [
    "a node's displacements not an object",
    (s) => (s.loadCases.G.displacements.B = [0, 0, 0]),
    ["loadCases.G.displacements.B: expected an object"],
  ],
  ["a rotation missing", (s) => delete s.loadCases.G.displacements.B.rz, [`loadCases.G.displacements.B.rz: ${NUMBER}`]],
  [
    "the displacements an array",
    (s) => (s.loadCases.G.displacements = [0, 0, 0]),
    ["loadCases.G.displacements: expected an object"],
  ],
  [
    "a reaction at a node the model does not have",
    (s) => (s.loadCases.G.reactions.Z = { fx: 0, fy: 0, mz: 0 }),
    ["loadCases.G.reactions.Z: not in the model"],
  ],
  ["a reaction moment stored as text", (s) => (s.loadCases.G.reactions.A.mz = "4000"), [`loadCases.G.reactions.A.mz: ${NUMBER}`]],
  [
    "a member the model does not have",
    (s) => (s.loadCases.G.endForces.XY = s.loadCases.G.endForces.AB),
    ["loadCases.G.endForces.XY: not in the model"],
  ],
  ["a member's end forces missing", (s) => delete s.loadCases.G.endForces.AB, ["loadCases.G.endForces.AB: missing"]],
  [
    "a member's end forces not an object",
    (s) => (s.loadCases.G.endForces.AB = 0),
    ["loadCases.G.endForces.AB: expected an object"],
  ],
  [
    "the forces at a member's start missing",
    (s) => delete s.loadCases.G.endForces.AB.start,
    ["loadCases.G.endForces.AB.start: expected an object"],
  ],
  [
    "a force at a member's end missing",
    (s) => delete s.loadCases.Q.endForces.AB.end.fx,
    [`loadCases.Q.endForces.AB.end.fx: ${NUMBER}`],
  ],
  ["the end forces not an object", (s) => (s.loadCases.G.endForces = null), ["loadCases.G.endForces: expected an object"]],
  [
    "an envelope of other results",
    (s) => (s.envelopes.E.of = ["C", "G"]),
    ['envelopes.E.of: expected ["G","C"], the model\'s envelope'],
  ],
  [
    "an envelope with one of its results changed",
    (s) => (s.envelopes.E.of = ["G", "Q"]),
    ['envelopes.E.of: expected ["G","C"], the model\'s envelope'],
  ],
  [
    "an envelope of fewer results",
    (s) => (s.envelopes.E.of = ["G"]),
    ['envelopes.E.of: expected ["G","C"], the model\'s envelope'],
  ],
  [
    "an envelope's list not an array",
    (s) => (s.envelopes.E.of = "G,C"),
    ['envelopes.E.of: expected ["G","C"], the model\'s envelope'],
  ],
  ["the envelopes an array", (s) => (s.envelopes = [s.envelopes.E]), ["envelopes: expected an object", ...ENVELOPE_E_MISSING]],
  ["an envelope the model does not have", (s) => (s.envelopes.F = s.envelopes.E), ["envelopes.F: not in the model"]],
  ["an envelope missing", (s) => delete s.envelopes.E, ENVELOPE_E_MISSING],
  [
    "an envelope's governing result not one it envelopes",
    (s) => (s.envelopes.E.displacements.B.uy.maxFrom = "Q"),
    ["envelopes.E.displacements.B.uy.maxFrom: not one of the enveloped results"],
  ],
  [
    "an envelope's governing result not a string",
    (s) => (s.envelopes.E.reactions.A.fy.minFrom = 1),
    [
      "envelopes.E.reactions.A.fy.minFrom: expected a string",
      "envelopes.E.reactions.A.fy.minFrom: not one of the enveloped results",
    ],
  ],
  [
    "an envelope's maximum not a number",
    (s) => (s.envelopes.E.endForces.AB.endMz.max = null),
    [`envelopes.E.endForces.AB.endMz.max: ${NUMBER}`],
  ],
  [
    "an envelope's minimum missing",
    (s) => delete s.envelopes.E.displacements.B.rz.min,
    [`envelopes.E.displacements.B.rz.min: ${NUMBER}`],
  ],
  [
    "an envelope's direction missing",
    (s) => delete s.envelopes.E.displacements.B.ux,
    ["envelopes.E.displacements.B.ux: expected an object"],
  ],
  ["an envelope's node missing", (s) => delete s.envelopes.E.displacements.B, ["envelopes.E.displacements.B: missing"]],
  ["an envelope's node not an object", (s) => (s.envelopes.E.reactions.A = 1), ["envelopes.E.reactions.A: expected an object"]],
  [
    "an envelope's member the model does not have",
    (s) => (s.envelopes.E.endForces.XY = s.envelopes.E.endForces.AB),
    ["envelopes.E.endForces.XY: not in the model"],
  ],
  ["the warnings not an array", (s) => (s.warnings = {}), ["warnings: expected an array"]],
  [
    "a warning of another kind",
    (s) => (s.warnings = [{ kind: "slow", loadCase: "G", relativeResidual: 1e-7, message: "m" }]),
    ['warnings[0].kind: expected "ill-conditioned"'],
  ],
  [
    "a warning not an object",
    (s) => (s.warnings = [{ kind: "ill-conditioned", loadCase: "G", relativeResidual: 1e-7, message: "m" }, "ill"]),
    [
      "warnings[1]: expected an object",
      'warnings[1].kind: expected "ill-conditioned"',
      "warnings[1].loadCase: expected a string",
      `warnings[1].relativeResidual: ${NUMBER}`,
      "warnings[1].message: expected a string",
    ],
  ],
  [
    "the statistics missing",
    (s) => delete s.stats,
    ["stats: expected an object", ...["nodes", "members", "equations", "nnzL"].map((k) => `stats.${k}: ${NUMBER}`)],
  ],
  ["a statistic stored as text", (s) => (s.stats.nnzL = "4"), [`stats.nnzL: ${NUMBER}`]],
  ["the engine version missing", (s) => delete s.engineVersion, ["engineVersion: expected a string"]],
  ["the engine's source hash not a string", (s) => (s.engineSourceHash = 7), ["engineSourceHash: expected a string"]],
];

describe("a stored result that does not fit its model is refused, naming each path", () => {
  it.each(CASES)("%s", (_name, spoil, expected) => {
    expect(messagesAfter(spoil)).toEqual(expected);
  });

  it("a stored result that is not an object at all", () => {
    for (const stored of [null, [], "result", 3]) {
      const out = restoreResult(MODEL, stored);
      expect(out).toEqual({
        ok: false,
        errors: [{ kind: "invalid-stored-result", path: "result", message: "result: expected an object" }],
      });
    }
  });

  it("reads back what it stored: warnings, statistics, identity, reactions only where they are written", () => {
    const run = smallRun();
    const original = run.original;
    const stored = JSON.parse(run.stored) as Json;
    const warning = { kind: "ill-conditioned", loadCase: "G", relativeResidual: 2.5e-7, message: "K is nearly singular" };
    stored.warnings = [warning];
    // Only supported nodes carry reactions; a node absent from the stored reactions reads as zero.
    expect(Object.keys(stored.loadCases.G.reactions)).toEqual(["A"]);
    const out = restoreResult(MODEL, stored);
    if (!out.ok) throw new Error(JSON.stringify(out.errors));
    const r = out.result;
    expect(r.warnings).toEqual([warning]);
    expect(r.stats).toEqual(original.stats);
    expect([r.engineVersion, r.engineSourceHash]).toEqual([original.engineVersion, original.engineSourceHash]);
    expect(Array.from(r.loadCases.G.reactions)).toEqual(Array.from(original.loadCases.G.reactions));
    expect(Array.from(r.loadCases.G.reactions.subarray(3))).toEqual([0, 0, 0]);
    expect(r.combinations.C.sources).toEqual([
      { caseIndex: 0, caseId: "G", factor: 1.35 },
      { caseIndex: 1, caseId: "Q", factor: 1.5 },
    ]);
    expect(r.loadCases.Q.sources).toEqual([{ caseIndex: 1, caseId: "Q", factor: 1 }]);
    expect(r.envelopes.E.of).toEqual(["G", "C"]);
    for (const part of ["displacements", "reactions", "endForces"] as const)
      for (const key of ["max", "min", "maxFrom", "minFrom"] as const)
        expect(Array.from(r.envelopes.E[part][key])).toEqual(Array.from(original.envelopes.E[part][key]));
    // The envelope has results governed by each of its two members, so maxFrom and minFrom are not all 0.
    expect(Array.from(original.envelopes.E.displacements.maxFrom)).toContain(1);
    expect(Array.from(original.envelopes.E.displacements.minFrom)).toContain(0);
  });
});
