// Mutation testing for the sparse kernels (lib/engine/sparse) alone, run by hand:
// `npx stryker run stryker.sparse.config.mjs`. Runs the test set of tests/engine/vitest.mutation-sparse.config.ts
// (the kernels' own tests and the solver reference), not the whole engine suite: see there.
// The HTML report lands in reports/mutation/sparse.html; survivors are judged in lib/engine/MUTATION-SURVIVORS.md.
// @ts-check
import base from "./stryker.config.mjs";

/** @type {import('@stryker-mutator/api/core').PartialStrykerOptions} */
const config = {
  ...base,
  vitest: { configFile: "tests/engine/vitest.mutation-sparse.config.ts", related: false },
  mutate: ["lib/engine/sparse/**/*.ts"],
  // A mutant that loops for ever is given up after 1.5 × its tests' time + 10 s, not + 30 s.
  timeoutMS: 10_000,
  htmlReporter: { fileName: "reports/mutation/sparse.html" },
  jsonReporter: { fileName: "reports/mutation/sparse.json" },
};

export default config;
