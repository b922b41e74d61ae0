import "server-only";
// Use cases as Next server actions and route handlers. The adapter reads who is asking (the session
// cookie), hands the raw input to the runner (lib/use-cases/run.ts), and turns the outcome into what
// the caller expects: an ActionState for a form, JSON with a status code for the API. Anything that
// must wait for the commit (redirect, refreshing a page, signing a new user in) goes in `then`.
import { unstable_rethrow } from "next/navigation";
import type { z } from "zod";
import type { ActionState } from "@/lib/domain/action-state";
import type { Actor } from "@/lib/domain/actor";
import { AppError, ERROR_STATUS, isDatabaseUnavailable, toPublicError, type PublicError } from "@/lib/domain/errors";
import { RETRY_AFTER_SECONDS } from "@/lib/domain/outage";
import type { Permission } from "@/lib/domain/permissions";
import { clientAddressFrom } from "@/lib/auth/client-address";
import { getActor, getActorFromHeaders, getClientAddress, HandToNext } from "@/lib/auth/session";
import { readDatabaseState } from "./health";
import { executeUseCase, runUseCase } from "./run";
import type { UseCase } from "./use-case";
import { jsonResponse } from "@/lib/domain/json-response";

/**
 * For forms with useActionState(action, null). Parses FormData (or a plain object), runs the use case,
 * then `then(result, input)` after the commit; never throws to the client except Next's own
 * redirect()/notFound()/forbidden().
 */
export function serverAction<P extends Permission, S extends z.ZodType, T, R>(
  useCase: UseCase<P, S, T, R>,
  options: { then?: (result: T, input: z.infer<S>) => void | Promise<void> } = {},
): (previous: ActionState<T>, payload: FormData | z.input<S>) => Promise<ActionState<T>> {
  return async (_previous, payload) => {
    try {
      const actor = await getActor();
      const raw = payload instanceof FormData ? readFormData(payload) : payload;
      const { input, result } = await executeUseCase(useCase, { actor, input: raw, ipAddress: await getClientAddress() });
      await options.then?.(result, input);
      return { ok: true, data: result };
    } catch (error) {
      unstable_rethrow(error); // redirect(), notFound() and forbidden() belong to Next
      return { ok: false, error: toPublicError(error) };
    }
  };
}

/**
 * For route handlers: reads the input from the JSON or form body (POST/PUT/PATCH) or the search
 * params (GET/HEAD/DELETE), plus the route's params; answers `{ data }` with 200, or `respond(result)`
 * for a shape of its own, and `{ error: { code, message, fieldErrors? } }` with 400/401/403/404/409/
 * 422/429/500, or 503 `unavailable` (with Retry-After) while the database cannot be reached.
 */
export function routeHandler<P extends Permission, S extends z.ZodType, T, R>(
  useCase: UseCase<P, S, T, R>,
  options: {
    respond?: (result: T) => Response;
    /**
     * A query string the schema refuses is a request that cannot be read (400), not a form to correct (422): for
     * reads whose input is the address alone (filters, a page cursor). The message names each parameter refused.
     */
    queryErrors?: "bad-request";
  } = {},
): (request: Request, context: { params: Promise<Record<string, string>> }) => Promise<Response> {
  return async (request, context) => {
    try {
      const actor = await readActor(useCase.permission, request.headers);
      const params = (await context?.params) ?? {};
      const raw = { ...(await readRequestInput(request)), ...params };
      const result = await runUseCase(useCase, { actor, input: raw, ipAddress: clientAddressFrom(request.headers) });
      return options.respond ? options.respond(result) : jsonResponse({ data: result ?? null });
    } catch (error) {
      unstable_rethrow(error);
      if (error instanceof HandToNext) throw error; // served outside Next, for Next to answer (scripts/serve.mjs)
      if (options.queryErrors && error instanceof AppError && error.code === "invalid-input")
        return errorResponse(toPublicError(badQueryOf(error)));
      return errorResponse(toPublicError(error));
    }
  };
}

