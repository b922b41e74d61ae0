// Who is acting. Every data-access function takes the actor explicitly (never reads the request
// itself), so the same function serves pages, server actions, route handlers, scripts and tests.
import { AppError } from "./errors";
import { can, type Action } from "./permissions";
import type { Role } from "./roles";

export type Actor = {
  id: string;
  name: string;
  email: string;
  role: Role;
  /** The session the request came with, when it came with one (a script or test acts without). */
  sessionId?: string;
};

/** Throws "unauthenticated" for no actor and "forbidden" when the role lacks the action. */
export function assertCanOrThrow(actor: Actor | null | undefined, action: Action): asserts actor is Actor {
  if (!actor) throw new AppError("unauthenticated");
  if (!can(actor.role, action)) throw new AppError("forbidden");
}
