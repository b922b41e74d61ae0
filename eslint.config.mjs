// ESLint, run directly (`npm run lint`; Next 16 has no `next lint`): the recommended sets, React's hooks
// rules, Next's own rules, Prettier's formatting (as a lint error, so CI keeps lines readable), and the
// layer table of DEVELOPERS.md ("Layout"): each folder may import only the folders below it. The table is
// LAYERS here; tests/unit/lint-rules.test.ts checks it on snippets and lints the whole tree.
import { defineConfig } from "eslint/config";
import js from "@eslint/js";
import tseslint from "typescript-eslint";
import reactHooks from "eslint-plugin-react-hooks";
import nextPlugin from "@next/eslint-plugin-next";
import prettierRecommended from "eslint-plugin-prettier/recommended";

/** Our own top-level modules, as imported through the `@/` alias. */
const MODULES = [
  "proxy",
  "app",
  "components",
  "lib/use-cases",
  "lib/auth",
  "lib/jobs",
  "lib/data",
  "lib/mail",
  "lib/storage",
  "lib/pdf",
  "lib/integrity",
  "lib/engine",
  "lib/standards",
  "lib/libraries",
  "lib/evaluation",
  "lib/server-env",
  "lib/domain",
  "db",
  "scripts",
  "tests",
];

/**
 * Who may import whom (besides itself and npm packages). `db` means the schema and helpers that take an
 * executor; the database handle itself (`@/db`, `@/db/index`) is only for lib/data, lib/jobs and the
 * auth adapter. `type` entries may be imported for types only (DTOs shown by pages).
 */
export const LAYERS = {
  "lib/domain": { may: [] },
  "lib/server-env": { may: [] },
  "lib/engine": { may: [] },
  // The standards' evaluation: pure like the engine, it runs on the server, in scripts and in the browser.
  "lib/standards": { may: ["lib/engine", "lib/domain"] },
  // The firm's libraries (sections and their catalogue): pure, with the standards' units.
  "lib/libraries": { may: ["lib/standards", "lib/domain"] },
  // The standards' evaluation on the server, in worker threads with a timeout, and the bundle they (and browsers) run.
  "lib/evaluation": { may: ["lib/standards", "lib/engine", "lib/domain", "lib/server-env"] },
  db: { may: ["lib/domain", "lib/server-env"] },
  "lib/mail": { may: ["lib/domain", "lib/server-env"] },
  "lib/storage": { may: ["lib/domain", "lib/server-env"] },
  // Calc sheets printed to PDF by the server's Chromium, as the person asking.
  "lib/pdf": { may: ["lib/domain", "lib/server-env"] },
  // The verifiable log's hashing and proofs (RFC 9162): pure, node:crypto only.
  "lib/integrity": { may: [] },
  "lib/data": { may: ["db", "lib/domain", "lib/server-env"], handle: true },
  "lib/jobs": { may: ["db", "lib/data", "lib/mail", "lib/integrity", "lib/domain", "lib/server-env"], handle: true },
  "lib/auth": { may: ["db", "lib/data", "lib/jobs", "lib/mail", "lib/domain", "lib/server-env"] },
  "lib/use-cases": {
    may: [
      "db",
      "lib/auth",
      "lib/data",
      "lib/jobs",
      "lib/mail",
      "lib/storage",
      "lib/pdf",
      "lib/integrity",
      "lib/engine",
      "lib/standards",
      "lib/libraries",
      "lib/evaluation",
      "lib/domain",
      "lib/server-env",
    ],
  },
  components: {
    may: ["components", "lib/domain", "lib/engine", "lib/standards", "lib/libraries"],
    // lib/evaluation's protocol: the messages the run form's preview Worker exchanges with the evaluation bundle.
    types: ["lib/data", "lib/use-cases", "lib/evaluation"],
  },
  app: {
    may: ["app", "components", "lib/use-cases", "lib/auth", "lib/domain", "lib/engine", "lib/standards", "lib/libraries"],
    types: ["lib/data"],
  },
  // proxy.ts, before every request: security headers from the settings, and the database check.
  proxy: { may: ["lib/use-cases", "lib/domain", "lib/server-env"] },
};

const LAYER_MESSAGE = "crosses the layer table (DEVELOPERS.md, Layout): call the layer meant for it instead.";
const HANDLE_MESSAGE = "Only lib/data, lib/jobs and the auth adapter (lib/auth/server.ts) use the database handle.";

/** `@/db` and `@/db/index` (the handle), by alias or relative path. */
const dbHandlePattern = { regex: "^(@/db(/index)?|(\\.{1,2}/)+(\\.\\./)*db(/index)?)(\\.ts)?$", message: HANDLE_MESSAGE };

function aliasPattern(module, options = {}) {
  return { group: [`@/${module}`, `@/${module}/*`], message: `@/${module} ${LAYER_MESSAGE}`, ...options };
}

