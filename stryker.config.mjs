// Mutation testing for the frame engine, run by hand (`npm run mutation:engine`), not in CI: it
// takes tens of minutes. Prints the score and the surviving mutants; the HTML report lands in
// reports/mutation/. Survivors judged equivalent are listed, with why, in
// lib/engine/MUTATION-SURVIVORS.md.
// @ts-check
/** @type {import('@stryker-mutator/api/core').PartialStrykerOptions} */
const config = {
  testRunner: "vitest",
  plugins: ["@stryker-mutator/vitest-runner"],
  vitest: { configFile: "tests/engine/vitest.mutation.config.ts", related: false },
  mutate: ["lib/engine/**/*.ts"],
  coverageAnalysis: "perTest",
  concurrency: 2,
  timeoutMS: 30_000,
  reporters: ["clear-text", "progress", "html", "json"],
  clearTextReporter: { logTests: false, maxTestsToLog: 0, reportMutants: true, reportScoreTable: true },
  htmlReporter: { fileName: "reports/mutation/engine.html" },
  jsonReporter: { fileName: "reports/mutation/engine.json" },
  tempDirName: ".stryker-tmp",
  cleanTempDir: true,
};

export default config;
