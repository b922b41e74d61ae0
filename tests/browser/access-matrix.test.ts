// Who gets what, over HTTP, for every page, every API route and every server action the build
// contains, for an anonymous visitor and each of the four roles. The tables below are the expected
// answers written out by hand; the build's own manifests list what exists, and anything that exists
// without a row here fails the test, so a new route or action cannot ship without a decision.
import fs from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import type { Role } from "@/lib/auth/roles";
import { appUrl, testEnv } from "../support/env";
import { demoSession, isFakeMailInUse, journeyTimeout, whoAmI, type SessionCookie } from "../support/pages";

type Who = "anonymous" | Role;
const EVERYONE: Who[] = ["anonymous", "admin", "lead", "engineer", "auditor"];
const ROLES: Role[] = ["admin", "lead", "engineer", "auditor"];

// ---- expectations ------------------------------------------------------------------------------

/** ok: 200 page · sign-in: redirect to /sign-in · home: redirect to /home · forbidden: the 403 page · not-found: 404. */
type PageOutcome = "ok" | "sign-in" | "home" | "forbidden" | "not-found";
/** ok: 200 JSON · unauthenticated: 401 JSON · forbidden: 403 JSON (each with { error: { code } }). */
type ApiOutcome = "ok" | "unauthenticated" | "forbidden";
/** passes-guard: the guard let it through (the empty input then fails validation, changing nothing). */
type ActionOutcome = "passes-guard" | "unauthenticated" | "forbidden";

const mailboxInUse = await isFakeMailInUse();

/** Signed-in pages: anonymous → sign in; the named roles → the page; the others → 403. */
function signedInPage(...allowed: Role[]): Record<Who, PageOutcome> {
  return Object.fromEntries(EVERYONE.map((who) => [who, who === "anonymous" ? "sign-in" : allowed.includes(who) ? "ok" : "forbidden"])) as Record<Who, PageOutcome>;
}
const same = <T,>(outcome: T) => Object.fromEntries(EVERYONE.map((who) => [who, outcome])) as Record<Who, T>;
const anonymousElse = <T,>(anonymous: T, signedIn: T) =>
  Object.fromEntries(EVERYONE.map((who) => [who, who === "anonymous" ? anonymous : signedIn])) as Record<Who, T>;

/** Keyed by the build's app-paths-manifest entry; `path` is a concrete URL for it. */
const PAGES: Record<string, { path: string; expect: Record<Who, PageOutcome> }> = {
  "/page": { path: "/", expect: anonymousElse<PageOutcome>("sign-in", "home") },
  "/(auth)/sign-in/page": { path: "/sign-in", expect: anonymousElse<PageOutcome>("ok", "home") },
  "/(auth)/forgot-password/page": { path: "/forgot-password", expect: same<PageOutcome>("ok") },
  "/(auth)/reset-password/page": { path: "/reset-password?token=not-a-real-token", expect: same<PageOutcome>("ok") },
  "/(auth)/invite/[token]/page": { path: "/invite/not-a-real-token", expect: same<PageOutcome>("ok") },
  "/(app)/home/page": { path: "/home", expect: signedInPage("admin", "lead", "engineer", "auditor") },
  "/(app)/library/page": { path: "/library", expect: signedInPage("lead", "engineer", "auditor") },
  "/(app)/projects/page": { path: "/projects", expect: signedInPage("lead", "engineer", "auditor") },
  "/(app)/runs/page": { path: "/runs", expect: signedInPage("lead", "engineer", "auditor") },
  "/(app)/audit/page": { path: "/audit", expect: signedInPage("admin", "auditor") },
  "/(app)/admin/users/page": { path: "/admin/users", expect: signedInPage("admin", "auditor") },
  "/(app)/admin/mailbox/page": {
    path: "/admin/mailbox",
    expect: { ...signedInPage("admin"), admin: mailboxInUse ? "ok" : "not-found" },
  },
  "/_not-found/page": { path: "/no-such-page-here", expect: same<PageOutcome>("not-found") },
};

const API_ROUTES: Record<string, { path: string; expect: Record<Who, ApiOutcome> }> = {
  "/api/health/route": { path: "/api/health", expect: same<ApiOutcome>("ok") },
  "/api/me/route": { path: "/api/me", expect: anonymousElse<ApiOutcome>("unauthenticated", "ok") },
  // better-auth's own endpoints: the session probe answers everyone (null when signed out).
  "/api/auth/[...all]/route": { path: "/api/auth/get-session", expect: same<ApiOutcome>("ok") },
  "/icon.svg/route": { path: "/icon.svg", expect: same<ApiOutcome>("ok") },
};

