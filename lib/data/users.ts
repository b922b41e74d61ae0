import "server-only";
// People: rows and counts for the admin's list and the home page, and the row changes the people use
// cases make (lib/use-cases/people.ts checks permissions and writes the audit events). The firm always
// keeps at least one active admin.
import { and, asc, eq, isNull, sql } from "drizzle-orm";
import { user } from "@/db/schema";
import { AppError } from "@/lib/domain/errors";
import type { Role } from "@/lib/domain/roles";
import { currentDb } from "./transaction";

export type UserDto = {
  id: string;
  name: string;
  email: string;
  role: Role;
  status: "active" | "deactivated";
  createdAt: string;
  deactivatedAt: string | null;
};

const userColumns = {
  id: user.id,
  name: user.name,
  email: user.email,
  role: user.role,
  createdAt: user.createdAt,
  deactivatedAt: user.deactivatedAt,
};

type UserRow = { id: string; name: string; email: string; role: Role; createdAt: Date; deactivatedAt: Date | null };

function toUserDto(row: UserRow): UserDto {
  return {
    id: row.id,
    name: row.name,
    email: row.email,
    role: row.role,
    status: row.deactivatedAt ? "deactivated" : "active",
    createdAt: row.createdAt.toISOString(),
    deactivatedAt: row.deactivatedAt?.toISOString() ?? null,
  };
}

export async function listUsers(): Promise<UserDto[]> {
  const rows = await currentDb().select(userColumns).from(user).orderBy(asc(user.name), asc(user.email));
  return rows.map(toUserDto);
}

/** Head counts for the home page and the people page. */
export async function countUsers(): Promise<{ active: number; deactivated: number; admins: number }> {
  const [row] = await currentDb()
    .select({
      active: sql<number>`count(*) filter (where ${user.deactivatedAt} is null)`.mapWith(Number),
      deactivated: sql<number>`count(*) filter (where ${user.deactivatedAt} is not null)`.mapWith(Number),
      admins: sql<number>`count(*) filter (where ${user.deactivatedAt} is null and ${user.role} = 'admin')`.mapWith(Number),
    })
    .from(user);
  return row;
}

export async function getUserOrThrow(userId: string): Promise<UserDto> {
  const [row] = await currentDb().select(userColumns).from(user).where(eq(user.id, userId));
  if (!row) throw new AppError("not-found", "That person no longer exists.");
  return toUserDto(row);
}

export async function userExistsWithEmail(email: string): Promise<boolean> {
  const [row] = await currentDb().select({ id: user.id }).from(user).where(eq(user.email, email.trim().toLowerCase()));
  return row !== undefined;
}

/**
 * Locks the active admins' rows for the rest of the transaction, so two admins demoting each other at
 * the same moment cannot leave the firm with none; then refuses if `userId` is the only one.
 */
export async function assertNotLastActiveAdminOrThrow(userId: string, what: string): Promise<void> {
  const admins = await currentDb()
    .select({ id: user.id })
    .from(user)
    .where(and(eq(user.role, "admin"), isNull(user.deactivatedAt)))
    .for("update");
  if (admins.length === 1 && admins[0].id === userId) {
    throw new AppError(
      "conflict",
      `You cannot ${what} the last active admin. Make someone else an admin first, so the firm keeps one.`,
    );
  }
}

export async function updateUser(userId: string, set: Partial<typeof user.$inferInsert>): Promise<UserDto> {
  const [updated] = await currentDb()
    .update(user)
    .set({ updatedAt: new Date(), ...set })
    .where(eq(user.id, userId))
    .returning(userColumns);
  return toUserDto(updated);
}
