import "server-only";
// A person's own profile: read it, change their password, set their time zone. Any signed-in role may,
// and only for themselves: the actor is the subject, never an id from the input. Role changes stay an
// admin's (lib/use-cases/people.ts).
import { z } from "zod";
import { hashPassword, verifyPassword } from "better-auth/crypto";
import { AppError } from "@/lib/domain/errors";
import {
  WRONG_CURRENT_PASSWORD_MESSAGE,
  changePasswordSchema,
  setDisplayUnitsSchema,
  setTimeZoneSchema,
} from "@/lib/domain/schemas/profile";
import { getProfile, lockPasswordHash, setDisplayUnits, setPasswordHash, setTimeZone, type ProfileDto } from "@/lib/data/profile";
import { clearRateLimit, consumeRateLimit } from "@/lib/data/rate-limit";
import { endSessions } from "@/lib/data/sessions";
import { outsideTransaction } from "@/lib/data/transaction";
import { defineUseCase } from "./use-case";

/**
 * Password changes per person in 15 minutes, counted until one succeeds: someone at an unlocked desk
 * cannot try passwords until one fits. The count survives the refusal's rollback (outsideTransaction).
 */
export const PASSWORD_CHANGE_LIMIT = { window: 15 * 60, max: 5 };

const passwordChangeKey = (userId: string) => `password-change|${userId}`;

export const readProfile = defineUseCase({
  name: "profile.read",
  permission: "signed-in",
  input: z.object({}).default({}),
  run: async (_input, { actor }): Promise<ProfileDto> => {
    const profile = await getProfile(actor.id);
    if (!profile) throw new AppError("not-found", "Your account no longer exists.");
    return profile;
  },
  audit: null,
});

/**
 * Checks the current password against the credential login, stores the new one (better-auth's hasher,
 * so sign-in verifies it) and ends every other session of the person; the session that asked stays open.
 */
export const changePassword = defineUseCase({
  name: "profile.change-password",
  permission: "signed-in",
  input: changePasswordSchema,
  run: async ({ currentPassword, password }, { actor }): Promise<{ sessionsEnded: number }> => {
    const key = passwordChangeKey(actor.id);
    const attempt = await outsideTransaction(() =>
      consumeRateLimit({ key, windowSeconds: PASSWORD_CHANGE_LIMIT.window, max: PASSWORD_CHANGE_LIMIT.max }),
    );
    if (!attempt.allowed) {
      const minutes = Math.ceil(attempt.retryAfterSeconds / 60);
      throw new AppError(
        "rate-limited",
        `Too many attempts to change this password. Wait ${minutes} minute${minutes === 1 ? "" : "s"} and try again, or sign out and use “Forgot your password?”.`,
      );
    }
    const hash = await lockPasswordHash(actor.id);
    if (!hash) throw new AppError("conflict", "This account has no password to change. Ask your admin.");
    if (!(await verifyPassword({ hash, password: currentPassword }))) {
      throw new AppError("invalid-input", WRONG_CURRENT_PASSWORD_MESSAGE, {
        fieldErrors: { currentPassword: [WRONG_CURRENT_PASSWORD_MESSAGE] },
      });
    }
    await setPasswordHash(actor.id, await hashPassword(password));
    const sessionsEnded = await endSessions({ userId: actor.id, reason: "password-changed", keepSessionId: actor.sessionId });
    await clearRateLimit(key);
    return { sessionsEnded };
  },
  audit: ({ result, actor }) => ({
    action: "profile.change-password",
    subject: `user:${actor.id}`,
    details: { sessionsEnded: result.sessionsEnded },
  }),
  // A wrong current password and a locked count are kept (the guessing shows in the trail); a new password
  // the rules refuse is a typing matter and is not.
  auditFailure: ({ error, actor }) => {
    const wrong = error.fieldErrors?.currentPassword?.includes(WRONG_CURRENT_PASSWORD_MESSAGE) ?? false;
    if (!wrong && error.code !== "rate-limited") return null;
    return {
      action: "profile.change-password.failed",
      subject: actor ? `user:${actor.id}` : null,
      details: { reason: wrong ? "wrong-current-password" : "rate-limited" },
    };
  },
});

/** Sets (or, with "", clears) the person's time zone; setting the one they have is not an event. */
export const setOwnTimeZone = defineUseCase({
  name: "profile.set-time-zone",
  permission: "signed-in",
  input: setTimeZoneSchema,
  run: async ({ timeZone }, { actor }): Promise<{ userId: string; from: string | null; timeZone: string | null }> => {
    const profile = await getProfile(actor.id);
    if (!profile) throw new AppError("not-found", "Your account no longer exists.");
    if (profile.timeZone !== timeZone) await setTimeZone(actor.id, timeZone);
    return { userId: actor.id, from: profile.timeZone, timeZone };
  },
  audit: ({ result, actor }) =>
    result.from === result.timeZone
      ? null
      : { action: "profile.set-time-zone", subject: `user:${actor.id}`, details: { from: result.from, to: result.timeZone } },
});

/** Sets how the person reads results (SI or US customary); choosing the one they have is not an event. */
export const setOwnDisplayUnits = defineUseCase({
  name: "profile.set-display-units",
  permission: "signed-in",
  input: setDisplayUnitsSchema,
  run: async ({ displayUnits }, { actor }): Promise<{ userId: string; from: "si" | "us"; displayUnits: "si" | "us" }> => {
    const profile = await getProfile(actor.id);
    if (!profile) throw new AppError("not-found", "Your account no longer exists.");
    if (profile.displayUnits !== displayUnits) await setDisplayUnits(actor.id, displayUnits);
    return { userId: actor.id, from: profile.displayUnits, displayUnits };
  },
  audit: ({ result, actor }) =>
    result.from === result.displayUnits
      ? null
      : {
          action: "profile.set-display-units",
          subject: `user:${actor.id}`,
          details: { from: result.from, to: result.displayUnits },
        },
});
