// The id `next build` wrote for a build. Node built-ins only: scripts/test.mjs reads it before it has installed the
// packages that scripts/serve.mjs imports.
import fs from "node:fs";
import path from "node:path";

/** The id `next build` wrote for the build in `dir`'s .next, or null without one. */
export function readBuildId(dir) {
  try {
    return fs.readFileSync(path.join(dir, ".next", "BUILD_ID"), "utf8").trim() || null;
  } catch {
    return null;
  }
}
