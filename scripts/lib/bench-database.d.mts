// Types for bench-database.mjs, used by the TypeScript benchmarks.
export function prepareBenchDatabase(options: {
  database: string;
  /** Keep an existing database when this answers true; it may run SQL (as the superuser) and read the answer. */
  keepIf?: (query: (sql: string) => string) => boolean;
}): Promise<{
  env: Record<string, string>;
  urls: { app: string; owner: string };
  kept: boolean;
  stop: () => Promise<void>;
}>;
