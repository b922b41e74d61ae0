// Migrations, the demo seed and the demo sign-ins, each run through tsx against DATABASE_URL.
import fs from "node:fs";
import path from "node:path";
import { repoRoot } from "./env.mjs";
import { SetupError, run, say } from "./processes.mjs";

const tsx = path.join(repoRoot, "node_modules", ".bin", "tsx");

export function migrate(env) {
  run(tsx, ["scripts/migrate.ts"], { cwd: repoRoot, env });
}

export function seed(env) {
  if (!fs.existsSync(path.join(repoRoot, "scripts", "seed.ts"))) {
    say("scripts/seed.ts does not exist yet: no demo data seeded");
    return;
  }
  // react-server makes `server-only` an empty module, so the seed may reuse the data-access layer.
  run(tsx, ["--conditions=react-server", "scripts/seed.ts"], { cwd: repoRoot, env });
}

/** { firm, users } from db/demo-users.ts, or null when that file does not exist yet. */
export function demoSignIns(env) {
  if (!fs.existsSync(path.join(repoRoot, "db", "demo-users.ts"))) return null;
  const result = run(tsx, ["--conditions=react-server", "scripts/lib/demo-users.ts"], { cwd: repoRoot, env, quiet: true, allowFailure: true });
  if (result.status !== 0) {
    say(`could not read db/demo-users.ts:\n${result.stderr.trim()}`);
    return null;
  }
  try {
    return JSON.parse(result.stdout.trim().split("\n").pop());
  } catch {
    throw new SetupError(`scripts/lib/demo-users.ts printed something unexpected:\n${result.stdout}`);
  }
}

export function printSignIns(signIns) {
  if (!signIns) {
    say("db/demo-users.ts does not exist yet: no demo sign-ins to show");
    return;
  }
  console.log(`\nDemo sign-ins${signIns.firm ? ` (${signIns.firm}, demo only)` : ""}:`);
  const width = Math.max(...signIns.users.map((u) => u.email.length));
  for (const user of signIns.users) {
    console.log(`  ${user.role.padEnd(9)} ${user.email.padEnd(width)}  ${user.password}   (${user.name})`);
  }
  console.log("");
}
