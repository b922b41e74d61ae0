// What a server action answers a form (React's useActionState): the result, or an error with a message a
// person can act on and, where the server can say which, the fields it concerns.
import type { ErrorCode } from "./errors";

export type ActionState<T = unknown> =
  | null
  | { ok: true; data: T; message?: string }
  | { ok: false; error: { code: ErrorCode; message: string; fieldErrors?: Record<string, string[]> } };