/** The no-restricted-imports patterns for a folder: every module it may not use, and relative climbs out of it. */
function restrictionsFor(folder, { may, types = [], handle = false }) {
  const own = [folder];
  const patterns = MODULES.filter((m) => !may.includes(m) && !own.includes(m) && !types.includes(m)).map((m) => aliasPattern(m));
  for (const m of types) patterns.push(aliasPattern(m, { allowTypeImports: true }));
  if (!handle && folder !== "db") patterns.push(dbHandlePattern);
  return patterns;
}

const ENGINE_MESSAGE = "lib/engine is pure TypeScript: no React, Next, database, auth or Node I/O (DEVELOPERS.md, Layout).";
const engineForbiddenPaths = [
  "react",
  "react-dom",
  "next",
  "pg",
  "drizzle-orm",
  "better-auth",
  "server-only",
  "fs",
  "node:fs",
  "fs/promises",
  "node:fs/promises",
  "path",
  "node:path",
  "child_process",
  "node:child_process",
  "net",
  "node:net",
  "http",
  "node:http",
  "https",
  "node:https",
  "http2",
  "node:http2",
  "dgram",
  "node:dgram",
].map((name) => ({ name, message: ENGINE_MESSAGE }));
const engineForbiddenPatterns = [
  {
    group: ["react/*", "react-dom/*", "next/*", "drizzle-orm/*", "better-auth/*", "@better-auth/*", "**/db", "**/db/*"],
    message: ENGINE_MESSAGE,
  },
];

/**
 * Config blocks per layer; a file matches one (flat config: the last block that sets a rule wins, so each
 * block carries the whole list). Under lib/ and db/, a relative import may not climb out of its folder:
 * cross-layer imports use the alias, so the table sees them.
 */
function layerBlocks() {
  const blocks = [];
  const rule = (patterns, folder) =>
    folder === "lib/engine" || folder === "lib/standards"
      ? { paths: engineForbiddenPaths, patterns: [...patterns, ...engineForbiddenPatterns] }
      : { patterns };
  const block = (files, patterns, folder) => ({
    files,
    rules: { "no-restricted-imports": "off", "@typescript-eslint/no-restricted-imports": ["error", rule(patterns, folder)] },
  });
  for (const [folder, layer] of Object.entries(LAYERS)) {
    const patterns = restrictionsFor(folder, layer);
    if (folder === "lib/server-env" || folder === "proxy") {
      blocks.push(block([`${folder}.ts`], patterns, folder));
    } else if (folder === "app" || folder === "components") {
      blocks.push(block([`${folder}/**/*.{ts,tsx,js,mjs}`], patterns, folder));
    } else {
      const climb = (depth) => ({ regex: `^(\\.\\./){${depth},}`, message: `a relative import out of ${folder}/: use @/…` });
      blocks.push(block([`${folder}/*.{ts,tsx,js,mjs}`], [...patterns, climb(1)], folder));
      blocks.push(block([`${folder}/*/**/*.{ts,tsx,js,mjs}`], [...patterns, climb(2)], folder));
    }
  }
  // The auth library's adapter is the one file outside lib/data and lib/jobs that holds the handle.
  blocks.push(
    block(["lib/auth/server.ts"], restrictionsFor("lib/auth", { ...LAYERS["lib/auth"], handle: true }).concat(), "lib/auth"),
  );
  return blocks;
}

export default defineConfig(
  {
    ignores: [
      ".next/**",
      "node_modules/**",
      "drizzle/**",
      ".gusset/**",
      "next-env.d.ts",
      "test-results/**",
      ".stryker-tmp/**",
      "reports/**",
      "public/evaluation/**",
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    // Node scripts and config files written in plain JavaScript.
    files: ["**/*.{js,mjs,cjs}"],
    languageOptions: {
      sourceType: "module",
      globals: {
        process: "readonly",
        console: "readonly",
        Buffer: "readonly",
        URL: "readonly",
        URLSearchParams: "readonly",
        setTimeout: "readonly",
        clearTimeout: "readonly",
        setInterval: "readonly",
        clearInterval: "readonly",
        fetch: "readonly",
        AbortController: "readonly",
        AbortSignal: "readonly",
        Headers: "readonly",
        Request: "readonly",
        ReadableStream: "readonly",
      },
    },
  },
  {
    rules: {
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_", caughtErrors: "none" }],
    },
  },
  {
    files: ["app/**/*.{ts,tsx}", "components/**/*.{ts,tsx}"],
    plugins: { "react-hooks": reactHooks, "@next/next": nextPlugin },
    rules: {
      ...reactHooks.configs.recommended.rules,
      ...nextPlugin.configs.recommended.rules,
      ...nextPlugin.configs["core-web-vitals"].rules,
    },
    settings: { next: { rootDir: "." } },
  },
  ...layerBlocks(),
  prettierRecommended,
);
