// The four roles. Stored on the user row as these keys.
export const ROLES = ["admin", "lead", "engineer", "auditor"] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  admin: "Admin",
  lead: "Standards lead",
  engineer: "Engineer",
  auditor: "QA auditor",
};

export const ROLE_SUMMARIES: Record<Role, string> = {
  admin: "Invites people, sets roles, deactivates accounts.",
  lead: "Writes and reviews templates, publishes and withdraws versions.",
  engineer: "Runs published versions inside jobs, prepares and checks calc sheets.",
  auditor: "Reads everything, traces and verifies results; changes nothing.",
};

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}
