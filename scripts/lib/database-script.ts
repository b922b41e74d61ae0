// The frame of a one-shot script against DATABASE_URL (scripts/migrate.ts, scripts/seed.ts): its own
// one-connection pool, closed afterwards, and the process's exit code from the work's result.
import pg from "pg";

export function runDatabaseScript(name: string, work: (pool: pg.Pool, url: string) => Promise<number>): void {
  main().then(
    (code) => process.exit(code),
    (error: unknown) => {
      console.error(`${name}: failed:`, error instanceof Error ? error.message : error);
      process.exit(1);
    },
  );

  async function main(): Promise<number> {
    const url = process.env.DATABASE_URL;
    if (!url) {
      console.error(`${name}: DATABASE_URL is not set`);
      return 1;
    }
    const pool = new pg.Pool({ connectionString: url, max: 1 });
    try {
      return await work(pool, url);
    } finally {
      await pool.end();
    }
  }
}
