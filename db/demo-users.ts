// The invented demo firm. Demo passwords only: printed by `npm start` and in the README.
// The .example domain is reserved and can never deliver real mail.
import type { Role } from "@/lib/domain/roles";

export const DEMO_FIRM_NAME = "Marrowby Fenn Structural";

export const DEMO_USERS: { name: string; email: string; password: string; role: Role }[] = [
  { name: "Ines Okafor-Lind", email: "admin@marrowby-fenn.example", password: "demo-admin-2291", role: "admin" },
  { name: "Tomasz Reyne", email: "lead@marrowby-fenn.example", password: "demo-lead-2291", role: "lead" },
  // A second lead: a standard is published only when a lead other than its author approves it.
  { name: "Abena Harcastle", email: "reviewer@marrowby-fenn.example", password: "demo-reviewer-2291", role: "lead" },
  { name: "Priya Vantongeren", email: "engineer@marrowby-fenn.example", password: "demo-engineer-2291", role: "engineer" },
  { name: "Hal Duckworth-Emery", email: "auditor@marrowby-fenn.example", password: "demo-auditor-2291", role: "auditor" },
];

/** `responsible`: the demo person (by role) who approves the job's calcs. */
export const DEMO_JOBS: { jobNumber: string; name: string; client: string; site: string; responsible: Role }[] = [
  {
    jobNumber: "MF-2291",
    name: "Quarry Lane depot extension",
    client: "Brindlecote Logistics",
    site: "Quarry Lane, Brindlecote",
    responsible: "lead",
  },
  {
    jobNumber: "MF-2304",
    name: "Saltmarsh footbridge refurbishment",
    client: "Pellworth Harbour Trust",
    site: "Saltmarsh Quay, Pellworth",
    responsible: "lead",
  },
];
