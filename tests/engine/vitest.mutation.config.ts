// The engine's tests alone, for mutation testing (`npm run mutation:engine`, stryker.config.mjs).
// The root vitest.config.ts holds three projects (unit, integration, browser); Stryker's vitest runner
// wants one plain project, and only the engine's own tests can kill a mutant in lib/engine.
import path from "node:path";
import { defineConfig } from "vitest/config";

const root = path.resolve(import.meta.dirname, "../..");

export default defineConfig({
  root,
  resolve: { alias: { "@": root } },
  test: {
    include: ["tests/engine/**/*.test.ts"],
    // The CLI test spawns `npm run analyze` in a child process, which Stryker's in-process
    // instrumentation cannot see; the CLI's own logic is covered through serialize.ts directly.
    exclude: ["tests/engine/cli.test.ts"],
    environment: "node",
    env: { GUSSET_MUTATION: "1" },
    setupFiles: ["tests/engine/mutation-setup.ts"],
    // Instrumented code runs several times slower; the 40 × 40 ordering test needs more than 5 s.
    testTimeout: 120_000,
  },
});
