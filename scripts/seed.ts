// Seeds the demo firm into DATABASE_URL when it has no users yet; otherwise says so and leaves it.
// Run by `npm start` and `npm test` after the migrations. Uses its own pool and closes it.
import { drizzle } from "drizzle-orm/node-postgres";
import { seedDemoFirm } from "../db/seed";
import * as schema from "../db/schema";
import { runDatabaseScript } from "./lib/database-script";

runDatabaseScript("seed", async (pool) => {
  const result = await seedDemoFirm(drizzle(pool, { schema, casing: "snake_case" }));
  console.log(
    result.seeded
      ? `seed: demo firm created (${result.users} users, ${result.projects} projects)`
      : "seed: already seeded (users exist); nothing changed",
  );
  return 0;
});
