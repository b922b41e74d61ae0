// The demo firm: one user per role and two jobs. Seeds only an empty database (no users), so it
// never touches a firm's real data. People are created the way an accepted invitation creates them.
import { count } from "drizzle-orm";
import type { NodePgDatabase } from "drizzle-orm/node-postgres";
import { createCredentialUser } from "./credentials";
import { DEMO_FIRM_NAME, DEMO_JOBS, DEMO_USERS } from "./demo-users";
import * as schema from "./schema";

export type SeedResult = { seeded: false } | { seeded: true; users: number; jobs: number };

export async function seedDemoFirm(database: NodePgDatabase<typeof schema>): Promise<SeedResult> {
  return database.transaction(async (tx) => {
    // Serialises two seeds racing on the same empty database (e.g. two starts at once).
    await tx.execute("select pg_advisory_xact_lock(22910)");
    const [{ n }] = await tx.select({ n: count() }).from(schema.user);
    if (n > 0) return { seeded: false };

    await tx.insert(schema.firm).values({ name: DEMO_FIRM_NAME });
    const ids: Record<string, string> = {};
    for (const demo of DEMO_USERS) {
      const { id } = await createCredentialUser(tx, { ...demo, emailVerified: true });
      ids[demo.role] ??= id; // the first of each role (the demo has two leads)
    }
    await tx.insert(schema.jobs).values(
      DEMO_JOBS.map(({ responsible, ...job }) => ({
        ...job,
        responsibleEngineerId: ids[responsible] ?? null,
        createdById: ids.lead ?? ids.engineer ?? null,
      })),
    );
    await tx.insert(schema.auditEvents).values({
      action: "system.seed",
      details: { firm: DEMO_FIRM_NAME, users: DEMO_USERS.length, jobs: DEMO_JOBS.length },
    });
    return { seeded: true, users: DEMO_USERS.length, jobs: DEMO_JOBS.length };
  });
}
