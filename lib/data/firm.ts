import "server-only";
// The firm this deployment belongs to (one firm per deployment). Its name is not secret: the shell
// shows it to every signed-in person, so no permission is needed.
import { asc } from "drizzle-orm";
import { firm } from "@/db/schema";
import { currentDb } from "./transaction";

export async function getFirmName(): Promise<string | null> {
  const [row] = await currentDb().select({ name: firm.name }).from(firm).orderBy(asc(firm.createdAt)).limit(1);
  return row?.name ?? null;
}
