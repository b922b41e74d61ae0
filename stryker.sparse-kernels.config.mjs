// Mutation testing for the sparse solver's dense and triangular-solve kernels alone, run by hand:
// `npx stryker run stryker.sparse-kernels.config.mjs --mutate lib/engine/sparse/<file>.ts`. Runs the test set of
// tests/engine/vitest.mutation-sparse-kernels.config.ts, not the whole sparse set: see there.
// @ts-check
import sparse from "./stryker.sparse.config.mjs";

/** @type {import('@stryker-mutator/api/core').PartialStrykerOptions} */
const config = {
  ...sparse,
  vitest: { configFile: "tests/engine/vitest.mutation-sparse-kernels.config.ts", related: false },
  mutate: ["lib/engine/sparse/dense-kernels.ts", "lib/engine/sparse/solve-kernels.ts"],
};

export default config;
