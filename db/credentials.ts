// The one way to create a person who signs in with e-mail and password: the user row and its credential
// login, the password hashed with better-auth's own hasher (scrypt) so its sign-in can verify it. Used by
// the demo seed and by invitation acceptance, inside the caller's transaction.
import { generateId } from "better-auth";
import { hashPassword } from "better-auth/crypto";
import type { NodePgDatabase } from "drizzle-orm/node-postgres";
import type { Role } from "@/lib/domain/roles";
import * as schema from "./schema";

type Executor = Pick<NodePgDatabase<typeof schema>, "insert">;

export async function createCredentialUser(
  executor: Executor,
  person: { name: string; email: string; role: Role; password: string; emailVerified: boolean },
): Promise<{ id: string }> {
  const id = generateId();
  const now = new Date();
  await executor.insert(schema.user).values({
    id,
    name: person.name,
    email: person.email.trim().toLowerCase(),
    emailVerified: person.emailVerified,
    role: person.role,
    createdAt: now,
    updatedAt: now,
  });
  await executor.insert(schema.account).values({
    id: generateId(),
    accountId: id,
    providerId: "credential",
    userId: id,
    password: await hashPassword(person.password),
    createdAt: now,
    updatedAt: now,
  });
  return { id };
}
