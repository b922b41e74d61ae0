import "server-only";
// The one wrapper for every server action and route handler (DEVELOPERS.md, "Conventions"). It loads the actor,
// checks the declared permission, parses the input with the declared zod schema, runs the handler in
// one transaction together with the audit event, and turns errors into messages. A handler cannot
// forget the check because it never runs without it; a failed check or validation writes nothing.
import { unstable_rethrow } from "next/navigation";
import type { z } from "zod";
import { runInTransaction } from "@/lib/data/transaction";
import { recordAuditEvent } from "@/lib/data/audit";
import { AppError, DEFAULT_MESSAGES, ERROR_STATUS, toPublicError, type ErrorCode, type FieldErrors } from "@/lib/errors";
import type { Actor } from "./actor";
import { can, type Action } from "./permissions";
import { getActor, getActorFromHeaders } from "./session";

export type ActionState<T = unknown> =
  | null
  | { ok: true; data: T; message?: string }
  | { ok: false; error: { code: ErrorCode; message: string; fieldErrors?: Record<string, string[]> } };

/** An action from lib/auth/permissions.ts, "signed-in" for any active role, or "public" for anyone. */
export type Permission = Action | "signed-in" | "public";

export type AuditSpec<S extends z.ZodType, T> = (args: {
  input: z.infer<S>;
  result: T;
  actor: Actor | null;
}) => { action: string; subject?: string; details?: Record<string, unknown> } | null;

type GuardOptions<S extends z.ZodType, T> = { permission: Permission; audit?: AuditSpec<S, T> };

/**
 * For server actions used with useActionState(action, null): parses FormData (or a plain object) with
 * the schema, checks session + permission ("public" for e.g. invitation acceptance, "signed-in" for any role), runs the
 * handler, writes the audit event, maps errors to messages. Never throws to the client except
 * redirect()/notFound()/forbidden().
 */
export function guardedAction<S extends z.ZodType, T>(
  options: GuardOptions<S, T> & { schema: S },
  handler: (input: z.infer<S>, ctx: { actor: Actor | null }) => Promise<T>,
): (previous: ActionState<T>, payload: FormData | z.input<S>) => Promise<ActionState<T>> {
  return async (_previous, payload) => {
    try {
      const actor = await getActor();
      assertPermissionOrThrow(actor, options.permission);
      const raw = payload instanceof FormData ? readFormData(payload) : payload;
      const input = parseOrThrow(options.schema, raw);
      const data = await runHandlerWithAudit(options, input, actor, () => handler(input, { actor }));
      return { ok: true, data };
    } catch (error) {
      unstable_rethrow(error); // redirect(), notFound() and forbidden() belong to Next
      return { ok: false, error: toPublicError(error) };
    }
  };
}

/**
 * For route handlers: JSON errors `{ error: { code, message, fieldErrors? } }` with 400/401/403/404/
 * 409/422/429/500, success `{ data }` with 200 (or the handler's own Response). Parses the JSON body
 * (POST/PUT/PATCH; form bodies too) or the search params (GET/HEAD/DELETE) with the schema. A handler
 * that returns its own Response (a file, a custom shape) writes its own audit event: `audit` is only
 * called with plain results.
 */
export function guardedRoute<S extends z.ZodType, T>(
  options: GuardOptions<S, T> & { schema?: S },
  handler: (
    input: z.infer<S>,
    ctx: { actor: Actor | null; request: Request; params: Record<string, string> },
  ) => Promise<T | Response>,
): (request: Request, context: { params: Promise<Record<string, string>> }) => Promise<Response> {
  return async (request, context) => {
    try {
      const actor = await getActorFromHeaders(request.headers);
      assertPermissionOrThrow(actor, options.permission);
      const params = (await context?.params) ?? {};
      const input = options.schema ? parseOrThrow(options.schema, await readRequestInput(request)) : (undefined as z.infer<S>);
      const result = await runHandlerWithAudit(options, input, actor, () => handler(input, { actor, request, params }));
      if (result instanceof Response) return result;
      return Response.json({ data: result ?? null });
    } catch (error) {
      unstable_rethrow(error);
      const publicError = toPublicError(error);
      return Response.json({ error: publicError }, { status: ERROR_STATUS[publicError.code] });
    }
  };
}

function assertPermissionOrThrow(actor: Actor | null, permission: Permission): void {
  if (permission === "public") return;
  if (!actor) throw new AppError("unauthenticated");
  if (permission !== "signed-in" && !can(actor.role, permission)) throw new AppError("forbidden");
}

function parseOrThrow<S extends z.ZodType>(schema: S, raw: unknown): z.infer<S> {
  const parsed = schema.safeParse(raw);
  if (parsed.success) return parsed.data;
  const fieldErrors: FieldErrors = {};
  const formErrors: string[] = [];
  for (const issue of parsed.error.issues) {
    if (issue.path.length === 0) formErrors.push(issue.message);
    else (fieldErrors[issue.path.join(".")] ??= []).push(issue.message);
  }
  throw new AppError("invalid-input", formErrors[0] ?? DEFAULT_MESSAGES["invalid-input"], { fieldErrors });
}

/**
 * The handler and its audit event share one transaction. A redirect() from the handler counts as
 * success (commit, then let Next redirect; the audit callback has no result to read then, so data
 * functions that redirect write their own events); any other throw rolls everything back.
 */
async function runHandlerWithAudit<S extends z.ZodType, R, T>(
  options: GuardOptions<S, T>,
  input: z.infer<S>,
  actor: Actor | null,
  run: () => Promise<R>,
): Promise<R> {
  let redirectSignal: unknown = null;
  const result = await runInTransaction(async () => {
    let value: R;
    try {
      value = await run();
    } catch (error) {
      if (!isRedirect(error)) throw error;
      redirectSignal = error;
      return undefined as R;
    }
    const event = value instanceof Response ? null : options.audit?.({ input, result: value as unknown as T, actor });
    if (event) {
      await recordAuditEvent({ ...event, actorId: actor?.id ?? null, actorEmail: actor?.email ?? null });
    }
    return value;
  });
  if (redirectSignal) throw redirectSignal;
  return result;
}

function isRedirect(error: unknown): boolean {
  const digest = (error as { digest?: unknown } | null)?.digest;
  return typeof digest === "string" && digest.startsWith("NEXT_REDIRECT");
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

async function readRequestInput(request: Request): Promise<unknown> {
  if (["GET", "HEAD", "DELETE"].includes(request.method)) {
    return Object.fromEntries(new URL(request.url).searchParams);
  }
  const contentType = request.headers.get("content-type") ?? "";
  if (contentType.includes("application/x-www-form-urlencoded") || contentType.includes("multipart/form-data")) {
    return readFormData(await request.formData());
  }
  const text = await request.text();
  if (text.trim() === "") return {};
  try {
    return JSON.parse(text);
  } catch {
    throw new AppError("bad-request", "The request body is not valid JSON.");
  }
}
