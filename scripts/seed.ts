// Seeds the demo firm into DATABASE_URL when it has no users yet; otherwise says so and leaves it.
// Run by `npm start` and `npm test` after the migrations. Uses its own pool and closes it.
import { drizzle } from "drizzle-orm/node-postgres";
import pg from "pg";
import { seedDemoFirm } from "../db/seed";
import * as schema from "../db/schema";

async function main(): Promise<number> {
  const url = process.env.DATABASE_URL;
  if (!url) {
    console.error("seed: DATABASE_URL is not set");
    return 1;
  }
  const pool = new pg.Pool({ connectionString: url, max: 1 });
  try {
    const result = await seedDemoFirm(drizzle(pool, { schema, casing: "snake_case" }));
    console.log(
      result.seeded
        ? `seed: demo firm created (${result.users} users, ${result.projects} projects)`
        : "seed: already seeded (users exist); nothing changed",
    );
    return 0;
  } finally {
    await pool.end();
  }
}

main().then(
  (code) => process.exit(code),
  (error: unknown) => {
    console.error("seed: failed:", error instanceof Error ? error.message : error);
    process.exit(1);
  },
);
