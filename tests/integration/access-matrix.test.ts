// Who gets what: every server action (app/**/actions.ts) and every route handler (app/api/**/route.ts)
// against an anonymous visitor and each role, as a table written from the product's rules for each role, not from
// lib/auth/permissions.ts, so a wrong permission in code fails here. A new action or route without a
// row in these tables fails the "covers every…" tests.
//
// The one route left out on purpose is app/api/auth/[...all]: better-auth's own endpoint set (sign-in,
// sign-out, reset), protected by better-auth itself (no sign-up, rate limits, origin check) and tested
// in sign-in.test.ts and password-reset.test.ts.
import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import type { ActionState } from "@/lib/auth/guard";
import type { Role } from "@/lib/auth/roles";
import { inviteUser } from "@/lib/data/users";
import { createTestUser, signInHeaders, uniqueEmail } from "./helpers/people";

const request = vi.hoisted(() => ({ headers: new Headers() }));
vi.mock("next/headers", () => ({
  headers: async () => request.headers,
  cookies: async () => ({ get: () => undefined, getAll: () => [], set: () => undefined }),
}));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined, revalidateTag: () => undefined }));

afterEach(() => {
  request.headers = new Headers();
});

type Who = "anonymous" | Role;
const EVERYONE: Who[] = ["anonymous", "admin", "lead", "engineer", "auditor"];

/** "allowed" means the guard let the call through to the handler. */
type Expected = "allowed" | "unauthenticated" | "forbidden";

const ADMIN_ONLY: Record<Who, Expected> = {
  anonymous: "unauthenticated",
  admin: "allowed",
  lead: "forbidden",
  engineer: "forbidden",
  auditor: "forbidden",
};
const SIGNED_IN: Record<Who, Expected> = {
  anonymous: "unauthenticated",
  admin: "allowed",
  lead: "allowed",
  engineer: "allowed",
  auditor: "allowed",
};
const PUBLIC: Record<Who, Expected> = { anonymous: "allowed", admin: "allowed", lead: "allowed", engineer: "allowed", auditor: "allowed" };

type AnyAction = (previous: ActionState<unknown>, payload: unknown) => Promise<ActionState<unknown>>;

/** Each row: who may call it, and a valid input made fresh for each call (so allowed calls succeed). */
const ACTIONS: Record<string, { expected: Record<Who, Expected>; input: () => Promise<Record<string, unknown>> }> = {
  "admin/users/actions.ts#inviteUserAction": {
    expected: ADMIN_ONLY,
    input: async () => ({ email: uniqueEmail("matrix"), name: "Matrix Person", role: "engineer" }),
  },
  "admin/users/actions.ts#setUserRoleAction": {
    expected: ADMIN_ONLY,
    input: async () => ({ userId: (await createTestUser({ role: "engineer" })).actor.id, role: "lead" }),
  },
  "admin/users/actions.ts#deactivateUserAction": {
    expected: ADMIN_ONLY,
    input: async () => ({ userId: (await createTestUser({ role: "engineer" })).actor.id }),
  },
  "admin/users/actions.ts#reactivateUserAction": {
    expected: ADMIN_ONLY,
    input: async () => ({ userId: (await createTestUser({ role: "engineer", deactivated: true })).actor.id }),
  },
  "admin/users/actions.ts#revokeInvitationAction": {
    expected: ADMIN_ONLY,
    input: async () => {
      const { actor: admin } = await createTestUser({ role: "admin" });
      const invitation = await inviteUser({ actor: admin, email: uniqueEmail("revoke"), name: "To Revoke", role: "auditor" });
      return { invitationId: invitation.id };
    },
  },
  // Public: the link is the credential. An unknown token gets past the guard and is refused by the
  // data function with its own clear message.
  "invite/[token]/actions.ts#acceptInvitationAction": {
    expected: PUBLIC,
    input: async () => ({ token: "unknown-token", password: "long-enough-pass", confirmPassword: "long-enough-pass" }),
  },
};

const ROUTES: Record<string, { method: string; path: string; expected: Record<Who, Expected> }> = {
  "api/me/route.ts#GET": { method: "GET", path: "/api/me", expected: SIGNED_IN },
  "api/health/route.ts#GET": { method: "GET", path: "/api/health", expected: PUBLIC },
};
const LEFT_OUT = ["api/auth/[...all]/route.ts"];

const actionModules = import.meta.glob<Record<string, unknown>>("/app/**/actions.ts");
const routeModules = import.meta.glob<Record<string, unknown>>("/app/api/**/route.ts");

function shortName(file: string): string {
  return file.replace(/^\/app\//, "").replace(/^\([^)]+\)\//, "");
}

async function exportsOf(modules: Record<string, () => Promise<Record<string, unknown>>>) {
  const found: Record<string, unknown> = {};
  for (const [file, load] of Object.entries(modules)) {
    if (LEFT_OUT.includes(shortName(file))) continue;
    for (const [name, value] of Object.entries(await load())) {
      if (typeof value === "function") found[`${shortName(file)}#${name}`] = value;
    }
  }
  return found;
}

const headersFor: Partial<Record<Who, Headers>> = {};

beforeAll(async () => {
  headersFor.anonymous = new Headers();
  for (const role of ["admin", "lead", "engineer", "auditor"] as const) {
    const { actor, password } = await createTestUser({ role, label: `matrix-${role}` });
    headersFor[role] = await signInHeaders(actor.email, password);
  }
});

function outcomeOfAction(state: ActionState<unknown>): Expected | string {
  if (state?.ok) return "allowed";
  const code = state?.error.code;
  return code === "unauthenticated" || code === "forbidden" ? code : "allowed"; // refused by the handler, past the guard
}

function outcomeOfRoute(status: number): Expected | string {
  if (status === 401) return "unauthenticated";
  if (status === 403) return "forbidden";
  return status < 500 ? "allowed" : `status ${status}`;
}

describe("server actions", () => {
  it("covers every exported server action", async () => {
    expect(Object.keys(await exportsOf(actionModules)).sort()).toEqual(Object.keys(ACTIONS).sort());
  });

  for (const [name, row] of Object.entries(ACTIONS)) {
    it.each(EVERYONE)(`${name} as %s`, async (who) => {
      const action = (await exportsOf(actionModules))[name] as AnyAction;
      const input = await row.input();
      request.headers = headersFor[who]!;
      let outcome: string;
      try {
        outcome = outcomeOfAction(await action(null, input));
      } catch (error) {
        // redirect() after success (e.g. to the home page) is Next's way of answering.
        outcome = String((error as { digest?: string }).digest).startsWith("NEXT_REDIRECT") ? "allowed" : String(error);
      }
      expect(outcome).toBe(row.expected[who]);
    });
  }
});

describe("route handlers", () => {
  it("covers every route handler except better-auth's own", async () => {
    expect(Object.keys(await exportsOf(routeModules)).sort()).toEqual(Object.keys(ROUTES).sort());
  });

  for (const [name, row] of Object.entries(ROUTES)) {
    it.each(EVERYONE)(`${row.method} ${row.path} as %s`, async (who) => {
      const handler = (await exportsOf(routeModules))[name] as (r: Request, c: unknown) => Promise<Response>;
      const response = await handler(new Request(`http://127.0.0.1${row.path}`, { method: row.method, headers: headersFor[who] }), {
        params: Promise.resolve({}),
      });
      expect(outcomeOfRoute(response.status)).toBe(row.expected[who]);
      if (response.status === 401 || response.status === 403) {
        expect((await response.json()).error.code).toBe(row.expected[who]);
      }
    });
  }
});
