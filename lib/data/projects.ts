import "server-only";
// Projects (jobs): rows for the lists. Reading needs projects.read (lib/use-cases/projects.ts):
// engineers, leads and auditors; admins manage people, not engineering work.
import { desc, eq, sql } from "drizzle-orm";
import { projects, user } from "@/db/schema";
import { currentDb } from "./transaction";

export type ProjectDto = {
  id: string;
  jobNumber: string;
  name: string;
  client: string | null;
  createdByName: string | null;
  createdAt: string;
};

export async function listProjects({ limit }: { limit?: number } = {}): Promise<ProjectDto[]> {
  const query = currentDb()
    .select({
      id: projects.id,
      jobNumber: projects.jobNumber,
      name: projects.name,
      client: projects.client,
      createdByName: user.name,
      createdAt: projects.createdAt,
    })
    .from(projects)
    .leftJoin(user, eq(user.id, projects.createdById))
    .orderBy(desc(projects.createdAt), desc(projects.jobNumber));
  const rows = limit ? await query.limit(limit) : await query;
  return rows.map((row) => ({ ...row, createdAt: row.createdAt.toISOString() }));
}

export async function countProjects(): Promise<number> {
  const [row] = await currentDb()
    .select({ n: sql<number>`count(*)`.mapWith(Number) })
    .from(projects);
  return row.n;
}
