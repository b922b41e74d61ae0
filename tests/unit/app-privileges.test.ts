// The rule behind the app's table privileges (scripts/lib/app-privileges.ts), for the cases the database
// has no table for yet: a trigger that refuses only some statements takes away only those. What the
// migrated database really grants is checked in tests/integration/database-role.test.ts.
import { describe, expect, it } from "vitest";
import { tablePrivileges, type Relation } from "@/scripts/lib/app-privileges";

const table = (fields: Partial<Relation>): Relation => ({
  schema: "public",
  name: "t",
  kind: "table",
  partitionOf: null,
  refused: [],
  ...fields,
});

describe("tablePrivileges", () => {
  it("gives reading and writing rows on a table without a refusing trigger", () => {
    expect(tablePrivileges(table({ name: "jobs" }))).toEqual(["SELECT", "INSERT", "UPDATE", "DELETE"]);
  });

  it("takes away exactly what a gusset_refuse_ trigger refuses", () => {
    expect(tablePrivileges(table({ name: "audit_events", refused: ["DELETE", "UPDATE"] }))).toEqual(["SELECT", "INSERT"]);
    expect(tablePrivileges(table({ name: "signatures", refused: ["DELETE"] }))).toEqual(["SELECT", "INSERT", "UPDATE"]);
  });

  it("gives pg-boss its run-time privileges: jobs and their partitions, archive, version stamps, queues read-only", () => {
    const job = (name: string, partitionOf: string | null = null) => table({ schema: "pgboss", name, partitionOf });
    const rows = ["SELECT", "INSERT", "UPDATE", "DELETE"];
    expect(tablePrivileges(job("job"))).toEqual(rows);
    expect(tablePrivileges(job("j2402e807ea5", "job"))).toEqual(rows);
    expect(tablePrivileges(job("archive"))).toEqual(rows);
    expect(tablePrivileges(job("version"))).toEqual(["SELECT", "UPDATE"]);
    for (const name of ["queue", "schedule", "subscription"]) expect(tablePrivileges(job(name))).toEqual(["SELECT"]);
  });
});
