// The shell's navigation as data. Each entry names the permission that its page checks on the
// server; the shell shows an entry only to roles that hold it, so nobody is offered a page that
// would answer 403. Hiding is a courtesy here — the page's own requirePageActor() is the check.
import type { Action } from "@/lib/domain/permissions";

export type NavIcon =
  "home" | "standards" | "libraries" | "jobs" | "runs" | "withdrawals" | "audit" | "integrity" | "people" | "mailbox";

export type NavItem = {
  href: string;
  label: string;
  icon: NavIcon;
  /** null: every signed-in person. */
  permission: Action | null;
  group: "work" | "admin";
};

export const NAV_ITEMS: NavItem[] = [
  { href: "/home", label: "Home", icon: "home", permission: null, group: "work" },
  { href: "/standards", label: "Standards", icon: "standards", permission: "library.read", group: "work" },
  { href: "/libraries", label: "Libraries", icon: "libraries", permission: "libraries.read", group: "work" },
  { href: "/jobs", label: "Jobs", icon: "jobs", permission: "jobs.read", group: "work" },
  { href: "/runs", label: "Runs", icon: "runs", permission: "runs.read", group: "work" },
  { href: "/withdrawals", label: "Withdrawals", icon: "withdrawals", permission: "runs.read", group: "work" },
  { href: "/audit", label: "Audit trail", icon: "audit", permission: "audit.read", group: "work" },
  { href: "/audit/integrity", label: "Integrity", icon: "integrity", permission: "integrity.verify", group: "work" },
  { href: "/admin/users", label: "People", icon: "people", permission: "users.read", group: "admin" },
  { href: "/admin/mailbox", label: "Demo mailbox", icon: "mailbox", permission: "mailbox.read", group: "admin" },
];
