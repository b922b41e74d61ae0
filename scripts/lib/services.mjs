// The services both commands need before the app: PostgreSQL with a migrated, seeded database, the
// fake SMTP and S3, and the background worker. The database chain and the fakes start side by side;
// the worker once both are up (it needs the queue schema and sends to the fake SMTP).
import { migrate, seed } from "./database.mjs";
import { ensureDatabaseRoles, handDatabaseToOwner } from "./database-roles.mjs";
import { ensureFakeS3, ensureFakeSmtp } from "./fakes.mjs";
import { DATABASE_ROLES, migrationEnv, portsFor } from "./env.mjs";
import { allOrFirstError, say } from "./processes.mjs";
import { createDatabaseIfMissing, ensurePostgres, recreateDatabase } from "./postgres.mjs";
import { runningServerPid } from "./server.mjs";
import { startWorkerProcess } from "./worker.mjs";

// One cluster serves both commands: `npm test` run while `npm start` serves (or the other way round)
// reuses the cluster the first one started, which must then not stop it under the other's feet.
async function stopUnlessShared(postgres, { profile, layout }) {
  const other = profile === "start" ? "test" : "start";
  const otherServer = runningServerPid(layout, portsFor(other).app);
  if (otherServer === null) return postgres.stop();
  say(`leaving PostgreSQL running: the ${other} server (pid ${otherServer}) still uses it`);
  return false;
}

/**
 * `fresh` (npm test): drop and recreate the database, and start PostgreSQL without fsync when this run
 * is the one starting it. The database belongs to the owner role (scripts/lib/database-roles.mjs).
 */
export async function prepareServices({ setup, env, registry, timer, fresh }) {
  const { ports, layout, database, profile } = setup;
  const databaseChain = async () => {
    await timer.phase("postgres", async () => {
      const postgres = await ensurePostgres({ layout, port: ports.postgres, fast: fresh });
      if (postgres.started) registry.add("PostgreSQL", () => stopUnlessShared(postgres, setup));
      ensureDatabaseRoles(ports.postgres);
      if (fresh) recreateDatabase(ports.postgres, database, DATABASE_ROLES.owner);
      else createDatabaseIfMissing(ports.postgres, database, DATABASE_ROLES.owner);
      handDatabaseToOwner(ports.postgres, database); // a database from before the roles belongs to postgres
    });
    // Only the migrations get the owner's URL; the seed, the worker and the server run as the app's role.
    await timer.phase("migrate", () => migrate({ ...env, ...migrationEnv(profile) }));
    // The seed stores the starting standards' hand calculations in S3: it waits for the fakes.
    await fakesReady;
    await timer.phase("seed", () => seed(env));
  };
  const fakes = () =>
    timer.phase("fakes", () =>
      allOrFirstError([
        ensureFakeSmtp({ ports, layout, profile, registry }),
        ensureFakeS3({ ports, layout, profile, registry, bucket: env.S3_BUCKET }),
      ]),
    );
  const fakesReady = fakes();
  await allOrFirstError([databaseChain(), fakesReady]);
  await timer.phase("worker", () => startWorkerProcess({ env, layout, profile, registry }));
}
