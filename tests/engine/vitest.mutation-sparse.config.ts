// The sparse kernels' own tests, for mutation testing of lib/engine/sparse (stryker.sparse.config.mjs), run by
// hand: the kernels against a dense reference (tests/engine/sparse) and the engine's own equations solved both
// ways (solver-reference). The rest of the engine suite also reaches the kernels (every analysis solves
// through them), and so do the random-frame property tests, but on a shared 2-core machine running those for
// each of the kernels' mutants would take many hours (a first try with properties and stiffness-pattern
// included tested 106 mutants in 9 minutes). A mutant this set kills, the whole suite kills too; a survivor
// here may still be killed by the rest of the suite.
import { engineMutationConfig } from "./mutation-vitest";

export default engineMutationConfig(["tests/engine/sparse/**/*.test.ts", "tests/engine/solver-reference.test.ts"]);
