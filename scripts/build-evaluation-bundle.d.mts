// Types of scripts/build-evaluation-bundle.mjs, for the tests that build the bundle themselves.
export declare const EVALUATION_DIR: string;
export declare const MANIFEST_FILE: string;
export declare const EVALUATION_SOURCES: string[];
export declare function buildEvaluationBundle(options?: { root?: string; outDir?: string }): Promise<{
  file: string;
  sha256: string;
  bytes: number;
  gzipBytes: number;
  builtFrom: { engine: string; engineSourceHash: string; evaluation: string; esbuild: string };
}>;