/** The API's error answer for anything a route handler of its own caught (the same shape and status as routeHandler's). */
export function apiErrorResponse(error: unknown): Response {
  unstable_rethrow(error);
  return errorResponse(toPublicError(error));
}

/** "from: Enter a date as YYYY-MM-DD." for each parameter refused, as one 400. */
function badQueryOf(error: AppError): AppError {
  const fields = Object.entries(error.fieldErrors ?? {});
  const message = fields.length > 0 ? fields.map(([field, [first]]) => `${field}: ${first}`).join(" ") : error.message;
  return new AppError("bad-request", message, error.fieldErrors ? { fieldErrors: error.fieldErrors } : undefined);
}

function errorResponse(publicError: PublicError): Response {
  const status = ERROR_STATUS[publicError.code];
  const headers: HeadersInit = status === 503 ? { "Retry-After": String(RETRY_AFTER_SECONDS) } : {};
  return jsonResponse({ error: publicError }, { status, headers });
}

/**
 * For the one route handler that is not a use case (better-auth's endpoints, which catch their own errors
 * and answer 500): while the database cannot be reached, a 5xx answer, or a thrown connection error,
 * becomes the API's 503 `unavailable` like every other route's.
 */
export function answerOutages(handler: (request: Request) => Promise<Response>): (request: Request) => Promise<Response> {
  return async (request) => {
    let response: Response;
    try {
      response = await handler(request);
    } catch (error) {
      if (!isDatabaseUnavailable(error)) throw error;
      return errorResponse(toPublicError(error));
    }
    if (response.status < 500) return response;
    const database = await runUseCase(readDatabaseState, { actor: null, input: {} });
    return database === "up" ? response : errorResponse(toPublicError(new AppError("unavailable")));
  };
}

/**
 * The caller of a route. A public use case serves anonymous callers anyway, so when the session cannot
 * be read because the database is down it runs as one: the health check must answer exactly then, even
 * for a browser that sends its session cookie.
 */
async function readActor(permission: Permission, requestHeaders: Headers): Promise<Actor | null> {
  try {
    return await getActorFromHeaders(requestHeaders);
  } catch (error) {
    if (permission === "public" && isDatabaseUnavailable(error)) return null;
    throw error;
  }
}

/** FormData → plain object; repeated keys become arrays; Next's own $ACTION_ fields are dropped. */
function readFormData(formData: FormData): Record<string, unknown> {
  const result: Record<string, unknown> = {};
  for (const key of new Set(formData.keys())) {
    if (key.startsWith("$ACTION")) continue;
    const values = formData.getAll(key);
    result[key] = values.length === 1 ? values[0] : values;
  }
  return result;
}

async function readRequestInput(request: Request): Promise<Record<string, unknown>> {
  if (["GET", "HEAD", "DELETE"].includes(request.method)) {
    return Object.fromEntries(new URL(request.url).searchParams);
  }
  const contentType = request.headers.get("content-type") ?? "";
  if (contentType.includes("application/x-www-form-urlencoded") || contentType.includes("multipart/form-data")) {
    let form: FormData;
    try {
      form = await request.formData();
    } catch {
      // A body cut off on the way (a dropped connection) or not the form it says it is: nothing was stored.
      throw new AppError("bad-request", "The form did not arrive whole; nothing was stored. Send it again.");
    }
    return readFormData(form);
  }
  let text: string;
  try {
    text = await request.text();
  } catch {
    throw new AppError("bad-request", "The request did not arrive whole; nothing was stored. Send it again.");
  }
  if (text.trim() === "") return {};
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    throw new AppError("bad-request", "The request body is not valid JSON.");
  }
  if (body === null || typeof body !== "object" || Array.isArray(body)) {
    throw new AppError("bad-request", "The request body must be a JSON object.");
  }
  return body as Record<string, unknown>;
}
