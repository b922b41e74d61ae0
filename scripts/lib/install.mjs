// Installs what a fresh machine lacks: npm dependencies, Debian's postgresql-15 and chromium (the server renders
// calc sheets to PDF with it; the browser tests drive it), and for the tests poppler-utils (pdftotext).
import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { repoRoot } from "./env.mjs";
import { SetupError, isRoot, runAsync, say } from "./processes.mjs";

export const PG_BIN = "/usr/lib/postgresql/15/bin";
export const CHROMIUM = "/usr/bin/chromium";

/**
 * `npm ci` when node_modules is missing or package-lock.json is newer than the last install (and its
 * content changed: a checkout that only touched the file does not reinstall). Returns true when it installed.
 */
export async function ensureNodeModules() {
  const lock = path.join(repoRoot, "package-lock.json");
  const installedMarker = path.join(repoRoot, "node_modules", ".package-lock.json");
  const lockHashFile = path.join(repoRoot, "node_modules", ".gusset-lock.sha256");
  const hasLock = fs.existsSync(lock);
  const installed = fs.existsSync(installedMarker);
  const lockHash = hasLock ? crypto.createHash("sha256").update(fs.readFileSync(lock)).digest("hex") : "";
  if (installed) {
    if (!hasLock || fs.statSync(lock).mtimeMs <= fs.statSync(installedMarker).mtimeMs) return false;
    if (fs.existsSync(lockHashFile) && fs.readFileSync(lockHashFile, "utf8").trim() === lockHash) return false;
  }
  const args = hasLock ? ["ci", "--no-audit", "--no-fund"] : ["install", "--no-audit", "--no-fund"];
  say(installed ? "package-lock.json changed since the last install: reinstalling" : "node_modules is missing: installing");
  await runAsync("npm", args, { cwd: repoRoot });
  if (hasLock) fs.writeFileSync(lockHashFile, `${lockHash}\n`);
  return true;
}

/** Installs the Debian packages whose marker file is missing; one apt run for all of them. */
export async function ensureDebianPackages(wanted) {
  const missing = wanted.filter((p) => !fs.existsSync(p.marker));
  if (missing.length === 0) return false;
  const names = missing.map((p) => p.name);
  if (!isRoot) {
    throw new SetupError(
      `${names.join(" and ")} ${missing.length > 1 ? "are" : "is"} not installed and this is not root. Install with:\n` +
        (names.includes("postgresql-15")
          ? `  sudo mkdir -p /etc/postgresql-common/createcluster.d && echo 'create_main_cluster = false' | sudo tee /etc/postgresql-common/createcluster.d/00-no-main.conf\n`
          : "") +
        `  sudo apt-get update && sudo apt-get install -y --no-install-recommends ${names.join(" ")}\n` +
        `then run this command again.`,
    );
  }
  if (names.includes("postgresql-15")) {
    // Without this, the package creates and starts nothing useful: an unused cluster on 5432.
    const dir = "/etc/postgresql-common/createcluster.d";
    fs.mkdirSync(dir, { recursive: true });
    fs.writeFileSync(path.join(dir, "00-no-main.conf"), "create_main_cluster = false\n");
  }
  say(`installing Debian packages: ${names.join(" ")}`);
  const env = { ...process.env, DEBIAN_FRONTEND: "noninteractive" };
  const install = ["-o", "DPkg::Lock::Timeout=300", "install", "-y", "--no-install-recommends", ...names];
  if (!hasAptLists()) await runAsync("apt-get", ["-o", "DPkg::Lock::Timeout=300", "update"], { env });
  try {
    await runAsync("apt-get", install, { env });
  } catch {
    say("apt-get install failed; refreshing the package lists and trying again");
    await runAsync("apt-get", ["-o", "DPkg::Lock::Timeout=300", "update"], { env });
    await runAsync("apt-get", install, { env });
  }
  for (const p of missing) {
    if (!fs.existsSync(p.marker)) throw new SetupError(`${p.name} installed but ${p.marker} is still missing`);
  }
  return true;
}

function hasAptLists() {
  try {
    return fs.readdirSync("/var/lib/apt/lists").some((f) => f.endsWith("_Packages"));
  } catch {
    return false;
  }
}

export const POSTGRES_PACKAGE = { name: "postgresql-15", marker: `${PG_BIN}/initdb` };
export const CHROMIUM_PACKAGE = { name: "chromium", marker: CHROMIUM };
/** pdftotext, which the tests read the calc sheet PDFs with. */
export const POPPLER_PACKAGE = { name: "poppler-utils", marker: "/usr/bin/pdftotext" };
