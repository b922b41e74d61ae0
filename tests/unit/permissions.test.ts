// The permission table, cell by cell: every role × every action answers exactly what ROLE_PERMISSIONS
// says, plus the product's rules stated independently of that table.
import { describe, expect, it } from "vitest";
import { ACTIONS, ROLE_PERMISSIONS, can, type Action } from "@/lib/auth/permissions";
import { ROLES } from "@/lib/auth/roles";

const WRITES: readonly Action[] = [
  "users.invite",
  "users.set-role",
  "users.deactivate",
  "projects.create",
  "templates.write-draft",
  "templates.review",
  "templates.publish",
  "templates.withdraw",
  "runs.create",
  "runs.sign-prepared",
  "runs.sign-checked",
  "files.attach",
];

describe("can(role, action)", () => {
  for (const role of ROLES) {
    for (const action of ACTIONS) {
      const expected = ROLE_PERMISSIONS[role].includes(action);
      it(`${role} ${expected ? "may" : "may not"} ${action}`, () => {
        expect(can(role, action)).toBe(expected);
      });
    }
  }

  it("answers false for no role", () => {
    for (const action of ACTIONS) {
      expect(can(null, action)).toBe(false);
      expect(can(undefined, action)).toBe(false);
    }
  });

  it("the table names only known actions", () => {
    for (const role of ROLES) for (const action of ROLE_PERMISSIONS[role]) expect(ACTIONS).toContain(action);
  });

  it("every write is listed as a write or is a read", () => {
    const reads = ACTIONS.filter((a) => !WRITES.includes(a));
    for (const action of reads) expect(action).toMatch(/\.(read|trace|export)$/);
  });
});

describe("the product's role rules", () => {
  it("an auditor can write nothing", () => {
    for (const action of WRITES) expect(can("auditor", action)).toBe(false);
  });

  it("an auditor reads everything there is to read", () => {
    for (const action of ["projects.read", "library.read", "runs.read", "audit.read", "audit.trace", "audit.export", "users.read"] as const) {
      expect(can("auditor", action)).toBe(true);
    }
  });

  it("an admin manages people but cannot run calculations or touch templates", () => {
    for (const action of ["users.invite", "users.set-role", "users.deactivate"] as const) expect(can("admin", action)).toBe(true);
    for (const action of ["runs.create", "runs.sign-prepared", "runs.sign-checked", "templates.write-draft", "templates.publish"] as const) {
      expect(can("admin", action)).toBe(false);
    }
  });

  it("a standards lead may do everything an engineer may, and publish", () => {
    for (const action of ROLE_PERMISSIONS.engineer) expect(can("lead", action)).toBe(true);
    expect(can("lead", "templates.publish")).toBe(true);
    expect(can("engineer", "templates.publish")).toBe(false);
  });

  it("only admins manage people", () => {
    for (const role of ROLES) {
      expect(can(role, "users.invite")).toBe(role === "admin");
      expect(can(role, "users.deactivate")).toBe(role === "admin");
    }
  });
});
