/** The JSON format and the `npm run analyze` command, end to end on the sample models. */
import { describe, it, expect } from "vitest";
import { spawnSync } from "node:child_process";
import { readFileSync } from "node:fs";
import path from "node:path";
import { analyze, modelJsonSchema, resultToJson, ENGINE_VERSION } from "@/lib/engine";
import { expectAllFinite, expectClose } from "./helpers";

const root = path.resolve(import.meta.dirname, "../..");
const example = (name: string) => path.join(root, "content/engine-examples", name);

function runCli(...args: string[]) {
  const r = spawnSync(process.execPath, ["--import", "tsx", path.join(root, "scripts/analyze.ts"), ...args], {
    cwd: root,
    encoding: "utf8",
  });
  return { status: r.status, json: r.stdout ? JSON.parse(r.stdout) : null };
}

describe("JSON model format", () => {
  it("is exported as JSON Schema", () => {
    const schema = modelJsonSchema() as { type: string; properties: Record<string, unknown>; required: string[] };
    expect(schema.type).toBe("object");
    expect(Object.keys(schema.properties)).toEqual(
      expect.arrayContaining(["nodes", "members", "loadCases", "combinations", "envelopes", "analysis", "dimension"]),
    );
    expect(schema.required).toContain("nodes");
  });

  it("serialises a result to finite, id-keyed JSON that survives a round trip", () => {
    const out = analyze(JSON.parse(readFileSync(example("portal-frame.json"), "utf8")));
    expect(out.ok).toBe(true);
    if (!out.ok) return;
    const json = JSON.parse(JSON.stringify(resultToJson(out.result, { points: 5 })));
    expectAllFinite(json);
    expect(json.engineVersion).toBe(ENGINE_VERSION);
    expect(Object.keys(json.loadCases.G.displacements)).toEqual(["A", "B", "C", "D"]);
    expect(json.combinations["ULS-1"].factors).toEqual({ G: 1.35, Q: 1.5, W: 0.9 });
    expect(json.envelopes.ULS.diagramExtremes.beam.M.max.from).toMatch(/^ULS-/);
  });
});

describe("npm run analyze", () => {
  it("prints results as JSON for a valid model", () => {
    const { status, json } = runCli(example("truss.json"), "--compact");
    expect(status).toBe(0);
    expect(json.ok).toBe(true);
    // Reaction at the roller C: P/2 + 3H/8 (see frames-trusses.test.ts).
    expectClose(json.loadCases.P.reactions.C.fy, 60e3 + 15e3);
  }, 30_000);

  it("prints errors as JSON and exits non-zero for an unstable model", () => {
    const { status, json } = runCli(example("unstable.json"));
    expect(status).toBe(1);
    expect(json).toEqual({ ok: false, errors: [expect.objectContaining({ kind: "rigid-body", motion: "slide-x" })] });
  }, 30_000);
});
