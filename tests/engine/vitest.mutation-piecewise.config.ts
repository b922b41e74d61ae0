// The tests that read member diagrams, for mutation testing of lib/engine/piecewise.ts
// (stryker.piecewise.config.mjs), run by hand. With the whole engine suite, each of the mutants of the root
// search is run against every property and reproducibility test that draws a diagram (one to two minutes a
// mutant on a shared 2-core machine, more than two hours in all). This set keeps every test file that checks
// diagram values, extremes or stored output against a closed form, a golden file or a hand-built case, and
// leaves out the random-frame property tests (properties, properties-large, member-forces), the
// reproducibility and stored-result round trips, and the checks of the engine's identity. A mutant this set
// kills, the whole suite kills too; a survivor here may still be killed by the rest of the suite.
import { engineMutationConfig } from "./mutation-vitest";

export default engineMutationConfig([
  "tests/engine/piecewise.test.ts",
  "tests/engine/diagram-sampling.test.ts",
  "tests/engine/beams.test.ts",
  "tests/engine/behaviour.test.ts",
  "tests/engine/closed-forms-loads.test.ts",
  "tests/engine/closed-forms-structures.test.ts",
  "tests/engine/frames-trusses.test.ts",
  "tests/engine/errors.test.ts",
  "tests/engine/golden.test.ts",
  "tests/engine/result-output.test.ts",
  "tests/engine/restore-errors.test.ts",
]);
