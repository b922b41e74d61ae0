// The vitest settings shared by the engine's mutation-testing configs (vitest.mutation*.config.ts): one plain
// project, the `@` alias, a fixed fast-check seed with a quarter of the property runs (mutation-setup.ts),
// and a long per-test time-out, since instrumented code runs several times slower.
import path from "node:path";
import { configDefaults, defineConfig } from "vitest/config";

const root = path.resolve(import.meta.dirname, "../..");

export function engineMutationConfig(include: string[], exclude: string[] = []) {
  return defineConfig({
    root,
    resolve: { alias: { "@": root } },
    test: {
      include,
      exclude: [...configDefaults.exclude, ...exclude],
      environment: "node",
      env: { GUSSET_MUTATION: "1" },
      setupFiles: ["tests/engine/mutation-setup.ts"],
      // The 40 × 40 ordering test needs more than 5 s when instrumented.
      testTimeout: 120_000,
    },
  });
}
