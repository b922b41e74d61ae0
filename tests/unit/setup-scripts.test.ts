// `npm start` and `npm test` install the packages on a fresh clone (scripts/lib/install.mjs), so what they load before
// that — scripts/start.mjs, scripts/test.mjs and every module they import, statically, all the way down — may use
// Node's built-ins and the project's own files only. A package imported on that path fails before anything is
// installed (it once did: test.mjs took a helper from serve.mjs, which imports next).
import fs from "node:fs";
import { builtinModules } from "node:module";
import path from "node:path";
import { describe, expect, it } from "vitest";

const root = path.resolve(import.meta.dirname, "../..");
const BUILTINS = new Set(builtinModules);
const IMPORT = /^\s*(?:import|export)\s+(?:[^'";]*?\s+from\s+)?["']([^"']+)["']/gm;

/** Every package (not a built-in, not a relative path) imported statically from `entry` or the modules it imports. */
function packagesReachedFrom(entry: string): { packages: Map<string, string>; files: Set<string> } {
  const found = new Map<string, string>();
  const seen = new Set<string>();
  const visit = (file: string) => {
    if (seen.has(file)) return;
    seen.add(file);
    for (const [, specifier] of fs.readFileSync(file, "utf8").matchAll(IMPORT)) {
      if (specifier.startsWith(".")) visit(path.resolve(path.dirname(file), specifier));
      else if (!specifier.startsWith("node:") && !BUILTINS.has(specifier)) found.set(specifier, path.relative(root, file));
    }
  };
  visit(path.join(root, entry));
  return { packages: found, files: new Set([...seen].map((file) => path.relative(root, file))) };
}

describe("the set-up scripts load before the packages are installed", () => {
  for (const entry of ["scripts/start.mjs", "scripts/test.mjs"]) {
    it(`${entry} imports no package, directly or through its modules`, () => {
      const { packages, files } = packagesReachedFrom(entry);
      expect(Object.fromEntries(packages)).toEqual({});
      // The walk went down to the module that installs the packages.
      expect(files).toContain("scripts/lib/install.mjs");
    });
  }

  it("sees a package imported further down", () => {
    expect(packagesReachedFrom("scripts/serve.mjs").packages.get("next")).toBe("scripts/serve.mjs");
  });
});
