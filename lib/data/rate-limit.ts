import "server-only";
// A fixed-window counter in the shared rate_limit table (the one better-auth uses), so every app
// instance sees the same count. Keys are prefixed "gusset:" and never collide with better-auth's.
import { eq, sql } from "drizzle-orm";
import { generateId } from "better-auth";
import { rateLimit } from "@/db/schema";
import { currentDb } from "./transaction";

export type RateLimitDecision = { allowed: boolean; retryAfterSeconds: number };

/** Counts one attempt under `key`; refuses once more than `max` fall in the current window. */
export async function consumeRateLimit({
  key,
  windowSeconds,
  max,
}: {
  key: string;
  windowSeconds: number;
  max: number;
}): Promise<RateLimitDecision> {
  const now = Date.now();
  const windowStartedBefore = now - windowSeconds * 1000;
  // One statement: a new window starts when the stored one is over, otherwise the count goes up.
  // last_request holds the start of the current window.
  const [row] = await currentDb()
    .insert(rateLimit)
    .values({ id: generateId(), key: `gusset:${key}`, count: 1, lastRequest: now })
    .onConflictDoUpdate({
      target: rateLimit.key,
      set: {
        count: sql`case when ${rateLimit.lastRequest} <= ${windowStartedBefore} then 1 else ${rateLimit.count} + 1 end`,
        lastRequest: sql`case when ${rateLimit.lastRequest} <= ${windowStartedBefore} then ${now} else ${rateLimit.lastRequest} end`,
      },
    })
    .returning({ count: rateLimit.count, lastRequest: rateLimit.lastRequest });
  const retryAfterSeconds = Math.max(1, Math.ceil((Number(row.lastRequest) + windowSeconds * 1000 - now) / 1000));
  return { allowed: row.count <= max, retryAfterSeconds };
}

/** Forgets the count under `key` (a successful sign-in ends the count of failed ones). */
export async function clearRateLimit(key: string): Promise<void> {
  await currentDb()
    .delete(rateLimit)
    .where(eq(rateLimit.key, `gusset:${key}`));
}
