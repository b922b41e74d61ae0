// Typed error codes and where each may surface. Use cases and data functions throw AppError with one of
// these codes and a message written for the person using Gusset; lib/use-cases/next.ts turns it into an
// ActionState for forms or a JSON body with the matching HTTP status for the API. Anything else
// (a database error, a bug) is logged on the server and shown only as "internal".

export const ERROR_CODES = [
  "bad-request",
  "unauthenticated",
  "forbidden",
  "not-found",
  "conflict",
  "invalid-input",
  "rate-limited",
  "internal",
] as const;
export type ErrorCode = (typeof ERROR_CODES)[number];

export const ERROR_STATUS: Record<ErrorCode, number> = {
  "bad-request": 400,
  unauthenticated: 401,
  forbidden: 403,
  "not-found": 404,
  conflict: 409,
  "invalid-input": 422,
  "rate-limited": 429,
  internal: 500,
};

/** Used when the thrower gives no message of its own. */
export const DEFAULT_MESSAGES: Record<ErrorCode, string> = {
  "bad-request": "The request could not be read.",
  unauthenticated: "Please sign in to continue.",
  forbidden: "Your role does not allow this.",
  "not-found": "We could not find that.",
  conflict: "That conflicts with the current state. Refresh and try again.",
  "invalid-input": "Some fields need attention.",
  "rate-limited": "Too many attempts. Wait a minute and try again.",
  internal: "Something went wrong on our side. Try again; if it keeps happening, tell your admin.",
};

export type FieldErrors = Record<string, string[]>;

export type PublicError = { code: ErrorCode; message: string; fieldErrors?: FieldErrors };

export class AppError extends Error {
  readonly code: ErrorCode;
  readonly fieldErrors?: FieldErrors;

  constructor(code: ErrorCode, message?: string, options?: { fieldErrors?: FieldErrors; cause?: unknown }) {
    super(message ?? DEFAULT_MESSAGES[code], { cause: options?.cause });
    this.name = "AppError";
    this.code = code;
    this.fieldErrors = options?.fieldErrors;
  }

  get status(): number {
    return ERROR_STATUS[this.code];
  }
}

export function isAppError(error: unknown): error is AppError {
  return error instanceof AppError;
}

/**
 * The message a person may see. AppErrors keep their own message; anything else is logged with its
 * stack (it may hold SQL or row contents) and replaced by the generic "internal" message.
 */
export function toPublicError(error: unknown): PublicError {
  if (isAppError(error)) {
    return error.fieldErrors
      ? { code: error.code, message: error.message, fieldErrors: error.fieldErrors }
      : { code: error.code, message: error.message };
  }
  console.error("[gusset] unexpected error:", error);
  return { code: "internal", message: DEFAULT_MESSAGES.internal };
}
