// Permissions are data: a list of actions and, for each role, the actions it may take.
// Every use case names one of these actions (lib/use-cases), and the runner checks it on the server
// before any data is touched. Hiding a button is never the check.
import type { Role } from "./roles";

export const ACTIONS = [
  // people
  "users.read",
  "users.invite",
  "users.set-role",
  "users.deactivate",
  "mailbox.read",
  // jobs
  "jobs.read",
  "jobs.create",
  "jobs.edit",
  // the template library
  "library.read",
  "templates.write-draft",
  "templates.review",
  "templates.publish",
  "templates.withdraw",
  // the firm's libraries (sections, materials, load-combination sets): everyone reads them; admins and leads
  // maintain them, a second of them reviewing each change (four eyes, kept by the use cases and the database)
  "libraries.read",
  "libraries.write-draft",
  "libraries.review",
  "libraries.publish",
  "libraries.withdraw",
  // runs and sign-off
  "runs.read",
  "runs.create",
  "runs.sign-prepared",
  "runs.sign-checked",
  "runs.sign-approved",
  "files.attach",
  // a stored run evaluated again (its own bundle, or today's) and compared: slow work that changes no record
  "runs.reproduce",
  // after a withdrawal: a lead re-runs every affected run on the successor; the signed outcome of an affected calc
  // revision is recorded by a lead, or by the responsible engineer of that calc's job (the use case checks which job)
  "withdrawals.rerun",
  "withdrawals.record-outcome",
  // audit
  "audit.read",
  // the run log: every run with its sign-off state, filtered and sorted for a quality audit
  "run-log.read",
  "audit.trace",
  "audit.export",
  "log.read",
  "integrity.verify",
] as const;
export type Action = (typeof ACTIONS)[number];

/** Maintaining the firm's libraries: admins and leads. */
const LIBRARY_MAINTENANCE: readonly Action[] = [
  "libraries.write-draft",
  "libraries.review",
  "libraries.publish",
  "libraries.withdraw",
];

const ENGINEER: readonly Action[] = [
  "log.read",
  "jobs.read",
  "jobs.create",
  "jobs.edit",
  "library.read",
  "libraries.read",
  "runs.read",
  "runs.create",
  "runs.sign-prepared",
  "runs.sign-checked",
  "runs.sign-approved",
  "files.attach",
  "withdrawals.record-outcome",
];

export const ROLE_PERMISSIONS: Record<Role, readonly Action[]> = {
  admin: [
    "users.read",
    "users.invite",
    "users.set-role",
    "users.deactivate",
    "mailbox.read",
    "audit.read",
    "log.read",
    "integrity.verify",
    "run-log.read",
    "libraries.read",
    ...LIBRARY_MAINTENANCE,
  ],
  lead: [
    ...ENGINEER,
    "templates.write-draft",
    "templates.review",
    "templates.publish",
    "templates.withdraw",
    "runs.reproduce",
    "run-log.read",
    "withdrawals.rerun",
    ...LIBRARY_MAINTENANCE,
  ],
  engineer: ENGINEER,
  auditor: [
    "jobs.read",
    "library.read",
    "libraries.read",
    "runs.read",
    "runs.reproduce",
    "audit.read",
    "run-log.read",
    "audit.trace",
    "audit.export",
    "log.read",
    "integrity.verify",
    "users.read",
  ],
};

export function can(role: Role | null | undefined, action: Action): boolean {
  if (!role) return false;
  return ROLE_PERMISSIONS[role].includes(action);
}

/** What a use case requires: an action from the table, "signed-in" for any active role, or "public" for anyone. */
export type Permission = Action | "signed-in" | "public";
