// The permission table against the product's rules for each role, written out here cell by cell
// rather than read from ROLE_PERMISSIONS: a grant or a refusal that differs from the product's roles
// table fails, and a new action fails until it has a row below.
//
// The roles table (who may do what):
//   admin          invite users, set roles, deactivate accounts
//   standards lead everything an engineer may; write drafts, review another lead's draft, publish,
//                  withdraw, maintain the firm's libraries
//
// The libraries issue adds: the firm's libraries (sections, materials, combination sets) are read by
// everyone, admins included, and edited by admins and leads, a second one of them reviewing each change.
//   engineer       create jobs, run published versions, attach files, issue calc revisions as
//                  preparer, check the revisions assigned to them, approve as a job's responsible engineer
//   auditor        read everything, trace, reproduce, verify integrity, export evidence; change nothing
import { describe, expect, it } from "vitest";
import { ACTIONS, ROLE_PERMISSIONS, can, type Action } from "@/lib/domain/permissions";
import { ROLES, type Role } from "@/lib/domain/roles";

const Y = true;
const N = false;

/** Each action's row: may an admin, a standards lead, an engineer, an auditor take it? */
const EXPECTED: Record<Action, Record<Role, boolean>> = {
  // admin: "invite users, set roles, deactivate accounts" is done from the list of people; auditor: "read everything".
  "users.read": { admin: Y, lead: N, engineer: N, auditor: Y },
  // admin: "invite users"; nobody else.
  "users.invite": { admin: Y, lead: N, engineer: N, auditor: N },
  // admin: "set roles"; nobody else.
  "users.set-role": { admin: Y, lead: N, engineer: N, auditor: N },
  // admin: "deactivate accounts"; nobody else.
  "users.deactivate": { admin: Y, lead: N, engineer: N, auditor: N },
  // admin: follows the invitation and reset links they send (the demo mailbox); links are credentials, so not "read everything".
  "mailbox.read": { admin: Y, lead: N, engineer: N, auditor: N },
  // engineer: "create jobs, run published versions" inside them; lead: "everything an engineer may"; auditor: "read everything".
  "jobs.read": { admin: N, lead: Y, engineer: Y, auditor: Y },
  // engineer: "create jobs"; lead: "everything an engineer may".
  "jobs.create": { admin: N, lead: Y, engineer: Y, auditor: N },
  // engineer: keeps the jobs they create (name, client, site, responsible engineer, status); lead: as an engineer.
  "jobs.edit": { admin: N, lead: Y, engineer: Y, auditor: N },
  // engineer: "run published versions" (picked from the library); lead: writes it; auditor: "read everything".
  "library.read": { admin: N, lead: Y, engineer: Y, auditor: Y },
  // lead: "write drafts"; engineers only run published versions.
  "templates.write-draft": { admin: N, lead: Y, engineer: N, auditor: N },
  // lead: "review another lead's draft".
  "templates.review": { admin: N, lead: Y, engineer: N, auditor: N },
  // lead: "publish".
  "templates.publish": { admin: N, lead: Y, engineer: N, auditor: N },
  // lead: "withdraw".
  "templates.withdraw": { admin: N, lead: Y, engineer: N, auditor: N },
  // libraries: "everyone reads" (engineers pick sections for runs; auditors "read everything"; admins maintain them).
  "libraries.read": { admin: Y, lead: Y, engineer: Y, auditor: Y },
  // libraries: "admin and leads edit"; lead: "maintain the firm's libraries".
  "libraries.write-draft": { admin: Y, lead: Y, engineer: N, auditor: N },
  // libraries: a second admin or lead reviews (four eyes between any two of them).
  "libraries.review": { admin: Y, lead: Y, engineer: N, auditor: N },
  // libraries: the reviewer's approval publishes.
  "libraries.publish": { admin: Y, lead: Y, engineer: N, auditor: N },
  // libraries: a wrong version or entry is withdrawn by an admin or a lead.
  "libraries.withdraw": { admin: Y, lead: Y, engineer: N, auditor: N },
  // engineer: "run published versions", "check the revisions assigned to them"; lead: as an engineer; auditor: "read everything".
  "runs.read": { admin: N, lead: Y, engineer: Y, auditor: Y },
  // engineer: "run published versions"; lead: as an engineer; auditor: "change nothing".
  "runs.create": { admin: N, lead: Y, engineer: Y, auditor: N },
  // engineer: "issue calc revisions as preparer"; lead: as an engineer.
  "runs.sign-prepared": { admin: N, lead: Y, engineer: Y, auditor: N },
  // engineer: "check the revisions assigned to them"; lead: as an engineer.
  "runs.sign-checked": { admin: N, lead: Y, engineer: Y, auditor: N },
  // engineer: "approve as a job's responsible engineer"; lead: as an engineer.
  "runs.sign-approved": { admin: N, lead: Y, engineer: Y, auditor: N },
  // engineer: "attach files"; lead: as an engineer.
  "files.attach": { admin: N, lead: Y, engineer: Y, auditor: N },
  // auditor: "reproduce"; lead: answers for the standards whose runs are reproduced. Engineers run, they do not audit.
  "runs.reproduce": { admin: N, lead: Y, engineer: N, auditor: Y },
  // lead: re-runs every affected run on the successor after a withdrawal (the issue: "a lead starts a batch").
  "withdrawals.rerun": { admin: N, lead: Y, engineer: N, auditor: N },
  // lead, and a job's responsible engineer for that job's calcs (the use case checks the job): signs an outcome.
  "withdrawals.record-outcome": { admin: N, lead: Y, engineer: Y, auditor: N },
  // auditor: "read everything"; admin: sees the trail of the account changes and sign-ins they answer for (people page, home).
  "audit.read": { admin: Y, lead: N, engineer: N, auditor: Y },
  // The run log (who ran what, when, how it came out, how far it is signed off): the auditor's, who "reads everything";
  // the lead's, who answers for the standards and finds every job a version touched; the admin's, whose audit trail
  // already names every run made. Engineers keep the runs list; it is not their audit.
  "run-log.read": { admin: Y, lead: Y, engineer: N, auditor: Y },
  // auditor: "trace" any number back to its source.
  "audit.trace": { admin: N, lead: N, engineer: N, auditor: Y },
  // auditor: "export evidence".
  "audit.export": { admin: N, lead: N, engineer: N, auditor: Y },
  // The verifiable log: anyone in the firm may check a proof or a tree head (they reveal hashes only); running the
  // full integrity check is the quality manager's job ("verify integrity"), and the admin's, who runs the servers.
  "log.read": { admin: Y, lead: Y, engineer: Y, auditor: Y },
  "integrity.verify": { admin: Y, lead: N, engineer: N, auditor: Y },
};