/** Framework entries with no route of their own to probe. */
const NOT_ROUTES = new Set(["/_global-error/page"]);

function adminOnlyAction(): Record<Who, ActionOutcome> {
  return Object.fromEntries(EVERYONE.map((who) => [who, who === "anonymous" ? "unauthenticated" : who === "admin" ? "passes-guard" : "forbidden"])) as Record<Who, ActionOutcome>;
}

/** Keyed "<file>#<export>" as in the build's server-reference-manifest. */
const ACTIONS: Record<string, Record<Who, ActionOutcome>> = {
  "app/(app)/admin/users/actions.ts#inviteUserAction": adminOnlyAction(),
  "app/(app)/admin/users/actions.ts#setUserRoleAction": adminOnlyAction(),
  "app/(app)/admin/users/actions.ts#deactivateUserAction": adminOnlyAction(),
  "app/(app)/admin/users/actions.ts#reactivateUserAction": adminOnlyAction(),
  "app/(app)/admin/users/actions.ts#revokeInvitationAction": adminOnlyAction(),
  // The invitation link is the credential: anyone may try one.
  "app/(auth)/invite/[token]/actions.ts#acceptInvitationAction": same<ActionOutcome>("passes-guard"),
};

// ---- what the build contains -----------------------------------------------------------------

const buildDir = path.resolve(import.meta.dirname, "..", "..", ".next", "server");
const readJson = (name: string) => JSON.parse(fs.readFileSync(path.join(buildDir, name), "utf8"));

const routeEntries = Object.keys(readJson("app-paths-manifest.json") as Record<string, string>);

type ManifestAction = { workers: Record<string, unknown>; filename?: string; exportedName?: string };
const builtActions = Object.entries((readJson("server-reference-manifest.json") as { node: Record<string, ManifestAction> }).node).map(
  ([id, entry]) => ({ id, key: `${entry.filename}#${entry.exportedName}`, worker: Object.keys(entry.workers)[0] }),
);

