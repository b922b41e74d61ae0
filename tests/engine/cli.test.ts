/**
 * The JSON format and the `npm run analyze` command: the report a person reads (numbers checked against closed
 * forms, in each unit system), the --json output, the refusals and the exit codes the README states.
 */
import { describe, it, expect } from "vitest";
import { spawnSync } from "node:child_process";
import { readFileSync } from "node:fs";
import path from "node:path";
import { analyze, modelJsonSchema, resultToJson, ENGINE_VERSION, type ModelInput } from "@/lib/engine";
import { EXIT, runAnalyze, type CliIo } from "@/scripts/lib/engine-report/cli";
import { expectAllFinite, expectClose } from "./helpers";

const root = path.resolve(import.meta.dirname, "../..");
const example = (name: string) => path.join(root, "content/engine-examples", name);

/** A simply supported beam A (pin) – B (roller), span L, uniform load w downwards. */
const L = 6;
const w = 10e3;
const E = 200e9;
const I = 8e-5;
const beam: ModelInput = {
  nodes: [
    { id: "A", x: 0, y: 0, support: { ux: "fixed", uy: "fixed" } },
    { id: "B", x: L, y: 0, support: { uy: "fixed" } },
  ],
  members: [{ id: "AB", start: "A", end: "B", E, A: 5e-3, I }],
  loadCases: [{ id: "D", name: "Dead", loads: [{ kind: "distributed", member: "AB", direction: "global-y", wStart: -w }] }],
};
// AWC Design Aid No. 6 (2005), Figure 1 (simply supported, uniform load): R = wL/2, M_max = wL²/8 at L/2,
// Δ_max = 5wL⁴/(384EI) at L/2.
const R = (w * L) / 2; // 30 kN
const Mmax = (w * L * L) / 8; // 45 kN·m
const deflection = (5 * w * L ** 4) / (384 * E * I); // 10.546875 mm

/** Files the in-process command can read, by name, from the directory "/models". */
function filesIo(files: Record<string, string>): CliIo {
  return {
    cwd: "/models",
    readFile(file) {
      const text = files[path.relative("/models", file)];
      if (text === undefined) throw Object.assign(new Error("no such file"), { code: "ENOENT" });
      return text;
    },
  };
}

const io = filesIo({
  "beam.json": JSON.stringify(beam, null, 2),
  "broken.json": '{\n  "nodes": [\n    { "id": "A", "x": 0, "y": 0 },\n  ]\n}\n',
  "typo.json": JSON.stringify({ ...beam, nodes: [{ ...beam.nodes[0], suport: {} }, beam.nodes[1]] }),
  "sliding.json": JSON.stringify({ ...beam, nodes: beam.nodes.map((n) => ({ ...n, support: { uy: "fixed" } })) }),
  "mm.json": JSON.stringify({
    ...beam,
    nodes: beam.nodes.map((n) => ({ ...n, x: n.x * 1000 })),
    members: [{ ...beam.members![0], E: 210000 }],
  }),
});

function run(...argv: string[]) {
  return runAnalyze(argv, io);
}

/** The cells of a table row in the report: the row whose first cell is `id`, in the block after `title`. */
function cells(report: string, title: string, id: string): string[] {
  const lines = report.split("\n");
  const start = lines.findIndex((l) => l.startsWith(title));
  if (start < 0) throw new Error(`no "${title}" in the report`);
  for (let i = start + 1; i < lines.length && lines[i] !== ""; i++) {
    const parts = lines[i].trim().split(/\s{3,}/);
    if (parts[0] === id) return parts;
  }
  throw new Error(`no row ${id} under "${title}"`);
}

/** "45.00 @ 3.000" → [45, 3]; "0" → [0]. */
function numbersIn(cell: string): number[] {
  return cell.split(" @ ").map(Number);
}

