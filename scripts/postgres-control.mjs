// Stops or starts this checkout's PostgreSQL cluster (the one `npm start` and `npm test` share, on the
// ports GUSSET_PORT_OFFSET gives). The database-outage test uses it to take the database away from the
// running test server and bring it back.
//   node scripts/postgres-control.mjs stop
//   node scripts/postgres-control.mjs start [--fast]   (--fast: without fsync, as `npm test` starts it)
import { profileSetup } from "./lib/lifecycle.mjs";
import { ensurePostgres, stopPostgres } from "./lib/postgres.mjs";
import { SetupError, say } from "./lib/processes.mjs";

const [command, ...flags] = process.argv.slice(2);
const { layout, ports } = profileSetup("test");

try {
  if (command === "stop") {
    await stopPostgres({ layout });
    say(`PostgreSQL on 127.0.0.1:${ports.postgres} stopped`);
  } else if (command === "start") {
    await ensurePostgres({ layout, port: ports.postgres, fast: flags.includes("--fast") });
  } else {
    say("usage: node scripts/postgres-control.mjs stop | start [--fast]");
    process.exit(2);
  }
} catch (error) {
  say(`error: ${error instanceof SetupError ? error.message : String(error)}`);
  process.exit(1);
}
