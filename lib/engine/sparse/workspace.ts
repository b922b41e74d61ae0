/**
 * Reusable storage for factorisations. Writing to freshly allocated memory costs a page fault per page, which
 * for a large frame adds up to more than the arithmetic; an analysis that runs again (live preview, batch
 * runs) reuses these buffers instead. A factor whose values live in a workspace is valid only until the next
 * factorisation with that workspace, so only callers that drop the factor before factorising again use one.
 */
export class FactorWorkspace {
  private readonly float64 = new Map<string, Float64Array>();

  /** A Float64Array view of exactly `length` entries with undefined contents, grown with some headroom. */
  floats(key: string, length: number): Float64Array {
    let buffer = this.float64.get(key);
    if (!buffer || buffer.length < length) {
      buffer = new Float64Array(Math.ceil(length * 1.125) + 16);
      this.float64.set(key, buffer);
    }
    return buffer.length === length ? buffer : buffer.subarray(0, length);
  }

  /** Lets the garbage collector take every buffer (e.g. after one very large model). */
  clear(): void {
    this.float64.clear();
  }
}

/**
 * Scratch that never outlives one call (fronts, update matrices, solve work vectors): one module-wide
 * workspace is safe because the engine is synchronous and does not re-enter the solver.
 */
export const scratch = new FactorWorkspace();
