import "server-only";
// A person's own profile: what the profile page shows, their password (the credential login's hash,
// hashed and verified by the use case with better-auth's own hasher) and their time zone.
import { and, eq } from "drizzle-orm";
import { account, user } from "@/db/schema";
import type { Role } from "@/lib/domain/roles";
import { currentDb } from "./transaction";

export type ProfileDto = {
  id: string;
  name: string;
  email: string;
  role: Role;
  timeZone: string | null;
  displayUnits: "si" | "us";
};

export async function getProfile(userId: string): Promise<ProfileDto | null> {
  const [row] = await currentDb()
    .select({
      id: user.id,
      name: user.name,
      email: user.email,
      role: user.role,
      timeZone: user.timeZone,
      displayUnits: user.displayUnits,
    })
    .from(user)
    .where(eq(user.id, userId));
  return row ?? null;
}

/** The password hash of the person's e-mail-and-password login, locked until the transaction ends; null if none. */
export async function lockPasswordHash(userId: string): Promise<string | null> {
  const [row] = await currentDb()
    .select({ password: account.password })
    .from(account)
    .where(and(eq(account.userId, userId), eq(account.providerId, "credential")))
    .for("update");
  return row?.password ?? null;
}

export async function setPasswordHash(userId: string, hash: string): Promise<void> {
  await currentDb()
    .update(account)
    .set({ password: hash, updatedAt: new Date() })
    .where(and(eq(account.userId, userId), eq(account.providerId, "credential")));
}

export async function setTimeZone(userId: string, timeZone: string | null): Promise<void> {
  await currentDb().update(user).set({ timeZone, updatedAt: new Date() }).where(eq(user.id, userId));
}

export async function setDisplayUnits(userId: string, displayUnits: "si" | "us"): Promise<void> {
  await currentDb().update(user).set({ displayUnits, updatedAt: new Date() }).where(eq(user.id, userId));
}
