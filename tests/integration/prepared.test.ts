// Prepared statements (lib/data/prepared.ts) against the real database: on the pool and inside a transaction they
// give the same rows, mapped as drizzle maps them (a left join with no row gives null, jsonb and timestamps come back
// as they went in); inside a transaction they are part of it (they see its writes, and a rollback takes theirs);
// PostgreSQL keeps each by its name on the connection that ran it; a name is never taken twice.
import { eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { auditEvents, user } from "@/db/schema";
import { prepared } from "@/lib/data/prepared";
import { currentDb, runInTransaction } from "@/lib/data/transaction";
import { createTestUser, uniqueEmail } from "./helpers/people";

const insertEvent = prepared("gusset_test_insert_event", (executor) =>
  executor
    .insert(auditEvents)
    .values({
      actorId: sql.placeholder("actorId"),
      actorEmail: sql.placeholder("actorEmail"),
      action: "users.reactivate",
      details: sql.placeholder("details"),
    })
    .returning({ id: auditEvents.id, occurredAt: auditEvents.occurredAt }),
);

const eventsByEmail = prepared("gusset_test_events_by_email", (executor) =>
  executor
    .select({
      id: auditEvents.id,
      details: auditEvents.details,
      occurredAt: auditEvents.occurredAt,
      actor: { name: user.name, role: user.role },
    })
    .from(auditEvents)
    .leftJoin(user, eq(user.id, auditEvents.actorId))
    .where(eq(auditEvents.actorEmail, sql.placeholder("email")))
    .orderBy(auditEvents.id),
);

class Rollback extends Error {}

describe("prepared statements", () => {
  it("give the same rows on the pool and in a transaction, mapped as drizzle maps them", async () => {
    const { actor } = await createTestUser({ role: "engineer" });
    const email = uniqueEmail("prepared");
    const details = { note: "prepared", nested: { n: 1.5, list: [1, "two", null] } };
    const [first] = await insertEvent({ actorId: actor.id, actorEmail: email, details });
    await runInTransaction(async () => insertEvent({ actorId: null, actorEmail: email, details: {} }));

    const onPool = await eventsByEmail({ email });
    const inTransaction = await runInTransaction(async () => eventsByEmail({ email }));
    expect(inTransaction).toEqual(onPool);
    expect(onPool).toHaveLength(2);
    expect(onPool[0]).toEqual({
      id: first.id,
      details,
      occurredAt: first.occurredAt,
      actor: { name: actor.name, role: "engineer" },
    });
    expect(onPool[0].occurredAt).toBeInstanceOf(Date);
    // The left join found no person: the nested object is null, not an object of nulls.
    expect(onPool[1].actor).toBeNull();
    expect(onPool[1].details).toEqual({});
  });

  it("are part of the transaction they run in: they see its writes, and its rollback takes theirs", async () => {
    const email = uniqueEmail("prepared-rollback");
    const seen = await runInTransaction(async () => {
      await insertEvent({ actorId: null, actorEmail: email, details: { step: 1 } });
      return eventsByEmail({ email });
    });
    expect(seen).toHaveLength(1);

    await expect(
      runInTransaction(async () => {
        await insertEvent({ actorId: null, actorEmail: email, details: { step: 2 } });
        expect(await eventsByEmail({ email })).toHaveLength(2);
        throw new Rollback();
      }),
    ).rejects.toBeInstanceOf(Rollback);
    expect((await eventsByEmail({ email })).map((row) => row.details)).toEqual([{ step: 1 }]);
  });

  it("are kept by PostgreSQL under their name on the connection that ran them", async () => {
    const names = await runInTransaction(async () => {
      await eventsByEmail({ email: uniqueEmail("prepared-name") });
      const result = await currentDb().execute<{ name: string }>(
        sql`select name from pg_prepared_statements where name like 'gusset_test_%'`,
      );
      return result.rows.map((row) => row.name);
    });
    expect(names).toContain("gusset_test_events_by_email");
  });

  it("never share a name", () => {
    expect(() => prepared("gusset_test_events_by_email", (executor) => executor.select().from(user))).toThrow(
      "the statement name gusset_test_events_by_email is taken",
    );
  });
});
