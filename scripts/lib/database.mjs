// Migrations (as the owner role, DATABASE_OWNER_URL), the demo seed and the demo sign-ins (as the app's
// role, DATABASE_URL), each run through tsx.
import fs from "node:fs";
import path from "node:path";
import { repoRoot } from "./env.mjs";
import { runAsync, say } from "./processes.mjs";

const tsx = path.join(repoRoot, "node_modules", ".bin", "tsx");

export async function migrate(env) {
  await runAsync(tsx, ["scripts/migrate.ts"], { cwd: repoRoot, env });
}

export async function seed(env) {
  if (!fs.existsSync(path.join(repoRoot, "scripts", "seed.ts"))) {
    say("scripts/seed.ts does not exist yet: no demo data seeded");
    return;
  }
  // react-server makes `server-only` an empty module, so the seed may reuse the data-access layer.
  await runAsync(tsx, ["--conditions=react-server", "scripts/seed.ts"], { cwd: repoRoot, env });
}

/**
 * Runs the verification cases of the firm's live standards (published or superseded, not withdrawn) on
 * this engine. A failure is a warning, not a stop: the app still serves, and the standards lead is told
 * which version to look at (an engine change may have broken a published standard).
 */
export async function verifyLiveStandards(env) {
  const result = await runAsync(tsx, ["scripts/verify-standards.ts", "--live-only"], {
    cwd: repoRoot,
    env,
    quiet: true,
    allowFailure: true,
  });
  const summary = result.stdout.trim().split("\n").at(-1) ?? "";
  if (result.status === 0) {
    say(`live standards verified on this engine: ${summary}`);
    return;
  }
  say("WARNING: a live standard fails its verification cases on this engine. Tell a standards lead; details:");
  const failures = result.stdout.split("\n").filter((line) => /✗|FAIL|could not/.test(line));
  for (const line of failures.slice(0, 20)) console.log(`  ${line.trim()}`);
  if (result.stderr.trim()) console.log(result.stderr.trim().split("\n").slice(-5).join("\n"));
}

/** { firm, users } from db/demo-users.ts, or null when that file does not exist yet or cannot load. */
export async function demoSignIns(env) {
  if (!fs.existsSync(path.join(repoRoot, "db", "demo-users.ts"))) return null;
  const result = await runAsync(tsx, ["--conditions=react-server", "scripts/lib/demo-users.ts"], {
    cwd: repoRoot,
    env,
    quiet: true,
    allowFailure: true,
  });
  try {
    if (result.status !== 0) throw new Error(result.stderr.trim());
    return JSON.parse(result.stdout.trim().split("\n").pop());
  } catch (error) {
    say(`could not read the demo sign-ins from db/demo-users.ts: ${error.message}`);
    return null;
  }
}

export function printSignIns(signIns) {
  if (!signIns) {
    say("no demo sign-ins to show (db/demo-users.ts is missing or did not load)");
    return;
  }
  console.log(`\nDemo sign-ins${signIns.firm ? ` (${signIns.firm}, demo only)` : ""}:`);
  const widest = (key) => Math.max(...signIns.users.map((u) => u[key].length));
  const [email, password] = [widest("email"), widest("password")];
  for (const user of signIns.users) {
    console.log(`  ${user.role.padEnd(9)} ${user.email.padEnd(email)}  ${user.password.padEnd(password)}  ${user.name}`);
  }
}
