// `next build` when the build is missing or older than any source it is made from; the evaluation bundle
// (scripts/build-evaluation-bundle.mjs) first, when it is missing or older than its sources; the routes
// scripts/serve.mjs answers without Next (scripts/build-direct-routes.mjs) after, for that build.
import fs from "node:fs";
import path from "node:path";
import { EVALUATION_DIR, EVALUATION_SOURCES, MANIFEST_FILE } from "../build-evaluation-bundle.mjs";
import { directRoutesBuildId } from "../build-direct-routes.mjs";
import { readBuildId } from "./build-id.mjs";
import { repoRoot } from "./env.mjs";
import { SetupError, pidAlive, runAsync, say } from "./processes.mjs";

const SOURCE_DIRS = ["app", "components", "lib", "db", "content", "public"];
const SOURCE_FILES = [
  "next.config.ts",
  "package.json",
  "package-lock.json",
  "tsconfig.json",
  "postcss.config.mjs",
  "tailwind.config.ts",
  "proxy.ts",
  "middleware.ts",
  "instrumentation.ts",
  "mdx-components.tsx",
  // What the direct routes' bundle is made from besides app/ and lib/: a change rebuilds, and re-bundles for, Next.
  "scripts/direct-routes.ts",
  "scripts/build-direct-routes.mjs",
];

function newestMtime(entry) {
  let stat;
  try {
    stat = fs.statSync(entry);
  } catch {
    return 0;
  }
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs; // a deleted file shows as a newer folder
  for (const child of fs.readdirSync(entry)) {
    if (child === "node_modules" || child === ".next") continue;
    if (path.join(entry, child) === path.join(repoRoot, EVALUATION_DIR)) continue; // the bundle has its own freshness
    newest = Math.max(newest, newestMtime(path.join(entry, child)));
  }
  return newest;
}

/** Why a build is needed, or null when .next/BUILD_ID is newer than every source. */
export function buildStaleness() {
  const buildId = path.join(repoRoot, ".next", "BUILD_ID");
  if (!fs.existsSync(buildId)) return "no build yet";
  const builtAt = fs.statSync(buildId).mtimeMs;
  for (const entry of [...SOURCE_DIRS, ...SOURCE_FILES]) {
    if (newestMtime(path.join(repoRoot, entry)) > builtAt) return `${entry} changed since the last build`;
  }
  return null;
}

/** Why the evaluation bundle must be built, or null when its manifest and bundle are newer than every source. */
export function evaluationBundleStaleness() {
  const manifestPath = path.join(repoRoot, EVALUATION_DIR, MANIFEST_FILE);
  let manifest;
  try {
    manifest = JSON.parse(fs.readFileSync(manifestPath, "utf8"));
  } catch {
    return "no evaluation bundle yet";
  }
  if (typeof manifest.file !== "string" || !fs.existsSync(path.join(repoRoot, EVALUATION_DIR, manifest.file)))
    return "the evaluation bundle named by its manifest is missing";
  const builtAt = fs.statSync(manifestPath).mtimeMs;
  for (const entry of EVALUATION_SOURCES)
    if (newestMtime(path.join(repoRoot, entry)) > builtAt) return `${entry} changed since the evaluation bundle was built`;
  return null;
}

// Two set-up scripts in one checkout must not build into .next at once.
async function withBuildLock(lockFile, work) {
  for (;;) {
    try {
      fs.writeFileSync(lockFile, String(process.pid), { flag: "wx" });
      break;
    } catch {
      const holder = Number.parseInt(fs.readFileSync(lockFile, "utf8"), 10);
      if (!pidAlive(holder)) {
        fs.rmSync(lockFile, { force: true });
        continue;
      }
      say(`waiting for the build run by pid ${holder}`);
      while (pidAlive(holder) && fs.existsSync(lockFile)) await new Promise((r) => setTimeout(r, 500));
    }
  }
  try {
    return await work();
  } finally {
    fs.rmSync(lockFile, { force: true });
  }
}

/**
 * The engine's source hash (lib/engine/identity.generated.ts) is recorded with every run, so the build must carry
 * the current one: rewrite it when the engine changed (it is only written when it differs). Under CI it is only
 * checked, so a forgotten `npm run engine:identity` fails the build instead of being fixed in a throwaway checkout.
 */
async function syncEngineIdentity(env) {
  const check = Boolean((env ?? process.env).CI);
  await runAsync(
    path.join(repoRoot, "node_modules", ".bin", "tsx"),
    ["scripts/engine-identity.ts", ...(check ? ["--check"] : [])],
    { cwd: repoRoot, env },
  );
}

/** Why the direct routes must be bundled again, or null when they were bundled for the build in .next. */
export function directRoutesStaleness() {
  const bundledFor = directRoutesBuildId(repoRoot);
  if (bundledFor === null) return "no direct routes bundle yet";
  return bundledFor === readBuildId(repoRoot) ? null : "the direct routes were bundled for another build";
}

const upToDate = () => buildStaleness() === null && evaluationBundleStaleness() === null && directRoutesStaleness() === null;

/** Builds when stale. Returns true when it built. */
export async function ensureBuild({ env, layout }) {
  if (upToDate()) {
    say("build is up to date");
    return false;
  }
  return withBuildLock(path.join(layout.run, "build.lock"), async () => {
    // another script may have built while we waited
    if (upToDate()) return false;
    if (!fs.existsSync(path.join(repoRoot, "app"))) {
      throw new SetupError("app/ does not exist yet: there is nothing for `next build` to build");
    }
    await syncEngineIdentity(env); // may rewrite lib/engine/identity.generated.ts, so ask again below
    const bundleReason = evaluationBundleStaleness();
    if (bundleReason !== null) {
      say(`building the evaluation bundle (${bundleReason})`);
      await runAsync(process.execPath, ["scripts/build-evaluation-bundle.mjs"], { cwd: repoRoot, env });
    }
    const reason = buildStaleness();
    if (reason !== null) {
      say(`building (${reason}): next build`);
      await runAsync(path.join(repoRoot, "node_modules", ".bin", "next"), ["build"], { cwd: repoRoot, env });
    }
    const directReason = directRoutesStaleness();
    if (directReason !== null) {
      say(`bundling the routes served without Next (${directReason})`);
      await runAsync(process.execPath, ["scripts/build-direct-routes.mjs"], { cwd: repoRoot, env });
    }
    return true;
  });
}