/** A value shown to 4 significant figures is within half a unit of its last figure. */
function expectShown(cell: string, expected: number): void {
  expectClose(Number(cell), expected, 5e-4);
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

describe("the default report", () => {
  it("states its units and conventions", () => {
    const { code, stdout, stderr } = run("beam.json", "--units", "kN,m");
    expect(code).toBe(EXIT.ok);
    expect(stderr).toBe("");
    expect(stdout).toContain("Units: forces kN, lengths m, moments kN·m, deflections mm (the model is read in N, m, Pa)");
    expect(stdout).toContain("M positive sagging");
    expect(stdout).toContain('Load case D "Dead"');
    expect(stdout).toContain("2 nodes, 1 member, 3 equations; 1 load case, 0 combinations");
    expect(stdout).toContain("Warnings: none");
  });

  it("gives the reactions, extremes and deflection of a simply supported beam (AWC Design Aid No. 6 (2005), Figure 1)", () => {
    const { stdout } = run("beam.json", "--units", "kN,m");
    const [, Ax, Ay, Am] = cells(stdout, "  Reactions", "A");
    expect([Ax, Am]).toEqual(["0", "-"]); // the pin's horizontal reaction is noise; it has no moment
    expectShown(Ay, R / 1e3);
    const [, Bx, By] = cells(stdout, "  Reactions", "B");
    expect(Bx).toBe("-"); // a roller leaves x free
    expectShown(By, R / 1e3);
    const [, N, V, Mplus, Mminus, delta] = cells(stdout, "  Members", "AB");
    expect(N).toBe("0"); // no axial load: whatever rounding leaves is shown as 0
    expect(numbersIn(V)).toEqual([30, 0]);
    expect(Mplus).toBe("45.00 @ 3.000");
    expectShown(Mplus.split(" @ ")[0], Mmax / 1e3);
    expect(Mminus).toBe("0");
    expect(delta).toBe("-10.55 @ 3.000");
    expectShown(delta.split(" @ ")[0], -deflection * 1e3);
  });

  it("shows no floating-point noise: four significant figures, tiny values as 0", () => {
    const { stdout } = run("beam.json");
    const tables = stdout.split("\n").filter((l) => l.startsWith("    "));
    expect(tables.length).toBeGreaterThan(3);
    for (const line of tables) {
      expect(line).not.toMatch(/\d\.?\d{5,}/); // no 74999.99999999999
      expect(line).not.toMatch(/e-\d/); // no 1.2e-17
    }
  });

  it("reports the equilibrium check and the solver's relative residual", () => {
    const { stdout } = run("beam.json");
    expect(stdout).toMatch(/ {2}Equilibrium: Fx \S+ N, Fy \S+ N, Mz \S+ N·m; relative \S+: OK/);
    expect(stdout).toMatch(/ {2}Solver relative residual \|Ku - f\| \/ \|f\|: \S+: OK/);
  });

  it("in N and m by default, deflections in mm", () => {
    const { stdout } = run("beam.json");
    expect(stdout).toContain("Units: forces N, lengths m, moments N·m, deflections mm");
    expect(cells(stdout, "  Reactions", "A")[2]).toBe("30000");
    const [, , , Mplus, , delta] = cells(stdout, "  Members", "AB");
    expect(Mplus).toBe("45000 @ 3.000");
    expect(delta).toBe("-10.55 @ 3.000");
  });

  it("in kip and ft, deflections in inches (1 ft = 0.3048 m, 1 lbf = 4.4482216152605 N: NIST SP 811 (2008), Appendix B)", () => {
    const { code, stdout } = run("beam.json", "--units", "kip,ft");
    expect(code).toBe(EXIT.ok);
    expect(stdout).toContain("Units: forces kip, lengths ft, moments kip·ft, deflections in (inches)");
    expect(stdout).toContain("(exact by definition, NIST SP 811 (2008), Appendix B)");
    const kip = 4448.2216152605;
    expectShown(cells(stdout, "  Reactions", "A")[2], R / kip);
    const [, , , Mplus, , delta] = cells(stdout, "  Members", "AB");
    const [M, x] = Mplus.split(" @ ");
    expectShown(M, Mmax / (kip * 0.3048));
    expectShown(x, L / 2 / 0.3048);
    expectShown(delta.split(" @ ")[0], -deflection / 0.0254);
    expect(Mplus).toBe("33.19 @ 9.843");
  });

  it("in kN and mm, moments still in kN·m", () => {
    const { stdout } = run("beam.json", "--units", "kN,mm");
    expect(stdout).toContain("Units: forces kN, lengths mm, moments kN·m, deflections mm");
    const [, , , Mplus, , delta] = cells(stdout, "  Members", "AB");
    expect(Mplus).toBe("45.00 @ 3000");
    expect(delta).toBe("-10.55 @ 3000");
  });

  it("refuses an unknown unit set, listing the valid ones", () => {
    const { code, stdout, stderr } = run("beam.json", "--units", "lbf,in");
    expect(code).toBe(EXIT.cannotRun);
    expect(stdout).toBe("");
    expect(stderr).toMatch(/^Unknown unit set "lbf,in"; the valid ones are N,m, kN,m, kN,mm, kip,ft \(default N,m\)\n/);
  });

  it("covers every combination of a sample, with its factors", () => {
    const text = readFileSync(example("portal-frame.json"), "utf8");
    const { stdout } = runAnalyze(["portal.json", "--units", "kN,m"], filesIo({ "portal.json": text }));
    expect(stdout).toContain('Combination ULS-1 "1.35G + 1.5Q + 0.9W": 1.35 G + 1.5 Q + 0.9 W');
    expect(stdout).toContain("Envelopes ULS (of ULS-1, ULS-2): see --json.");
    // A column with a uniform axial force: its constant shear is shown as such, not at an arbitrary point.
    expect(cells(stdout, "Load case G", "beam")[1]).toBe("-25.23 all along");
  });
});

describe("--json", () => {
  it("prints exactly the full results as JSON, nothing else", () => {
    const { code, stdout, stderr } = run("--json", "beam.json");
    expect(code).toBe(EXIT.ok);
    expect(stderr).toBe("");
    const out = analyze(beam);
    if (!out.ok) throw new Error("the beam must analyse");
    expect(stdout).toBe(`${JSON.stringify({ ok: true, ...(resultToJson(out.result) as object) }, null, 2)}\n`);
    expect(JSON.parse(stdout).loadCases.D.reactions.A.fy).toBeCloseTo(R, 6);
  });

  it("keeps --points and --compact", () => {
    const { stdout } = run("--json", "beam.json", "--points", "3", "--compact");
    expect(stdout.trimEnd()).not.toContain("\n");
    expect(JSON.parse(stdout).loadCases.D.diagrams.AB.samples.x).toEqual([0, 3, 6]);
  });

  it("puts refusals in the JSON and notes about units on stderr", () => {
    const { code, stdout, stderr } = run("--json", "mm.json");
    expect(code).toBe(EXIT.ok);
    expect(JSON.parse(stdout).ok).toBe(true);
    expect(stderr).toContain("Note: E = 210000 (member AB) looks like MPa");
    const broken = run("--json", "broken.json");
    expect(broken.code).toBe(EXIT.cannotRun);
    expect(JSON.parse(broken.stdout)).toEqual({
      ok: false,
      errors: [
        {
          kind: "unreadable-input",
          line: 4,
          column: 3,
          message: "broken.json, line 4, column 3: not valid JSON (Unexpected token ']')",
        },
      ],
    });
  });
});

describe("refusals a person can act on", () => {
  it("malformed JSON: line and column, with the line shown", () => {
    const { code, stdout, stderr } = run("broken.json");
    expect(code).toBe(EXIT.cannotRun);
    expect(stdout).toBe("");
    expect(stderr).toBe("broken.json, line 4, column 3: not valid JSON (Unexpected token ']')\n  4 |   ]\n    |   ^\n");
  });

  it("an unknown key: the keys valid there", () => {
    const { code, stderr } = run("typo.json");
    expect(code).toBe(EXIT.modelRefused);
    expect(stderr).toBe(
      'typo.json: the engine refused the model (1 problem):\n  - nodes[0]: unknown key "suport"; the valid keys here are id, x, y, support\n',
    );
  });

  it("a structure that can slide as a whole: said so, not pinned on one node", () => {
    const { code, stderr } = run("sliding.json");
    expect(code).toBe(EXIT.modelRefused);
    expect(stderr).toContain("  - The structure can slide in x as a whole: no support restrains x\n");
  });

  it("numbers that look like mm and MPa: warned, naming the likely units", () => {
    const { code, stdout } = run("mm.json");
    expect(code).toBe(EXIT.ok);
    expect(stdout).toContain(
      "  - E = 210000 (member AB) looks like MPa (N/mm²); the engine expects Pa (N/m²), so multiply by 1e6 (210000 MPa = 2.1e11 Pa)\n",
    );
    expect(stdout).toContain(
      "  - Member AB is 6000 long: that looks like mm; the engine expects m, so divide the coordinates by 1000\n",
    );
  });

  it("a file that cannot be read", () => {
    expect(run("missing.json")).toEqual({
      code: EXIT.cannotRun,
      stdout: "",
      stderr: "missing.json: cannot read the file (ENOENT)\n",
    });
  });
});

describe("exit codes, as the README states: 0 analysed, 1 refused by the engine, 2 could not run", () => {
  it.each([
    [["beam.json"], EXIT.ok],
    [["--json", "beam.json"], EXIT.ok],
    [["--schema"], EXIT.ok],
    [["--help"], EXIT.ok],
    [["typo.json"], EXIT.modelRefused],
    [["--json", "sliding.json"], EXIT.modelRefused],
    [["broken.json"], EXIT.cannotRun],
    [["missing.json"], EXIT.cannotRun],
    [["beam.json", "--units", "cubits"], EXIT.cannotRun],
    [[], EXIT.cannotRun],
  ])("%j exits with %i", (argv, code) => {
    expect(run(...argv).code).toBe(code);
  });

  it("are the values the README names", () => {
    expect(EXIT).toEqual({ ok: 0, modelRefused: 1, cannotRun: 2 });
    const readme = readFileSync(path.join(root, "README.md"), "utf8").replace(/\s+/g, " ");
    expect(readme).toContain("exit code 0 when the model was analysed, 1 when the engine refused it");
  });
});

describe("the command itself", () => {
  function spawnCli(...args: string[]) {
    const r = spawnSync(process.execPath, ["--import", "tsx", path.join(root, "scripts/analyze.ts"), ...args], {
      cwd: root,
      encoding: "utf8",
    });
    return { status: r.status, stdout: r.stdout, stderr: r.stderr };
  }

  it("--json: stdout is the JSON alone, and the process exits 0", () => {
    const { status, stdout } = spawnCli("--json", "--compact", example("truss.json"));
    expect(status).toBe(0);
    const json = JSON.parse(stdout);
    // Reaction at the roller C: P/2 + 3H/8 (see frames-trusses.test.ts).
    expectClose(json.loadCases.P.reactions.C.fy, 60e3 + 15e3);
  }, 30_000);

  it("exits 1 for a refused model and 2 for an unusable command", () => {
    const refused = spawnCli(example("unstable.json"));
    expect(refused.status).toBe(1);
    expect(refused.stderr).toContain("The structure can slide in x as a whole: no support restrains x");
    expect(spawnCli("--units", "kN,m").status).toBe(2);
  }, 30_000);
});
