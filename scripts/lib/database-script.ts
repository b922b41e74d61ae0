// The frame of a one-shot script against the database (scripts/migrate.ts as the owner role, scripts/seed.ts
// as the app's role): its own one-connection pool, closed afterwards, and the process's exit code from the
// work's result.
import pg from "pg";

type UrlVariable = "DATABASE_URL" | "DATABASE_OWNER_URL";

export function runDatabaseScript(
  name: string,
  work: (pool: pg.Pool, url: string) => Promise<number>,
  { urlVariable = "DATABASE_URL" }: { urlVariable?: UrlVariable } = {},
): void {
  main().then(
    (code) => process.exit(code),
    (error: unknown) => {
      console.error(`${name}: failed:`, error instanceof Error ? error.message : error);
      process.exit(1);
    },
  );

  async function main(): Promise<number> {
    const url = process.env[urlVariable];
    if (!url) {
      console.error(`${name}: ${urlVariable} is not set`);
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
