// The private PostgreSQL cluster on 127.0.0.1: created once under the state folder, started or reused.
import fs from "node:fs";
import path from "node:path";
import { PG_BIN } from "./install.mjs";
import { SetupError, commandLineOf, isRoot, pidAlive, portAnswers, run, say } from "./processes.mjs";

// initdb and postgres refuse to run as root: run them as the `postgres` user the Debian package made.
function asClusterOwner(command, args) {
  return isRoot ? ["runuser", ["-u", "postgres", "--", command, ...args]] : [command, args];
}

/** Runs SQL as the superuser `postgres` (trusted on loopback): set-up work only, never the app's. */
export function psql(port, database, sql, { allowFailure = false } = {}) {
  const env = { ...process.env, PGCONNECT_TIMEOUT: "5" };
  const args = ["-h", "127.0.0.1", "-p", String(port), "-U", "postgres", "-d", database, "-v", "ON_ERROR_STOP=1"];
  return run(`${PG_BIN}/psql`, [...args, "-tAc", sql], { env, quiet: true, allowFailure });
}

function isReady(port) {
  return (
    run(`${PG_BIN}/pg_isready`, ["-h", "127.0.0.1", "-p", String(port), "-t", "2"], { quiet: true, allowFailure: true })
      .status === 0
  );
}

function realpathOrSelf(p) {
  try {
    return fs.realpathSync(p);
  } catch {
    return p;
  }
}

function readPostmasterPid(dataDir) {
  try {
    return Number.parseInt(fs.readFileSync(path.join(dataDir, "postmaster.pid"), "utf8").split("\n")[0], 10);
  } catch {
    return null;
  }
}

/** A postmaster.pid whose process is gone, a zombie or another program blocks a start: remove it. */
function removeStalePidFile(dataDir) {
  const pid = readPostmasterPid(dataDir);
  if (pid === null) return;
  if (pidAlive(pid) && /postgres|postmaster/.test(commandLineOf(pid))) {
    throw new SetupError(`PostgreSQL (pid ${pid}) runs on ${dataDir} but does not answer on its port; stop it or wait`);
  }
  say(`removing stale postmaster.pid (pid ${pid} is gone)`);
  fs.rmSync(path.join(dataDir, "postmaster.pid"), { force: true });
}

function initCluster(layout) {
  const clusterDir = path.dirname(layout.pgData);
  fs.mkdirSync(clusterDir, { recursive: true, mode: 0o700 });
  if (isRoot) run("chown", ["-R", "postgres:postgres", clusterDir]);
  if (fs.existsSync(path.join(layout.pgData, "PG_VERSION"))) return false;
  say(`creating the PostgreSQL cluster in ${layout.pgData}`);
  const [cmd, args] = asClusterOwner(`${PG_BIN}/initdb`, [
    "-D",
    layout.pgData,
    "-U",
    "postgres",
    "--auth=trust",
    "-E",
    "UTF8",
    "--locale=C.UTF-8",
  ]);
  run(cmd, args, { quiet: true });
  return true;
}

/**
 * Starts the cluster, or reuses it when it already answers on `port` with our data folder.
 * Returns { started, stop } where stop() is only meaningful when this call started it.
 * `fast` (tests only) turns durability off, which is safe only for a cluster we start ourselves.
 */
export async function ensurePostgres({ layout, port, fast = false }) {
  if (isReady(port)) {
    const running = psql(port, "postgres", "show data_directory", { allowFailure: true }).stdout.trim();
    if (realpathOrSelf(running) !== realpathOrSelf(layout.pgData)) {
      throw new SetupError(`port ${port} is held by another PostgreSQL (data in ${running || "unknown"}); stop it first`);
    }
    say(`PostgreSQL already runs on 127.0.0.1:${port}: reusing it`);
    return { started: false, stop: async () => {} };
  }
  if (await portAnswers(port)) throw new SetupError(`port ${port} is busy with something that is not PostgreSQL`);

  initCluster(layout);
  removeStalePidFile(layout.pgData);
  const options = [`-c listen_addresses=127.0.0.1`, `-c port=${port}`, `-c unix_socket_directories=''`];
  if (fast) options.push("-c fsync=off", "-c synchronous_commit=off", "-c full_page_writes=off");
  const [cmd, args] = asClusterOwner(`${PG_BIN}/pg_ctl`, [
    "-D",
    layout.pgData,
    "-l",
    layout.pgLog,
    "-w",
    "-t",
    "60",
    "-o",
    options.join(" "),
    "start",
  ]);
  const result = run(cmd, args, { quiet: true, allowFailure: true });
  if (result.status !== 0) {
    const tail = fs.existsSync(layout.pgLog) ? fs.readFileSync(layout.pgLog, "utf8").split("\n").slice(-15).join("\n") : "";
    throw new SetupError(`PostgreSQL did not start:\n${result.stdout}${result.stderr}\n${tail}`);
  }
  say(`PostgreSQL started on 127.0.0.1:${port}${fast ? " (fsync off, for tests)" : ""}`);
  return { started: true, stop: async () => stopPostgres({ layout }) };
}

/** Stops the cluster in the layout's data folder (fast: open sessions are ended); a dead one is cleaned up. */
export async function stopPostgres({ layout }) {
  const pid = readPostmasterPid(layout.pgData);
  if (pid === null) return;
  if (!pidAlive(pid)) {
    fs.rmSync(path.join(layout.pgData, "postmaster.pid"), { force: true }); // died already: pg_ctl would wait on it
    return;
  }
  const [stopCmd, stopArgs] = asClusterOwner(`${PG_BIN}/pg_ctl`, ["-D", layout.pgData, "-m", "fast", "-w", "-t", "30", "stop"]);
  run(stopCmd, stopArgs, { quiet: true });
}

export function createDatabaseIfMissing(port, name, owner) {
  const exists = psql(port, "postgres", `select 1 from pg_database where datname = '${name}'`).stdout.trim() === "1";
  if (!exists) {
    psql(port, "postgres", `create database "${name}" owner "${owner}"`);
    say(`created database ${name}`);
  }
  return !exists;
}

/** Drops and recreates a database, closing whatever sessions still hold it. */
export function recreateDatabase(port, name, owner) {
  psql(port, "postgres", `drop database if exists "${name}" with (force)`);
  psql(port, "postgres", `create database "${name}" owner "${owner}"`);
  say(`recreated database ${name}`);
}
