// `npm run build:evaluation`: the evaluation bundle — lib/evaluation/entry.ts with the frame engine, lib/standards
// and their npm libraries in one minified ESM file that runs in a Node worker thread (lib/evaluation/pool.ts) and
// in a browser module Worker. Deterministic: the same sources give the same bytes, so the file is named by its
// sha256 and a released bundle can be kept by that name and run again later.
//
//   node scripts/build-evaluation-bundle.mjs [--out <folder>]      (default public/evaluation, gitignored)
//
// Writes evaluation-<first 16 hex of sha256>.js and manifest.json ({file, sha256, bytes, gzipBytes, builtFrom});
// removes older bundles from the folder. scripts/lib/build.mjs builds it before `next build` when stale.
// esbuild is imported only when building, so scripts/lib/build.mjs can import this file before `npm ci`.
import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import zlib from "node:zlib";

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

/** Relative to the working directory; lib/evaluation/pool.ts reads the manifest from the same place. */
export const EVALUATION_DIR = path.join("public", "evaluation");
export const MANIFEST_FILE = "manifest.json";
const ENTRY = "lib/evaluation/entry.ts";
/** What the bundle is made from (lib/ because the entry may reach any pure module); scripts/lib/build.mjs reads it. */
export const EVALUATION_SOURCES = ["lib", "package-lock.json", "tsconfig.json", "scripts/build-evaluation-bundle.mjs"];

/** The identity the bundle was built from, read from the sources (this script cannot import TypeScript). */
function builtFrom(root) {
  const read = (file, name) => {
    const match = new RegExp(`${name} = "([^"]+)"`).exec(fs.readFileSync(path.join(root, file), "utf8"));
    if (!match) throw new Error(`${file}: ${name} not found`);
    return match[1];
  };
  return {
    engine: read("lib/engine/version.ts", "ENGINE_VERSION"),
    engineSourceHash: read("lib/engine/identity.generated.ts", "ENGINE_SOURCE_HASH"),
    evaluation: read("lib/standards/evaluate.ts", "EVALUATION_VERSION"),
  };
}

/** Writes through a temporary name, so a reader never sees half a file. */
function writeAtomically(file, bytes) {
  const temporary = `${file}.${process.pid}.tmp`;
  fs.writeFileSync(temporary, bytes);
  fs.renameSync(temporary, file);
}

/** Builds the bundle into `outDir`; returns the manifest. */
export async function buildEvaluationBundle({ root = repoRoot, outDir = path.join(root, EVALUATION_DIR) } = {}) {
  const { build, version: esbuildVersion } = await import("esbuild");
  const result = await build({
    absWorkingDir: root,
    entryPoints: [ENTRY],
    bundle: true,
    write: false,
    format: "esm",
    // Neither a page's nor Node's build of the libraries: their `worker` builds, with no `document` (a Worker has
    // none). The one Node builtin is reached by a dynamic import, only in Node.
    platform: "neutral",
    mainFields: ["module", "main"],
    conditions: ["worker", "module"],
    target: ["es2022"],
    external: ["node:worker_threads"],
    minify: true,
    sourcemap: false,
    legalComments: "eof",
    charset: "utf8",
    define: { "process.env.NODE_ENV": '"production"' },
    logLevel: "warning",
  });
  const bytes = Buffer.from(result.outputFiles[0].contents);
  const sha256 = crypto.createHash("sha256").update(bytes).digest("hex");
  const file = `evaluation-${sha256.slice(0, 16)}.js`;
  const manifest = {
    file,
    sha256,
    bytes: bytes.length,
    gzipBytes: zlib.gzipSync(bytes, { level: 9 }).length,
    builtFrom: { ...builtFrom(root), esbuild: esbuildVersion },
  };
  fs.mkdirSync(outDir, { recursive: true });
  const target = path.join(outDir, file);
  if (!fs.existsSync(target) || !fs.readFileSync(target).equals(bytes)) writeAtomically(target, bytes);
  writeAtomically(path.join(outDir, MANIFEST_FILE), `${JSON.stringify(manifest, null, 2)}\n`);
  // Older bundles are not served any more; released ones are kept by their sha256 elsewhere.
  for (const other of fs.readdirSync(outDir))
    if (/^evaluation-[0-9a-f]{16}\.js$/.test(other) && other !== file) fs.rmSync(path.join(outDir, other), { force: true });
  return manifest;
}

function kib(n) {
  return `${(n / 1024).toFixed(1)} KiB`;
}

if (process.argv[1] && import.meta.url === pathToFileURL(path.resolve(process.argv[1])).href) {
  const outIndex = process.argv.indexOf("--out");
  const outDir = outIndex > 0 ? path.resolve(process.argv[outIndex + 1]) : undefined;
  const manifest = await buildEvaluationBundle({ outDir });
  console.log(
    `evaluation bundle ${path.relative(process.cwd(), path.join(outDir ?? path.join(repoRoot, EVALUATION_DIR), manifest.file))}: ` +
      `${kib(manifest.bytes)}, ${kib(manifest.gzipBytes)} gzipped (engine ${manifest.builtFrom.engine}+sha256:${manifest.builtFrom.engineSourceHash.slice(0, 12)})`,
  );
}
