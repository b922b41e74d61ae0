// A benchmark's own database on the checkout's PostgreSQL (started when it does not run, and then stopped by
// `stop`), made as `npm start` makes the demo's: the roles, the database owned by the owner role, the migrations, the
// demo seed (with the fake S3 the seed stores hand calculations in). Never the demo's `gusset` or the tests' database.
import { DATABASE_ROLES, authSecret, childEnv, databaseFor, databaseUrlFor, gussetEnv } from "./env.mjs";
import { ensurePostgres, psql, recreateDatabase } from "./postgres.mjs";
import { ensureDatabaseRoles, handDatabaseToOwner } from "./database-roles.mjs";
import { migrate, seed } from "./database.mjs";
import { ensureFakeS3 } from "./fakes.mjs";
import { profileSetup } from "./lifecycle.mjs";
import { createServiceRegistry, say } from "./processes.mjs";

export async function prepareBenchDatabase({ database, keepIf }) {
  if (database === databaseFor("start") || database === databaseFor("test"))
    throw new Error(`a benchmark never uses ${database}: name a database of its own`);
  const registry = createServiceRegistry();
  const setup = profileSetup("start");
  const port = setup.ports.postgres;
  const postgres = await ensurePostgres({ layout: setup.layout, port });
  if (postgres.started) registry.add("PostgreSQL", () => postgres.stop());
  ensureDatabaseRoles(port);
  const env = childEnv({
    ...gussetEnv("start", { secret: authSecret().secret }),
    DATABASE_URL: databaseUrlFor("start", "app", database),
  });
  const urls = { app: databaseUrlFor("start", "app", database), owner: databaseUrlFor("start", "owner", database) };
  const stop = () => registry.stopAll();
  const exists = psql(port, "postgres", `select 1 from pg_database where datname = '${database}'`).stdout.trim() === "1";
  if (exists && keepIf && keepIf((sql) => psql(port, database, sql, { allowFailure: true }).stdout.trim())) {
    say(`reusing the database ${database}`);
    return { env, urls, kept: true, stop };
  }
  recreateDatabase(port, database, DATABASE_ROLES.owner);
  handDatabaseToOwner(port, database);
  await migrate({ ...env, DATABASE_OWNER_URL: urls.owner });
  await ensureFakeS3({ ports: setup.ports, layout: setup.layout, profile: "start", registry, bucket: env.S3_BUCKET });
  await seed(env);
  return { env, urls, kept: false, stop };
}
