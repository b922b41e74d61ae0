// The tests for mutation testing of the dense and triangular-solve kernels (lib/engine/sparse/dense-kernels.ts,
// solve-kernels.ts; stryker.sparse-kernels.config.mjs), run by hand. Stryker instruments the kernels themselves, the
// innermost loops of every factorisation and solve, so a large frame factorised under instrumentation takes
// seconds, and with the whole sparse set (30 × 30 and 40 × 40 frames, natural order among them) the kernels'
// 472 mutants ran at about five a minute. This set keeps the kernels' own checks against their definitions and
// dense reference solves, and the small random matrices of the symbolic and supernode tests; not the frame-sized
// factorisations. A mutant this set kills, the whole suite kills too; a survivor here may still be killed by the rest.
import { engineMutationConfig } from "./mutation-vitest";

export default engineMutationConfig([
  "tests/engine/sparse/dense-kernels.test.ts",
  "tests/engine/sparse/solve-kernels.test.ts",
  "tests/engine/sparse/symbolic.test.ts",
]);
