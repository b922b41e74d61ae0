// `npm start`: everything Gusset needs on this machine, then the app on http://127.0.0.1:3000.
// Installs what is missing (npm dependencies, postgresql-15), starts or reuses PostgreSQL and the fake
// SMTP/S3, migrates and seeds the `gusset` database, builds when stale, serves. Ctrl-C stops what it started.
// Plain Node: it runs before `npm ci` on a fresh machine.
import { authSecret, childEnv, gussetEnv, writeEnvLocal } from "./lib/env.mjs";
import { ensureBuild } from "./lib/build.mjs";
import { demoSignIns, migrate, printSignIns, seed } from "./lib/database.mjs";
import { ensureFakeS3, ensureFakeSmtp } from "./lib/fakes.mjs";
import { POSTGRES_PACKAGE, ensureDebianPackages, ensureNodeModules } from "./lib/install.mjs";
import { createLifecycle, profileSetup } from "./lib/lifecycle.mjs";
import { createDatabaseIfMissing, ensurePostgres } from "./lib/postgres.mjs";
import { say } from "./lib/processes.mjs";
import { checkServerPort, startServer } from "./lib/server.mjs";

const { timer, registry, shutdown, main, isShuttingDown } = createLifecycle();

await main(async () => {
  await timer.phase("npm dependencies", ensureNodeModules);
  await timer.phase("system packages", () => ensureDebianPackages([POSTGRES_PACKAGE]));

  const setup = profileSetup("start");
  const { ports, layout, database } = setup;
  const { secret, created } = authSecret();
  const env = gussetEnv("start", { secret });
  writeEnvLocal(env);
  if (created) say("created a local BETTER_AUTH_SECRET in .env.local (kept for later runs)");
  const processEnv = childEnv(env);
  const url = env.BETTER_AUTH_URL;

  const running = await checkServerPort(layout, ports.app);
  if (running !== null) {
    say(`Gusset is already served at ${url} (pid ${running}, started by another \`npm start\`): nothing to do`);
    printSignIns(demoSignIns(processEnv));
    process.exit(0);
  }

  await timer.phase("postgres", async () => {
    const postgres = await ensurePostgres({ layout, port: ports.postgres });
    if (postgres.started) registry.add("PostgreSQL", postgres.stop);
    createDatabaseIfMissing(ports.postgres, database);
  });
  await timer.phase("migrate", () => migrate(processEnv));
  await timer.phase("seed", () => seed(processEnv));
  await timer.phase("fakes", async () => {
    await ensureFakeSmtp({ ports, layout, profile: "start", registry });
    await ensureFakeS3({ ports, layout, profile: "start", registry, bucket: env.S3_BUCKET });
  });
  await timer.phase("build", () => ensureBuild({ env: processEnv, layout }));
  const server = await timer.phase("server", () => startServer({ env: processEnv, layout, port: ports.app, profile: "start", registry }));

  printSignIns(demoSignIns(processEnv));
  say(timer.summary());
  console.log(`\n  Gusset is running at ${url}`);
  console.log(`  Captured e-mails: ${env.FAKE_MAIL_API_URL}/messages (and the admin mailbox page)`);
  console.log("  Press Ctrl-C to stop what this command started.\n");

  server.once("exit", (code, signal) => {
    // Ctrl-C reaches the server too; give our own handler the first word.
    setTimeout(() => {
      if (isShuttingDown()) return;
      say(`the Next server stopped (${signal ?? `exit ${code}`}); stopping the rest`);
      void shutdown(1);
    }, 300);
  });
});
