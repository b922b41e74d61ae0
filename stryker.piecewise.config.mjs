// Mutation testing for the diagrams' piecewise polynomials (lib/engine/piecewise.ts) alone, run by hand:
// `npx stryker run stryker.piecewise.config.mjs`. Runs the test set of
// tests/engine/vitest.mutation-piecewise.config.ts (the tests that check diagram values), not the whole engine
// suite: see there. Survivors are judged in lib/engine/MUTATION-SURVIVORS.md.
// @ts-check
import base from "./stryker.config.mjs";

/** @type {import('@stryker-mutator/api/core').PartialStrykerOptions} */
const config = {
  ...base,
  vitest: { configFile: "tests/engine/vitest.mutation-piecewise.config.ts", related: false },
  mutate: ["lib/engine/piecewise.ts"],
  // A mutant that loops for ever in the root search is given up after 1.5 × its tests' time + 10 s, not + 30 s.
  timeoutMS: 10_000,
  htmlReporter: { fileName: "reports/mutation/piecewise.html" },
  jsonReporter: { fileName: "reports/mutation/piecewise.json" },
};

export default config;
