// Typed error codes and where each may surface. Use cases and data functions throw AppError with one of
// these codes and a message written for the person using Gusset; lib/use-cases/next.ts turns it into an
// ActionState for forms or a JSON body with the matching HTTP status for the API. A database that cannot
// be reached is "unavailable" (503: try again shortly, and a load balancer may take the instance out);
// anything else (a database error, a bug) is logged on the server and shown only as "internal".

export const ERROR_CODES = [
  "bad-request",
  "unauthenticated",
  "forbidden",
  "not-found",
  "conflict",
  "invalid-input",
  "rate-limited",
  "internal",
  "unavailable",
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
  unavailable: 503,
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
  unavailable: "Gusset cannot reach its database; try again in a minute.",
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
 * The message a person may see. AppErrors keep their own message; an unreachable database becomes
 * "unavailable" (logged in one line: every request fails the same way until it is back); anything else
 * is logged with its stack (it may hold SQL or row contents) and replaced by the generic "internal" message.
 */
export function toPublicError(error: unknown): PublicError {
  if (isAppError(error)) {
    return error.fieldErrors
      ? { code: error.code, message: error.message, fieldErrors: error.fieldErrors }
      : { code: error.code, message: error.message };
  }
  if (isDatabaseUnavailable(error)) {
    console.warn(`[gusset] the database cannot be reached: ${describeError(error)}`);
    return { code: "unavailable", message: DEFAULT_MESSAGES.unavailable };
  }
  console.error("[gusset] unexpected error:", error);
  return { code: "internal", message: DEFAULT_MESSAGES.internal };
}

// ---- an unreachable database -------------------------------------------------------------------------

/** Node's socket and DNS errors that mean the server is not there (or not reachable) right now. */
const UNREACHABLE_SOCKET_CODES = new Set([
  "ECONNREFUSED",
  "ECONNRESET",
  "ENOTFOUND",
  "EAI_AGAIN",
  "ETIMEDOUT",
  "EHOSTUNREACH",
  "ENETUNREACH",
  "EPIPE",
]);

/**
 * PostgreSQL's SQLSTATEs for a server that is going away or not taking connections: the whole class 08
 * (connection exception) is matched by prefix; 57P01 admin shutdown, 57P02 crash shutdown, 57P03 cannot
 * connect now (starting up, shutting down, in recovery), 53300 too many connections.
 */
const UNAVAILABLE_SQLSTATES = new Set(["57P01", "57P02", "57P03", "53300"]);

/**
 * node-postgres reports a lost or never-made connection by message only (no code): a socket closed
 * under a query, a connect that timed out, a pool that waited too long for a connection, a client
 * reused after its connection broke.
 */
const UNAVAILABLE_MESSAGES = [
  /^Connection terminated/,
  /^timeout exceeded when trying to connect$/,
  /^Client has encountered a connection error and is not queryable$/,
  /^Client was closed and is not queryable$/,
];

/**
 * True when the error (or one it wraps: drizzle and better-auth keep the driver's error as `cause`;
 * Node's AggregateError lists one per address tried) says the database cannot be reached, as opposed to
 * a query that failed. The one place that knows what an outage looks like.
 */
export function isDatabaseUnavailable(error: unknown, depth = 0): boolean {
  if (typeof error !== "object" || error === null || depth > 5) return false;
  const { code, message, cause, errors } = error as { code?: unknown; message?: unknown; cause?: unknown; errors?: unknown };
  if (typeof code === "string") {
    if (UNREACHABLE_SOCKET_CODES.has(code) || UNAVAILABLE_SQLSTATES.has(code) || /^08[0-9A-Z]{3}$/.test(code)) return true;
  }
  if (typeof message === "string" && UNAVAILABLE_MESSAGES.some((pattern) => pattern.test(message))) return true;
  if (Array.isArray(errors) && errors.some((inner) => isDatabaseUnavailable(inner, depth + 1))) return true;
  return isDatabaseUnavailable(cause, depth + 1);
}

/** The innermost code and message, for a one-line log (no SQL: connection errors carry none). */
function describeError(error: unknown): string {
  let current: unknown = error;
  for (let depth = 0; depth < 5; depth++) {
    const next = (current as { cause?: unknown } | null)?.cause;
    if (typeof next !== "object" || next === null) break;
    current = next;
  }
  const { code, message } = (current ?? {}) as { code?: unknown; message?: unknown };
  return [code, message].filter((part) => typeof part === "string" && part !== "").join(" ") || "unknown error";
}
