// Seeds the demo firm into DATABASE_URL when it has no users yet; otherwise says so and leaves it.
// Run by `npm start` and `npm test` after the migrations. Uses its own pool and closes it.
import { drizzle } from "drizzle-orm/node-postgres";
import { seedDemoFirm } from "../db/seed";
import * as schema from "../db/schema";
import { runDatabaseScript } from "./lib/database-script";
import { seedStartingLibraries } from "./lib/seed-libraries";
import { seedStartingStandards } from "./lib/seed-standards";

runDatabaseScript("seed", async (pool) => {
  const database = drizzle(pool, { schema, casing: "snake_case" });
  const result = await seedDemoFirm(database);
  console.log(
    result.seeded
      ? `seed: demo firm created (${result.users} users, ${result.jobs} jobs)`
      : "seed: already seeded (users exist); nothing changed",
  );
  const standards = await seedStartingStandards(database);
  console.log(
    standards.seeded
      ? `seed: starting standards published (${standards.standards} standards, ${standards.versions} versions)`
      : `seed: starting standards not imported (${standards.reason}); nothing changed`,
  );
  const libraries = await seedStartingLibraries(database);
  console.log(
    libraries.seeded
      ? `seed: starting libraries published (${libraries.libraries} libraries, ${libraries.entries} entries)`
      : `seed: starting libraries not imported (${libraries.reason}); nothing changed`,
  );
  return 0;
});
