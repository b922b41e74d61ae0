// ESLint, run directly (`npm run lint`; Next 16 has no `next lint`). Besides the recommended sets, two
// import rules hold the architecture in place (DEVELOPERS.md, "Layout"):
//   1. only the data-access layer (lib/data/**), the auth library's adapter (lib/auth/server.ts), db/,
//      scripts and tests may import the database handle;
//   2. lib/engine/** is pure TypeScript: nothing from React, Next, the database, auth or Node I/O.
import { defineConfig } from "eslint/config";
import js from "@eslint/js";
import tseslint from "typescript-eslint";

const DB_HANDLE_MESSAGE =
  "Only lib/data/** (and lib/auth/server.ts) may use the database handle: call a data-access function instead.";

/** `@/db`, `@/db/index` and relative paths to db/ or db/index; `@/db/schema` (types, tables) stays open. */
const dbHandlePattern = {
  regex: "^(@/db(/index)?|(\\.{1,2}/)+(\\.\\./)*db(/index)?)(\\.ts)?$",
  message: DB_HANDLE_MESSAGE,
};

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
    group: [
      "react/*",
      "react-dom/*",
      "next/*",
      "@/db",
      "@/db/*",
      "drizzle-orm/*",
      "better-auth/*",
      "@better-auth/*",
      "@/lib/data/*",
      "@/lib/auth/*",
      "@/lib/mail/*",
      "@/lib/storage/*",
      "@/app/*",
      "@/components/*",
      "**/db",
      "**/db/*",
    ],
    message: ENGINE_MESSAGE,
  },
];

export default defineConfig(
  { ignores: [".next/**", "node_modules/**", "drizzle/**", ".gusset/**", "next-env.d.ts", "test-results/**"] },
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
      },
    },
  },
  {
    rules: {
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_", caughtErrors: "none" }],
    },
  },
  {
    files: ["**/*.{ts,tsx,js,mjs,cjs}"],
    ignores: ["lib/data/**", "lib/auth/server.ts", "db/**", "scripts/**", "tests/**", "lib/engine/**"],
    rules: { "no-restricted-imports": ["error", { patterns: [dbHandlePattern] }] },
  },
  {
    // Replaces the rule above for the engine (flat config: the last matching setting wins), so it
    // repeats the database handle ban through `@/db` and `**/db`.
    files: ["lib/engine/**/*.{ts,tsx,js,mjs}"],
    rules: {
      "no-restricted-imports": ["error", { paths: engineForbiddenPaths, patterns: engineForbiddenPatterns }],
    },
  },
);
