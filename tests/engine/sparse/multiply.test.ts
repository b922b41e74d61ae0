import { describe, expect, it } from "vitest";
import { multiplySymmetric } from "@/lib/engine/sparse";
import { createRandom, multiplyDense, randomSpdMatrix, relativeError, toDense } from "./dense-reference";

describe("multiplySymmetric", () => {
  it("matches the dense product using both implied triangles", () => {
    const random = createRandom(11);
    for (const blockSize of [1, 3]) {
      const a = randomSpdMatrix(random, 25, blockSize, 0.2);
      const x = Float64Array.from({ length: a.n }, () => random() * 2 - 1);
      const y = multiplySymmetric(a, x);
      expect(relativeError(y, multiplyDense(toDense(a), x))).toBeLessThan(1e-14);
    }
  });

  it("rejects a vector of the wrong length", () => {
    const a = randomSpdMatrix(createRandom(1), 4, 1, 0.5);
    expect(() => multiplySymmetric(a, new Float64Array(3))).toThrow(/length/);
  });
});
