// Runs made for browser tests the way a person makes them: a job of the demo engineer's own, and runs posted to
// POST /api/runs with a signed-in session (the route validates, evaluates and stores as it does for the run form).
import { desc, eq } from "drizzle-orm";
import { expect } from "vitest";
import { db } from "@/db";
import * as schema from "@/db/schema";
import { appUrl, testEnv } from "./env";
import { DEMO_BY_ROLE } from "./pages";

/** The id of a seeded standard's newest version. */
export async function latestVersionId(slug: string): Promise<string> {
  const [version] = await db
    .select({ id: schema.standardVersions.id })
    .from(schema.standardVersions)
    .innerJoin(schema.standards, eq(schema.standards.id, schema.standardVersions.standardId))
    .where(eq(schema.standards.slug, slug))
    .orderBy(desc(schema.standardVersions.number))
    .limit(1);
  if (!version) throw new Error(`the seed has no standard ${slug}`);
  return version.id;
}

/** A job of its own (its number starts with `prefix` and is new on every call), the demo engineer responsible. */
export async function demoEngineerJob(prefix: string, name: string): Promise<{ id: string; jobNumber: string }> {
  const [engineer] = await db.select().from(schema.user).where(eq(schema.user.email, DEMO_BY_ROLE.engineer.email));
  const jobNumber = `${prefix}-${Date.now().toString(36).toUpperCase()}-${Math.random().toString(36).slice(2, 5).toUpperCase()}`;
  const [job] = await db
    .insert(schema.jobs)
    .values({ jobNumber, name, responsibleEngineerId: engineer.id, createdById: engineer.id })
    .returning({ id: schema.jobs.id });
  return { id: job.id, jobNumber };
}

/** Posts one run as the person whose session cookie is given; expects it stored (201) and returns its id. */
export async function postRun(
  cookie: string,
  run: { jobId: string; versionId: string; inputs: Record<string, string> },
): Promise<string> {
  const response = await fetch(appUrl("/api/runs"), {
    method: "POST",
    headers: { cookie, origin: testEnv.baseUrl, "content-type": "application/json" },
    body: JSON.stringify(run),
  });
  expect(response.status).toBe(201);
  return ((await response.json()) as { data: { id: string } }).data.id;
}