/** "app/(app)/admin/users/page" → "/admin/users"; dynamic segments get a harmless value. */
function pageUrlOfWorker(worker: string): string {
  const segments = worker.replace(/^app\//, "").replace(/\/page$/, "").split("/");
  const url = segments.filter((s) => !/^\(.*\)$/.test(s)).map((s) => (/^\[.*\]$/.test(s) ? "not-a-real-value" : s));
  return `/${url.join("/")}`;
}

// ---- asking the server ---------------------------------------------------------------------------

const sessions = {} as Record<Who, SessionCookie | null>;

beforeAll(async () => {
  sessions.anonymous = null;
  for (const role of ROLES) sessions[role] = await demoSession(role);
}, journeyTimeout(4));

const headersFor = (who: Who): Record<string, string> => (sessions[who] ? { Cookie: sessions[who]! } : {});

async function pageOutcome(who: Who, url: string): Promise<PageOutcome | string> {
  const response = await fetch(appUrl(url), { headers: headersFor(who), redirect: "manual" });
  const body = await response.text();
  if ([302, 303, 307, 308].includes(response.status)) {
    const target = new URL(response.headers.get("location") ?? "", testEnv.baseUrl).pathname;
    return target === "/sign-in" ? "sign-in" : target === "/home" ? "home" : `redirect to ${target}`;
  }
  // Every page's RSC payload carries the 403 page as a ready fallback, so its text proves nothing;
  // the document title is set only when the 403 page is what was rendered (app/forbidden.tsx).
  const showsForbiddenPage = /<title>Not available to your role\b/.test(body);
  if (response.status === 403) return showsForbiddenPage ? "forbidden" : "403 without the 403 page";
  if (response.status === 404) return "not-found";
  if (response.status === 200) return showsForbiddenPage ? "200 showing the 403 page" : "ok";
  return `status ${response.status}`;
}

async function apiOutcome(who: Who, url: string): Promise<ApiOutcome | string> {
  const response = await fetch(appUrl(url), { headers: headersFor(who), redirect: "manual" });
  if (response.status === 200) return "ok";
  const body = (await response.json().catch(() => null)) as { error?: { code?: string } } | null;
  if (response.status === 401 && body?.error?.code === "unauthenticated") return "unauthenticated";
  if (response.status === 403 && body?.error?.code === "forbidden") return "forbidden";
  return `status ${response.status} ${JSON.stringify(body)}`;
}

/**
 * Calls a server action the way Next's client does: POST to a page that uses it, `Next-Action: <id>`,
 * the arguments React-encoded in form field "0" — here (previous state, empty input). The answer is an
 * RSC stream whose root row points at the action's return value, our ActionState.
 */
async function actionOutcome(who: Who, action: (typeof builtActions)[number]): Promise<ActionOutcome | string> {
  const body = new FormData();
  body.set("0", JSON.stringify([null, {}]));
  const response = await fetch(appUrl(pageUrlOfWorker(action.worker)), {
    method: "POST",
    headers: { ...headersFor(who), "Next-Action": action.id, Origin: testEnv.baseUrl, Accept: "text/x-component" },
    body,
    redirect: "manual",
  });
  const text = await response.text();
  const rows = new Map(text.split("\n").filter(Boolean).map((line) => [line.slice(0, line.indexOf(":")), line.slice(line.indexOf(":") + 1)]));
  const root = JSON.parse(rows.get("0") ?? "null") as { a?: string } | null;
  const resultRow = root?.a?.startsWith("$@") ? rows.get(root.a.slice(2)) : undefined;
  const state = resultRow ? (JSON.parse(resultRow) as { ok?: boolean; error?: { code?: string } }) : null;
  if (!state) return `status ${response.status}, no action result in: ${text.slice(0, 200)}`;
  if (state.ok === false && state.error?.code === "invalid-input") return "passes-guard";
  if (state.ok === false && (state.error?.code === "forbidden" || state.error?.code === "unauthenticated")) return state.error.code;
  return `unexpected answer ${JSON.stringify(state)}`;
}

// ---- the tests ---------------------------------------------------------------------------------

describe("every route in the build has a row", () => {
  it("pages and route handlers", () => {
    const covered = new Set([...Object.keys(PAGES), ...Object.keys(API_ROUTES), ...NOT_ROUTES]);
    expect(routeEntries.filter((entry) => !covered.has(entry)), "routes without an expected answer").toEqual([]);
    expect([...covered].filter((entry) => !routeEntries.includes(entry)), "rows for routes that no longer exist").toEqual([]);
  });

  it("server actions", () => {
    const keys = builtActions.map((action) => action.key);
    expect(keys.filter((key) => !(key in ACTIONS)), "server actions without an expected answer").toEqual([]);
    expect(Object.keys(ACTIONS).filter((key) => !keys.includes(key)), "rows for actions that no longer exist").toEqual([]);
  });
});

describe("sessions used by the matrix", () => {
  it("belong to the right people", async () => {
    for (const role of ROLES) expect((await whoAmI(sessions[role]))?.role).toBe(role);
  });
});

describe("pages", () => {
  for (const [entry, { path: url, expect: expected }] of Object.entries(PAGES)) {
    it(`${url} (${entry})`, async () => {
      const actual = Object.fromEntries(await Promise.all(EVERYONE.map(async (who) => [who, await pageOutcome(who, url)])));
      expect(actual).toEqual(expected);
    });
  }
});

describe("signing in brings people back", () => {
  const signedInPages = Object.values(PAGES).filter(({ expect: e }) => e.anonymous === "sign-in" && e.admin !== "home");
  for (const { path: url } of signedInPages) {
    it(`anonymous ${url} → /sign-in?next=${url}`, async () => {
      const response = await fetch(appUrl(url), { redirect: "manual" });
      const location = new URL(response.headers.get("location") ?? "", testEnv.baseUrl);
      expect(location.pathname).toBe("/sign-in");
      expect(location.searchParams.get("next")).toBe(url);
    });
  }
});

describe("API routes", () => {
  for (const [entry, { path: url, expect: expected }] of Object.entries(API_ROUTES)) {
    it(`GET ${url} (${entry})`, async () => {
      const actual = Object.fromEntries(await Promise.all(EVERYONE.map(async (who) => [who, await apiOutcome(who, url)])));
      expect(actual).toEqual(expected);
    });
  }

  it("/api/me says who is asking", async () => {
    for (const role of ROLES) expect((await whoAmI(sessions[role]))?.role).toBe(role);
    const response = await fetch(appUrl("/api/me"));
    expect(response.status).toBe(401);
    expect(await response.json()).toEqual({ error: { code: "unauthenticated", message: expect.any(String) } });
  });
});

describe("server actions", () => {
  for (const action of builtActions) {
    it(action.key, async () => {
      const actual = Object.fromEntries(await Promise.all(EVERYONE.map(async (who) => [who, await actionOutcome(who, action)])));
      expect(actual).toEqual(ACTIONS[action.key]);
    });
  }
});
