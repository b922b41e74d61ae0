// The sparse kernels' own tests, for mutation testing of lib/engine/sparse (stryker.sparse.config.mjs), run by
// hand. The whole engine suite also reaches the kernels (every analysis solves through them), but on a 2-core
// machine running it for each of the kernels' mutants would take many hours. This set is the kernels' tests
// against a dense reference (tests/engine/sparse), the engine's equations solved both ways
// (solver-reference), the stiffness pattern built on the triplet builder (stiffness-pattern) and the property
// tests that multiply by the assembled matrix (properties). A mutant this set kills, the whole suite kills too;
// a survivor here may still be killed by the rest of the suite.
import { engineMutationConfig } from "./mutation-vitest";

export default engineMutationConfig([
  "tests/engine/sparse/**/*.test.ts",
  "tests/engine/solver-reference.test.ts",
  "tests/engine/stiffness-pattern.test.ts",
  "tests/engine/properties.test.ts",
]);
