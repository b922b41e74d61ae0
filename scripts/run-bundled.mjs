// Runs a TypeScript script as the code ships: bundled and minified by esbuild, as the evaluation bundle is
// (scripts/build-evaluation-bundle.mjs), instead of through tsx, whose name-keeping wrappers add a closure and a
// property write to every function made at run time — about 40 % on the evaluation of a large frame.
// Benchmarks that time the evaluation use it:
//
//   node scripts/run-bundled.mjs scripts/bench-standards.ts [args…]
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const [entry, ...args] = process.argv.slice(2);
if (!entry) {
  console.error("usage: node scripts/run-bundled.mjs <script.ts> [args…]");
  process.exit(2);
}
const { build } = await import("esbuild");

/** The project's own files keep their location: `import.meta.dirname` / `.url` become the source file's. */
const fileLocation = {
  name: "file-location",
  setup(b) {
    b.onLoad({ filter: /\.(ts|tsx|mts)$/ }, async (args) => {
      if (args.path.includes(`${path.sep}node_modules${path.sep}`)) return undefined;
      const text = await fs.promises.readFile(args.path, "utf8");
      return {
        contents: text
          .replaceAll("import.meta.dirname", JSON.stringify(path.dirname(args.path)))
          .replaceAll("import.meta.url", JSON.stringify(pathToFileURL(args.path).href)),
        loader: args.path.endsWith("x") ? "tsx" : "ts",
      };
    });
  },
};
const dir = fs.mkdtempSync(path.join(os.tmpdir(), "gusset-bundled-"));
const outfile = path.join(dir, `${path.basename(entry, path.extname(entry))}.cjs`);
try {
  await build({
    absWorkingDir: repoRoot,
    entryPoints: [entry],
    bundle: true,
    outfile,
    // CommonJS: some libraries (yaml) reach Node builtins with require().
    format: "cjs",
    platform: "node",
    target: ["es2022"],
    minify: true,
    alias: { "@": "." },
    define: { "process.env.NODE_ENV": '"production"' },
    logLevel: "warning",
    plugins: [fileLocation],
  });
  const run = spawnSync(process.execPath, [outfile, ...args], { stdio: "inherit", cwd: repoRoot });
  process.exitCode = run.status ?? 1;
} finally {
  fs.rmSync(dir, { recursive: true, force: true });
}
