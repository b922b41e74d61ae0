// `npm start`: everything Gusset needs on this machine, then the app on http://127.0.0.1:3000.
// Installs what is missing (npm dependencies, postgresql-15), starts or reuses PostgreSQL and the fake
// SMTP/S3, migrates and seeds the `gusset` database, builds when stale, serves. Ctrl-C stops what it started.
// Plain Node: it runs before `npm ci` on a fresh machine.
import crypto from "node:crypto";
import { authSecret, childEnv, gussetEnv, logSigningKey, writeEnvLocal } from "./lib/env.mjs";
import { ensureBuild } from "./lib/build.mjs";
import { demoSignIns, printSignIns, verifyLiveStandards } from "./lib/database.mjs";
import { CHROMIUM_PACKAGE, POSTGRES_PACKAGE, ensureDebianPackages, ensureNodeModules } from "./lib/install.mjs";
import { createLifecycle, profileSetup } from "./lib/lifecycle.mjs";
import { say } from "./lib/processes.mjs";
import { checkServerPort, startServer } from "./lib/server.mjs";
import { prepareServices } from "./lib/services.mjs";

const { timer, registry, shutdown, main, isShuttingDown } = createLifecycle();

await main(async () => {
  await timer.phase("npm dependencies", ensureNodeModules);
  await timer.phase("system packages", () => ensureDebianPackages([POSTGRES_PACKAGE, CHROMIUM_PACKAGE]));

  const setup = profileSetup("start");
  const { secret, created } = authSecret();
  const logKey = logSigningKey();
  const env = gussetEnv("start", { secret, logKey: logKey.key });
  writeEnvLocal(env);
  if (created) say("created a local BETTER_AUTH_SECRET in .env.local (kept for later runs)");
  if (logKey.created) say("created the log's Ed25519 signing key in .env.local (kept for later runs; back it up)");
  const keyFingerprint = crypto.createHash("sha256").update(Buffer.from(env.GUSSET_LOG_PUBLIC_KEY, "base64")).digest("hex");
  say(`the log's public key: sha256:${keyFingerprint} (the Integrity page shows it in full)`);
  const processEnv = childEnv(env);
  const url = env.BETTER_AUTH_URL;

  const running = await checkServerPort(setup.layout, setup.ports.app);
  if (running !== null) {
    say(`Gusset is already served at ${url} (pid ${running}, started by another \`npm start\`): nothing to do`);
    printSignIns(await demoSignIns(processEnv));
    process.exit(0);
  }

  await prepareServices({ setup, env: processEnv, registry, timer, fresh: false });
  const signIns = demoSignIns(processEnv); // read while the build runs
  const verified = verifyLiveStandards(processEnv); // likewise
  await timer.phase("build", () => ensureBuild({ env: processEnv, layout: setup.layout }));
  await verified;
  const server = await timer.phase("server", () =>
    startServer({ env: processEnv, layout: setup.layout, port: setup.ports.app, profile: "start", registry }),
  );

  printSignIns(await signIns);
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
