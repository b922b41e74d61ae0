// The engine's tests alone, for mutation testing (`npm run mutation:engine`, stryker.config.mjs).
// The root vitest.config.ts holds three projects (unit, integration, browser); Stryker's vitest runner
// wants one plain project, and only the engine's own tests can kill a mutant in lib/engine.
import { engineMutationConfig } from "./mutation-vitest";

export default engineMutationConfig(
  ["tests/engine/**/*.test.ts"],
  // The CLI test spawns `npm run analyze` in a child process, which Stryker's in-process
  // instrumentation cannot see; the CLI's own logic is covered through serialize.ts directly.
  ["tests/engine/cli.test.ts"],
);
