/**
 * The engine's identity: ENGINE_VERSION plus the sha256 of its own source, committed in
 * lib/engine/identity.generated.ts. This test fails when the committed hash is stale, so a change to the engine
 * cannot reach CI without its identity changing too.
 */
import { describe, it, expect } from "vitest";
import { appendFileSync, cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { analyze, engineIdentityLabel, ENGINE_IDENTITY, ENGINE_VERSION, resultToJson } from "@/lib/engine";
import { engineSourceFiles, engineSourceHash, IDENTITY_FILE } from "@/scripts/engine-identity";

const root = path.resolve(import.meta.dirname, "../..");

describe("engine identity", () => {
  // Stryker's sandbox holds instrumented copies of lib/engine, whose hash cannot match (npm run mutation:engine).
  it.skipIf(Boolean(process.env.GUSSET_MUTATION))("the committed source hash is that of lib/engine as it is now", () => {
    const actual = engineSourceHash();
    if (ENGINE_IDENTITY.sourceHash !== actual) {
      throw new Error(
        `${IDENTITY_FILE} is stale: lib/engine hashes to ${actual}, the file says ${ENGINE_IDENTITY.sourceHash}. Run npm run engine:identity and commit the file.`,
      );
    }
  });

  it("is the semver and a sha256, printed as version+sha256:first 12 hex digits", () => {
    expect(ENGINE_IDENTITY.version).toBe(ENGINE_VERSION);
    expect(ENGINE_VERSION).toMatch(/^\d+\.\d+\.\d+$/);
    expect(ENGINE_IDENTITY.sourceHash).toMatch(/^[0-9a-f]{64}$/);
    expect(engineIdentityLabel()).toBe(`${ENGINE_VERSION}+sha256:${ENGINE_IDENTITY.sourceHash.slice(0, 12)}`);
    expect(engineIdentityLabel({ version: "1.2.0", sourceHash: "abcdef0123456789" })).toBe("1.2.0+sha256:abcdef012345");
  });

  it("is recorded with every result", () => {
    const out = analyze({
      nodes: [
        { id: "a", x: 0, y: 0, support: { ux: "fixed", uy: "fixed", rz: "fixed" } },
        { id: "b", x: 2, y: 0 },
      ],
      members: [{ id: "m", start: "a", end: "b", E: 2e11, A: 1e-3, I: 1e-5 }],
    });
    if (!out.ok) throw new Error("analysis failed");
    expect(out.result.engineVersion).toBe(ENGINE_IDENTITY.version);
    expect(out.result.engineSourceHash).toBe(ENGINE_IDENTITY.sourceHash);
    expect(resultToJson(out.result)).toMatchObject({
      engineVersion: ENGINE_IDENTITY.version,
      engineSourceHash: ENGINE_IDENTITY.sourceHash,
    });
  });

  it("hashes every source file of the engine, but not its notes or the generated file", () => {
    const files = engineSourceFiles();
    expect(files).toContain("lib/engine/analyze.ts");
    expect(files).toContain("lib/engine/version.ts");
    expect(files).toContain("lib/engine/sparse/cholesky.ts");
    expect(files).not.toContain(IDENTITY_FILE);
    expect(files.filter((f) => f.endsWith(".md"))).toEqual([]);
    expect([...files].sort()).toEqual(files);
  });

  it("changes with any change to the code, not with the notes, and not with CRLF line ends", () => {
    const copy = mkdtempSync(path.join(tmpdir(), "gusset-engine-identity-"));
    try {
      cpSync(path.join(root, "lib/engine"), path.join(copy, "lib/engine"), { recursive: true });
      const original = engineSourceHash(copy);
      appendFileSync(path.join(copy, "lib/engine/README.md"), "\nA note.\n");
      writeFileSync(path.join(copy, IDENTITY_FILE), 'export const ENGINE_SOURCE_HASH = "";\n');
      expect(engineSourceHash(copy)).toBe(original);
      const solve = path.join(copy, "lib/engine/solve.ts");
      const text = readFileSync(solve, "utf8");
      writeFileSync(solve, text.replace(/\n/g, "\r\n"));
      expect(engineSourceHash(copy)).toBe(original);
      // One character more, even in white space, is another engine.
      writeFileSync(solve, `${text} `);
      expect(engineSourceHash(copy)).not.toBe(original);
      writeFileSync(solve, text);
      writeFileSync(path.join(copy, "lib/engine/sparse/extra.ts"), "export const x = 1;\n");
      expect(engineSourceHash(copy)).not.toBe(original);
    } finally {
      rmSync(copy, { recursive: true, force: true });
    }
  });
});
