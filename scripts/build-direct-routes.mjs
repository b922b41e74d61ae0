// Bundles scripts/direct-routes.ts (the route handlers scripts/serve.mjs answers without Next's router) into
// .next/direct-routes.mjs, stamped with the id of the Next build it belongs to: serve.mjs uses the bundle only with
// that build, so the two never serve different code. npm packages stay outside the bundle and load from
// node_modules, as in Next's own server build; `server-only` is the one left out (it throws outside React's server
// environment, which is what it is for; everything here runs only on the server).
//
//   node scripts/build-direct-routes.mjs        (after `next build`; scripts/lib/build.mjs and `npm run build` do)
//
// esbuild is imported only when building, so scripts/lib/build.mjs can import this file before `npm ci`.
import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { readBuildId } from "./lib/build-id.mjs";

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

/** Where serve.mjs looks for the bundle, relative to the checkout. */
export const DIRECT_ROUTES_FILE = path.join(".next", "direct-routes.mjs");

/** The build id a bundle was made for, from its first line; null for no bundle. */
export function directRoutesBuildId(root = repoRoot) {
  try {
    const first = fs.readFileSync(path.join(root, DIRECT_ROUTES_FILE), "utf8").split("\n", 1)[0];
    return /^\/\/ gusset direct routes for build (\S+)$/.exec(first)?.[1] ?? null;
  } catch {
    return null;
  }
}

export async function buildDirectRoutes({ root = repoRoot } = {}) {
  const buildId = readBuildId(root);
  if (!buildId) throw new Error("build-direct-routes: there is no Next build (.next/BUILD_ID) to bundle the routes for");
  const { build } = await import("esbuild");
  const out = path.join(root, DIRECT_ROUTES_FILE);
  const temporary = `${out}.${process.pid}.tmp`;
  await build({
    absWorkingDir: root,
    entryPoints: ["scripts/direct-routes.ts"],
    outfile: temporary,
    bundle: true,
    format: "esm",
    platform: "node",
    target: "node20",
    packages: "external",
    tsconfig: "tsconfig.json",
    banner: { js: `// gusset direct routes for build ${buildId}` },
    logLevel: "warning",
    plugins: [
      {
        // Next's entry points (next/headers, next/navigation, next/server) are files without an exports map: Node's
        // ESM loader needs their extension.
        name: "next-entry-points",
        setup(plugin) {
          plugin.onResolve({ filter: /^next\/[a-z-]+$/ }, ({ path: request }) => ({ path: `${request}.js`, external: true }));
        },
      },
      {
        name: "server-only",
        setup(plugin) {
          plugin.onResolve({ filter: /^server-only$/ }, () => ({ path: "server-only", namespace: "server-only" }));
          plugin.onLoad({ filter: /.*/, namespace: "server-only" }, () => ({ contents: "export {};", loader: "js" }));
        },
      },
    ],
  });
  fs.renameSync(temporary, out);
  return { file: out, buildId };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  buildDirectRoutes()
    .then(({ file, buildId }) =>
      console.log(
        `direct routes bundled for build ${buildId}: ${path.relative(repoRoot, file)} (${fs.statSync(file).size} bytes)`,
      ),
    )
    .catch((error) => {
      console.error(error);
      process.exit(1);
    });
}