/** Actions that change something; an auditor "changes nothing". */
const WRITES: readonly Action[] = [
  "users.invite",
  "users.set-role",
  "users.deactivate",
  "jobs.create",
  "jobs.edit",
  "templates.write-draft",
  "templates.review",
  "templates.publish",
  "templates.withdraw",
  "libraries.write-draft",
  "libraries.review",
  "libraries.publish",
  "libraries.withdraw",
  "runs.create",
  "runs.sign-prepared",
  "runs.sign-checked",
  "runs.sign-approved",
  "files.attach",
  "withdrawals.rerun",
  "withdrawals.record-outcome",
];

const allowedFor = (role: Role) => ACTIONS.filter((action) => EXPECTED[action][role]);

describe("the expectation table", () => {
  it("has one row for every action, and no row for an action that does not exist", () => {
    expect(Object.keys(EXPECTED).sort()).toEqual([...ACTIONS].sort());
  });

  it("has a column for every role in every row", () => {
    for (const action of ACTIONS) expect(Object.keys(EXPECTED[action]).sort(), action).toEqual([...ROLES].sort());
  });
});

describe("can(role, action)", () => {
  for (const role of ROLES) {
    for (const action of ACTIONS) {
      const expected = EXPECTED[action]?.[role];
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
});

describe("ROLE_PERMISSIONS", () => {
  it.each(ROLES)("grants %s exactly the expected actions, each once", (role) => {
    expect([...ROLE_PERMISSIONS[role]].sort()).toEqual(allowedFor(role).sort());
  });
});

describe("the product's role rules, checked on the expectation table and on can()", () => {
  it("an auditor changes nothing", () => {
    for (const action of WRITES) {
      expect(EXPECTED[action].auditor, action).toBe(false);
      expect(can("auditor", action), action).toBe(false);
    }
  });

  // The auditor's verbs: "read everything, trace, reproduce, verify integrity, export evidence".
  it("every action that is not a write is a read, a trace, a reproduction, a verification or an export", () => {
    for (const action of ACTIONS.filter((a) => !WRITES.includes(a)))
      expect(action).toMatch(/\.(read|trace|reproduce|verify|export)$/);
  });

  it("a standards lead may do everything an engineer may", () => {
    for (const action of allowedFor("engineer")) {
      expect(EXPECTED[action].lead, action).toBe(true);
      expect(can("lead", action), action).toBe(true);
    }
  });

  it("only an admin manages people", () => {
    for (const action of ["users.invite", "users.set-role", "users.deactivate"] as const) {
      for (const role of ROLES) expect(can(role, action), `${role} ${action}`).toBe(role === "admin");
    }
  });

  it("only a standards lead writes, reviews, publishes and withdraws templates", () => {
    for (const action of ["templates.write-draft", "templates.review", "templates.publish", "templates.withdraw"] as const) {
      for (const role of ROLES) expect(can(role, action), `${role} ${action}`).toBe(role === "lead");
    }
  });

  it("everyone reads the libraries; admins and leads write, review, publish and withdraw them", () => {
    for (const role of ROLES) expect(can(role, "libraries.read"), role).toBe(true);
    for (const action of ["libraries.write-draft", "libraries.review", "libraries.publish", "libraries.withdraw"] as const) {
      for (const role of ROLES) expect(can(role, action), `${role} ${action}`).toBe(role === "admin" || role === "lead");
    }
  });

  it("whoever may write a library draft may also review one, so any two of them make four eyes", () => {
    for (const role of ROLES) expect(can(role, "libraries.review"), role).toBe(can(role, "libraries.write-draft"));
  });
});
