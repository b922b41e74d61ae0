// Who gets what, over HTTP, for every page, every method of every route and every server action the
// build contains, for an anonymous visitor and each of the four roles. The tables below are the
// expected answers written out by hand; the build's own manifests (and each route's Allow header) list
// what exists, and anything that exists without a row here fails the test, so a new route, method or
// action cannot ship without a decision.
//
// An allowed cell must show that it worked: the page's own title, the route's expected body, the
// action's `ok` answer and the rows it changed. A refused cell (sent to sign in, the 403 page, 401,
// 403, 404) must leave every row of every table as it was; each cell runs alone, one after another,
// so nothing else writes while it is checked.
import fs from "node:fs";
import path from "node:path";
import { isDeepStrictEqual } from "node:util";
import { beforeAll, describe, expect, it } from "vitest";
import type { Role } from "@/lib/domain/roles";
import { DEFAULT_MESSAGES } from "@/lib/domain/errors";
import { ACTION_FIXTURES, type ActionAnswer } from "../integration/helpers/action-fixtures";
import { appUrl, testEnv } from "../support/env";
import { DEMO_BY_ROLE, demoSession, isFakeMailInUse, journeyTimeout, whoAmI, type SessionCookie } from "../support/pages";
import { expectRowsUnchanged, refusalWrites, snapshotRows, type ExpectedChange } from "../support/snapshot";

type Who = "anonymous" | Role;
const EVERYONE: Who[] = ["anonymous", "admin", "lead", "engineer", "auditor"];
const ROLES: Role[] = ["admin", "lead", "engineer", "auditor"];

// ---- expectations ------------------------------------------------------------------------------

/** ok: 200, the page itself · sign-in: redirect to /sign-in · home: redirect to /home · forbidden: the 403 page · not-found: 404. */
type PageOutcome = "ok" | "sign-in" | "home" | "forbidden" | "not-found";
/** ok: the route's answer · unauthenticated: 401 · forbidden: 403 · not-found: 404 (the last three change nothing). */
type ApiOutcome = "ok" | "unauthenticated" | "forbidden" | "not-found";
/** ok: the action did its work · unauthenticated / forbidden: the use-case runner refused and nothing changed. */
type ActionOutcome = "ok" | "unauthenticated" | "forbidden";

const REFUSED_PAGE: readonly PageOutcome[] = ["sign-in", "forbidden", "not-found"];

const mailboxInUse = await isFakeMailInUse();

/** Signed-in pages: anonymous → sign in; the named roles → the page; the others → 403. */
function signedInPage(...allowed: Role[]): Record<Who, PageOutcome> {
  return Object.fromEntries(
    EVERYONE.map((who) => [who, who === "anonymous" ? "sign-in" : allowed.includes(who) ? "ok" : "forbidden"]),
  ) as Record<Who, PageOutcome>;
}
const same = <T>(outcome: T) => Object.fromEntries(EVERYONE.map((who) => [who, outcome])) as Record<Who, T>;
const anonymousElse = <T>(anonymous: T, signedIn: T) =>
  Object.fromEntries(EVERYONE.map((who) => [who, who === "anonymous" ? anonymous : signedIn])) as Record<Who, T>;

/** Keyed by the build's app-paths-manifest entry; `path` is a concrete URL for it, `title` the page's own. */
const PAGES: Record<string, { path: string; title?: string; expect: Record<Who, PageOutcome> }> = {
  "/page": { path: "/", expect: anonymousElse<PageOutcome>("sign-in", "home") },
  "/(auth)/sign-in/page": { path: "/sign-in", title: "Sign in", expect: anonymousElse<PageOutcome>("ok", "home") },
  "/(auth)/forgot-password/page": { path: "/forgot-password", title: "Forgot password", expect: same<PageOutcome>("ok") },
  "/(auth)/reset-password/page": {
    path: "/reset-password?token=not-a-real-token",
    title: "Choose a new password",
    expect: same<PageOutcome>("ok"),
  },
  "/(auth)/invite/[token]/page": {
    path: "/invite/not-a-real-token",
    title: "Accept your invitation",
    expect: same<PageOutcome>("ok"),
  },
  "/(app)/home/page": { path: "/home", title: "Home", expect: signedInPage("admin", "lead", "engineer", "auditor") },
  "/(app)/profile/page": { path: "/profile", title: "Profile", expect: signedInPage("admin", "lead", "engineer", "auditor") },
  "/(app)/standards/(list)/page": { path: "/standards", title: "Standards", expect: signedInPage("lead", "engineer", "auditor") },
  // A starting standard the seed publishes (content/standards/simply-supported-beam, versions 1 and 2).
  "/(app)/standards/[slug]/page": {
    path: "/standards/simply-supported-beam",
    title: "Standard",
    expect: signedInPage("lead", "engineer", "auditor"),
  },
  "/(app)/standards/[slug]/versions/[number]/page": {
    path: "/standards/simply-supported-beam/versions/1",
    title: "Standard version",
    expect: signedInPage("lead", "engineer", "auditor"),
  },
  // Every run of a version: for those who read runs.
  "/(app)/standards/[slug]/versions/[number]/runs/page": {
    path: "/standards/simply-supported-beam/versions/1/runs",
    title: "Runs of a version",
    expect: signedInPage("lead", "engineer", "auditor"),
  },
  "/(app)/standards/[slug]/diff/page": {
    path: "/standards/simply-supported-beam/diff?from=1&to=2",
    title: "Compare versions",
    expect: signedInPage("lead", "engineer", "auditor"),
  },
  "/(app)/standards/new/page": { path: "/standards/new", title: "New standard", expect: signedInPage("lead") },
  // Drafts are the leads' working space; an address that names no draft is a 404 for them.
  "/(app)/standards/drafts/[draftId]/page": {
    path: "/standards/drafts/not-a-real-draft",
    expect: { ...signedInPage("lead"), lead: "not-found" },
  },
  // The firm's libraries: everyone signed in reads them (admins too). The seed publishes each starting library once.
  "/(app)/libraries/(list)/page": {
    path: "/libraries",
    title: "Libraries",
    expect: signedInPage("admin", "lead", "engineer", "auditor"),
  },
  "/(app)/libraries/[slug]/page": {
    path: "/libraries/firm-sections",
    title: "Library",
    expect: signedInPage("admin", "lead", "engineer", "auditor"),
  },
  "/(app)/libraries/[slug]/versions/[number]/page": {
    path: "/libraries/materials/versions/1",
    title: "Library version",
    expect: signedInPage("admin", "lead", "engineer", "auditor"),
  },
  // A space in the query is written "+", as the address a sign-in brings people back to spells it.
  "/(app)/libraries/[slug]/versions/[number]/entry/page": {
    path: "/libraries/firm-sections/versions/1/entry?key=GI+300x150x10.5",
    title: "Section",
    expect: signedInPage("admin", "lead", "engineer", "auditor"),
  },
  // No library reaches version 999: a difference to it is a 404 for those who may read it.
  "/(app)/libraries/[slug]/diff/page": {
    path: "/libraries/firm-sections/diff?from=1&to=999",
    expect: { ...signedInPage(), admin: "not-found", lead: "not-found", engineer: "not-found", auditor: "not-found" },
  },
  "/(app)/libraries/builder/page": {
    path: "/libraries/builder",
    title: "Section builder",
    expect: signedInPage("admin", "lead", "engineer", "auditor"),
  },
  // Admins and leads maintain the libraries; an address that names no draft is a 404 for them.
  "/(app)/libraries/new/page": { path: "/libraries/new", title: "New library", expect: signedInPage("admin", "lead") },
  "/(app)/libraries/drafts/[draftId]/page": {
    path: "/libraries/drafts/not-a-real-draft",
    expect: { ...signedInPage(), admin: "not-found", lead: "not-found" },
  },
  "/(app)/jobs/(list)/page": { path: "/jobs", title: "Jobs", expect: signedInPage("lead", "engineer", "auditor") },
  "/(app)/runs/(list)/page": { path: "/runs", title: "Runs", expect: signedInPage("lead", "engineer", "auditor") },
  // A demo job (the seed's) and a starting standard: engineers and leads create, change and run; auditors read.
  "/(app)/jobs/new/page": { path: "/jobs/new", title: "New job", expect: signedInPage("lead", "engineer") },
  "/(app)/jobs/[jobNumber]/page": { path: "/jobs/MF-2291", title: "Job", expect: signedInPage("lead", "engineer", "auditor") },
  "/(app)/jobs/[jobNumber]/edit/page": {
    path: "/jobs/MF-2291/edit",
    title: "Edit job",
    expect: signedInPage("lead", "engineer"),
  },
  "/(app)/jobs/[jobNumber]/run/[slug]/page": {
    path: "/jobs/MF-2291/run/fixed-end-beam",
    title: "Run a standard",
    expect: signedInPage("lead", "engineer"),
  },
  // A run id nothing has: the 404 page for those who read runs (its calc sheet too).
  "/(sheet)/runs/[id]/sheet/page": {
    path: "/runs/00000000-0000-4000-8000-000000000000/sheet",
    expect: { ...signedInPage("lead", "engineer", "auditor"), lead: "not-found", engineer: "not-found", auditor: "not-found" },
  },
  "/(app)/runs/[id]/page": {
    path: "/runs/00000000-0000-4000-8000-000000000000",
    expect: { ...signedInPage("lead", "engineer", "auditor"), lead: "not-found", engineer: "not-found", auditor: "not-found" },
  },
  "/(app)/runs/[id]/trace/page": {
    path: "/runs/00000000-0000-4000-8000-000000000000/trace",
    expect: { ...signedInPage("lead", "engineer", "auditor"), lead: "not-found", engineer: "not-found", auditor: "not-found" },
  },
  "/(app)/withdrawals/(list)/page": {
    path: "/withdrawals",
    title: "Withdrawals",
    expect: signedInPage("lead", "engineer", "auditor"),
  },
  // A withdrawal nothing has: the 404 page for those who read runs (an impact report is read by whoever reads runs).
  "/(app)/withdrawals/[id]/page": {
    path: "/withdrawals/00000000-0000-4000-8000-000000000000",
    expect: { ...signedInPage("lead", "engineer", "auditor"), lead: "not-found", engineer: "not-found", auditor: "not-found" },
  },
  "/(app)/runs/compare/page": {
    path: "/runs/compare",
    title: "Compare runs",
    expect: signedInPage("lead", "engineer", "auditor"),
  },
  "/(app)/audit/(trail)/page": { path: "/audit", title: "Audit trail", expect: signedInPage("admin", "auditor") },
  // The run log: the auditor's, the lead's (who answers for the standards) and the admin's (whose trail names every run).
  "/(app)/audit/runs/page": { path: "/audit/runs", title: "Run log", expect: signedInPage("admin", "lead", "auditor") },
  "/(app)/audit/integrity/page": { path: "/audit/integrity", title: "Integrity", expect: signedInPage("admin", "auditor") },
  "/(app)/admin/users/page": { path: "/admin/users", title: "People", expect: signedInPage("admin", "auditor") },
  "/(app)/admin/mailbox/page": {
    path: "/admin/mailbox",
    title: "Demo mailbox",
    expect: { ...signedInPage("admin"), admin: mailboxInUse ? "ok" : "not-found" },
  },
  "/_not-found/page": { path: "/no-such-page-here", expect: same<PageOutcome>("not-found") },
  // The outage page: proxy.ts shows it in place of a page only while the database is down; asked for directly, 404.
  "/unavailable/page": { path: "/unavailable", expect: same<PageOutcome>("not-found") },
};

/** Framework entries with no route of their own to probe. */
const NOT_ROUTES = new Set(["/_global-error/page"]);

type Answer = { status: number; headers: Headers; text: string };
type ApiRow = {
  path: string;
  expect: Record<Who, ApiOutcome>;
  /** What an allowed call must answer. */
  ok: (answer: Answer, who: Who) => void;
  body?: unknown;
  /** Writes a refused call makes on purpose (see ExpectedChange). */
  except?: ExpectedChange[];
};

/** The longest rate-limit window better-auth is configured with (lib/auth/server.ts), in seconds. */
const LONGEST_RATE_LIMIT_WINDOW_S = 60;

/**
 * better-auth counts every request to one of its paths against that path's per-address limit before
 * it looks for a handler; when a counter's window restarts it deletes the counters whose last request
 * is older than its longest window.
 */
function countedByBetterAuth(authPath: string): ExpectedChange[] {
  return [
    {
      table: "rate_limit",
      change: "added or changed",
      why: `better-auth counts the request against its per-address limit for ${authPath}`,
      where: (row) => String(row.key).endsWith(`|${authPath}`),
    },
    {
      table: "rate_limit",
      change: "removed",
      why: "better-auth prunes counters idle for longer than its longest window when a window restarts",
      where: (row) => Number(row.last_request) < Date.now() - LONGEST_RATE_LIMIT_WINDOW_S * 1000,
      count: "any",
    },
  ];
}

const ALLOW_GET = "GET, HEAD, OPTIONS";
const NO_SUCH_UUID = "00000000-0000-4000-8000-000000000000";
/** Those who read the firm's standards (leads, engineers, auditors) get `outcome`; the admin is refused. */
const libraryReaders = (outcome: ApiOutcome) =>
  Object.fromEntries(
    EVERYONE.map((who) => [who, who === "anonymous" ? "unauthenticated" : who === "admin" ? "forbidden" : outcome]),
  ) as Record<Who, ApiOutcome>;
/** The auditor alone gets `ok` ("export evidence"); every other role is refused. */
const auditorOnly = (): Record<Who, ApiOutcome> =>
  Object.fromEntries(
    EVERYONE.map((who) => [who, who === "anonymous" ? "unauthenticated" : who === "auditor" ? "ok" : "forbidden"]),
  ) as Record<Who, ApiOutcome>;
const OPTIONS_ROW = (url: string, allow: string): ApiRow => ({
  path: url,
  expect: same<ApiOutcome>("ok"),
  ok: (answer) => {
    expect(answer.status).toBe(204);
    expect(answer.headers.get("allow")).toBe(allow);
  },
});
const jsonOf = (answer: Answer) => JSON.parse(answer.text) as unknown;
const meOf = (who: Who) => {
  const { name, email, role } = DEMO_BY_ROLE[who as Role];
  return { id: expect.any(String), name, email, role };
};

/**
 * Keyed "<METHOD> <app-paths-manifest entry>", one row for every method the route's Allow header
 * names (Next answers OPTIONS with the methods the route file exports, plus HEAD for GET).
 */
const API_ROUTES: Record<string, ApiRow> = {
  "GET /api/health/route": {
    path: "/api/health",
    expect: same<ApiOutcome>("ok"),
    ok: (answer) =>
      expect([answer.status, jsonOf(answer)]).toEqual([200, { status: "ok", checks: { database: "up", queue: "up" } }]),
  },
  "HEAD /api/health/route": {
    path: "/api/health",
    expect: same<ApiOutcome>("ok"),
    ok: (answer) => expect([answer.status, answer.text]).toEqual([200, ""]),
  },
  "OPTIONS /api/health/route": OPTIONS_ROW("/api/health", ALLOW_GET),
  "GET /api/me/route": {
    path: "/api/me",
    expect: anonymousElse<ApiOutcome>("unauthenticated", "ok"),
    ok: (answer, who) => expect([answer.status, jsonOf(answer)]).toEqual([200, meOf(who)]),
  },
  "HEAD /api/me/route": {
    path: "/api/me",
    expect: anonymousElse<ApiOutcome>("unauthenticated", "ok"),
    ok: (answer) => expect([answer.status, answer.text]).toEqual([200, ""]),
  },
  "OPTIONS /api/me/route": OPTIONS_ROW("/api/me", ALLOW_GET),
  // The verifiable log: everyone in the firm may read the signed heads and check a proof (hashes only).
  "GET /api/log/heads/route": {
    path: "/api/log/heads",
    expect: anonymousElse<ApiOutcome>("unauthenticated", "ok"),
    ok: (answer) => {
      expect(answer.status).toBe(200);
      const heads = answer.text
        .trim()
        .split("\n")
        .map((line) => JSON.parse(line) as { size: number; digest: string });
      expect(heads.length).toBeGreaterThan(0);
      expect(heads.every((head, i) => /^[0-9a-f]{64}$/.test(head.digest) && (i === 0 || head.size > heads[i - 1].size))).toBe(
        true,
      );
    },
  },
  "HEAD /api/log/heads/route": {
    path: "/api/log/heads",
    expect: anonymousElse<ApiOutcome>("unauthenticated", "ok"),
    ok: (answer) => expect([answer.status, answer.text]).toEqual([200, ""]),
  },
  "OPTIONS /api/log/heads/route": OPTIONS_ROW("/api/log/heads", ALLOW_GET),
  "GET /api/log/inclusion/route": {
    path: `/api/log/inclusion?kind=run&ref=${NO_SUCH_UUID}`,
    expect: anonymousElse<ApiOutcome>("unauthenticated", "not-found"),
    ok: () => undefined,
  },
  "HEAD /api/log/inclusion/route": {
    path: `/api/log/inclusion?kind=run&ref=${NO_SUCH_UUID}`,
    expect: anonymousElse<ApiOutcome>("unauthenticated", "not-found"),
    ok: () => undefined,
  },
  "OPTIONS /api/log/inclusion/route": OPTIONS_ROW("/api/log/inclusion", ALLOW_GET),
  "GET /api/log/consistency/route": {
    path: "/api/log/consistency?from=999999999998&to=999999999999",
    expect: anonymousElse<ApiOutcome>("unauthenticated", "not-found"),
    ok: () => undefined,
  },
  "HEAD /api/log/consistency/route": {
    path: "/api/log/consistency?from=999999999998&to=999999999999",
    expect: anonymousElse<ApiOutcome>("unauthenticated", "not-found"),
    ok: () => undefined,
  },
  "OPTIONS /api/log/consistency/route": OPTIONS_ROW("/api/log/consistency", ALLOW_GET),
  // better-auth's own endpoints. The session probe answers everyone (null when signed out).
  "GET /api/auth/[...all]/route": {
    path: "/api/auth/get-session",
    expect: same<ApiOutcome>("ok"),
    ok: (answer, who) => {
      expect(answer.status).toBe(200);
      const body = jsonOf(answer) as { user?: { email: string; role: string } } | null;
      if (who === "anonymous") expect(body).toBeNull();
      else expect(body?.user).toMatchObject({ email: DEMO_BY_ROLE[who].email, role: who });
    },
  },
  // better-auth answers no HEAD: a 404 that changes nothing.
  "HEAD /api/auth/[...all]/route": {
    path: "/api/auth/get-session",
    expect: same<ApiOutcome>("not-found"),
    ok: () => undefined,
    except: countedByBetterAuth("/get-session"),
  },
  "OPTIONS /api/auth/[...all]/route": OPTIONS_ROW("/api/auth/get-session", "GET, HEAD, OPTIONS, POST"),
  // People join by invitation only: sign-up does not exist for anyone, signed in or not.
  "POST /api/auth/[...all]/route": {
    path: "/api/auth/sign-up/email",
    body: { email: "self-signed@marrowby-fenn.example", password: "a-long-enough-password", name: "Self Signed" },
    expect: same<ApiOutcome>("not-found"),
    ok: () => undefined,
  },
  // Hand calculations. A lead may attach one (here with no file: refused for that, after the role check);
  // everyone signed in may download one (here a sha256 nothing has: 404).
  "POST /api/standards/drafts/[draftId]/hand-calculations/route": {
    path: `/api/standards/drafts/${NO_SUCH_UUID}/hand-calculations`,
    body: {},
    expect: leadsOnlyAction(), // leads get past the role check
    ok: (answer) => {
      expect(answer.status).toBe(422);
      expect(jsonOf(answer)).toMatchObject({
        error: { code: "invalid-input", fieldErrors: { file: ["Choose the hand calculation's file (PDF, PNG or JPEG)."] } },
      });
    },
  },
  "OPTIONS /api/standards/drafts/[draftId]/hand-calculations/route": OPTIONS_ROW(
    `/api/standards/drafts/${NO_SUCH_UUID}/hand-calculations`,
    "OPTIONS, POST",
  ),
  "GET /api/standards/hand-calculations/[sha256]/route": {
    path: `/api/standards/hand-calculations/${"0".repeat(64)}`,
    expect: libraryReaders("not-found"),
    ok: () => undefined,
  },
  "HEAD /api/standards/hand-calculations/[sha256]/route": {
    path: `/api/standards/hand-calculations/${"0".repeat(64)}`,
    expect: libraryReaders("not-found"),
    ok: () => undefined,
  },
  "OPTIONS /api/standards/hand-calculations/[sha256]/route": OPTIONS_ROW(
    `/api/standards/hand-calculations/${"0".repeat(64)}`,
    ALLOW_GET,
  ),
  // Runs. Engineers and leads may post one (here with an empty body: refused for that, after the role check); everyone
  // but admins reads them (here the list, and a run id nothing has: 404).
  "POST /api/runs/route": {
    path: "/api/runs",
    body: {},
    expect: runnersAction<ApiOutcome>(),
    ok: (answer) => {
      expect(answer.status).toBe(422);
      expect(jsonOf(answer)).toMatchObject({
        error: {
          code: "invalid-input",
          fieldErrors: { jobId: ["Choose the job to run in."], versionId: ["Choose a published version of a standard."] },
        },
      });
    },
  },
  "GET /api/runs/route": {
    path: "/api/runs?limit=1",
    expect: libraryReaders("ok"),
    ok: (answer) => {
      expect(answer.status).toBe(200);
      const body = jsonOf(answer) as { data: { runs: unknown[]; nextCursor: string | null } };
      expect(Array.isArray(body.data.runs)).toBe(true);
      expect(body.data.runs.length).toBeLessThanOrEqual(1);
    },
  },
  "HEAD /api/runs/route": {
    path: "/api/runs?limit=1",
    expect: libraryReaders("ok"),
    ok: (answer) => expect([answer.status, answer.text]).toEqual([200, ""]),
  },
  "OPTIONS /api/runs/route": OPTIONS_ROW("/api/runs", "GET, HEAD, OPTIONS, POST"),
  "GET /api/runs/[id]/route": {
    path: `/api/runs/${NO_SUCH_UUID}`,
    expect: libraryReaders("not-found"),
    ok: () => undefined,
  },
  "HEAD /api/runs/[id]/route": {
    path: `/api/runs/${NO_SUCH_UUID}`,
    expect: libraryReaders("not-found"),
    ok: () => undefined,
  },
  "OPTIONS /api/runs/[id]/route": OPTIONS_ROW(`/api/runs/${NO_SUCH_UUID}`, ALLOW_GET),
  // The run log as CSV: the auditor's alone ("export evidence"); the export is an audit event, no other write.
  "GET /api/runs/export/route": {
    path: "/api/runs/export?outcome=failed&sort=job",
    expect: auditorOnly(),
    ok: (answer) => {
      expect(answer.status).toBe(200);
      expect(answer.headers.get("content-type")).toMatch(/^text\/csv; charset=utf-8/);
      expect(answer.headers.get("content-disposition")).toMatch(/^attachment; filename="gusset-run-log-\d{8}T\d{6}Z\.csv"/);
      expect(answer.text.split("\r\n")[0]).toMatch(/^run_id,created_at,job_number,/);
    },
  },
  "HEAD /api/runs/export/route": {
    path: "/api/runs/export?outcome=failed",
    expect: auditorOnly(),
    ok: (answer) => expect([answer.status, answer.text]).toEqual([200, ""]),
  },
  "OPTIONS /api/runs/export/route": OPTIONS_ROW("/api/runs/export", ALLOW_GET),
  // The batch re-run of a withdrawal nothing has: 404 for those who read runs (the impact report's progress).
  "GET /api/withdrawals/[id]/batch/route": {
    path: `/api/withdrawals/${NO_SUCH_UUID}/batch`,
    expect: libraryReaders("not-found"),
    ok: () => undefined,
  },
  "HEAD /api/withdrawals/[id]/batch/route": {
    path: `/api/withdrawals/${NO_SUCH_UUID}/batch`,
    expect: libraryReaders("not-found"),
    ok: () => undefined,
  },
  "OPTIONS /api/withdrawals/[id]/batch/route": OPTIONS_ROW(`/api/withdrawals/${NO_SUCH_UUID}/batch`, ALLOW_GET),
  // Calc sheet PDFs of a run id nothing has: 404 for those who read runs, before anything is rendered.
  "GET /api/runs/[id]/sheet-pdf/route": {
    path: `/api/runs/${NO_SUCH_UUID}/sheet-pdf`,
    expect: libraryReaders("not-found"),
    ok: () => undefined,
  },
  "HEAD /api/runs/[id]/sheet-pdf/route": {
    path: `/api/runs/${NO_SUCH_UUID}/sheet-pdf`,
    expect: libraryReaders("not-found"),
    ok: () => undefined,
  },
  "OPTIONS /api/runs/[id]/sheet-pdf/route": OPTIONS_ROW(`/api/runs/${NO_SUCH_UUID}/sheet-pdf`, ALLOW_GET),
  "GET /api/runs/[id]/sheet-pdfs/[pdfId]/route": {
    path: `/api/runs/${NO_SUCH_UUID}/sheet-pdfs/${NO_SUCH_UUID}`,
    expect: libraryReaders("not-found"),
    ok: () => undefined,
  },
  "HEAD /api/runs/[id]/sheet-pdfs/[pdfId]/route": {
    path: `/api/runs/${NO_SUCH_UUID}/sheet-pdfs/${NO_SUCH_UUID}`,
    expect: libraryReaders("not-found"),
    ok: () => undefined,
  },
  "OPTIONS /api/runs/[id]/sheet-pdfs/[pdfId]/route": OPTIONS_ROW(
    `/api/runs/${NO_SUCH_UUID}/sheet-pdfs/${NO_SUCH_UUID}`,
    ALLOW_GET,
  ),
  // Attachments: engineers and leads attach (here with no file: refused for that, after the role check); whoever
  // reads jobs downloads (here an id nothing has: 404).
  "POST /api/jobs/[jobNumber]/attachments/route": {
    path: "/api/jobs/MF-2291/attachments",
    body: {},
    expect: runnersAction<ApiOutcome>(),
    ok: (answer) => {
      expect(answer.status).toBe(422);
      expect(jsonOf(answer)).toMatchObject({
        error: { code: "invalid-input", fieldErrors: { file: ["Choose a file to attach (PDF, PNG, JPEG or WebP)."] } },
      });
    },
  },
  "OPTIONS /api/jobs/[jobNumber]/attachments/route": OPTIONS_ROW("/api/jobs/MF-2291/attachments", "OPTIONS, POST"),
  "GET /api/attachments/[attachmentId]/route": {
    path: `/api/attachments/${NO_SUCH_UUID}`,
    expect: libraryReaders("not-found"),
    ok: () => undefined,
  },
  "HEAD /api/attachments/[attachmentId]/route": {
    path: `/api/attachments/${NO_SUCH_UUID}`,
    expect: libraryReaders("not-found"),
    ok: () => undefined,
  },
  "OPTIONS /api/attachments/[attachmentId]/route": OPTIONS_ROW(`/api/attachments/${NO_SUCH_UUID}`, ALLOW_GET),
  "GET /icon.svg/route": {
    path: "/icon.svg",
    expect: same<ApiOutcome>("ok"),
    ok: (answer) => {
      expect([answer.status, answer.headers.get("content-type")]).toEqual([200, "image/svg+xml"]);
      expect(answer.text).toMatch(/^<svg xmlns="http:\/\/www\.w3\.org\/2000\/svg"/);
    },
  },
  "HEAD /icon.svg/route": {
    path: "/icon.svg",
    expect: same<ApiOutcome>("ok"),
    ok: (answer) => expect([answer.status, answer.text]).toEqual([200, ""]),
  },
};

// ---- server actions ------------------------------------------------------------------------------

function adminOnlyAction(): Record<Who, ActionOutcome> {
  return Object.fromEntries(
    EVERYONE.map((who) => [who, who === "anonymous" ? "unauthenticated" : who === "admin" ? "ok" : "forbidden"]),
  ) as Record<Who, ActionOutcome>;
}

/** Engineers and leads (who may do everything an engineer may) get `ok`; admins and auditors are refused. */
function runnersAction<T extends string = ActionOutcome>(): Record<Who, T> {
  return Object.fromEntries(
    EVERYONE.map((who) => [
      who,
      who === "anonymous" ? "unauthenticated" : who === "lead" || who === "engineer" ? "ok" : "forbidden",
    ]),
  ) as Record<Who, T>;
}

/** The firm's libraries are maintained by admins and leads. */
function libraryEditorsAction(): Record<Who, ActionOutcome> {
  return Object.fromEntries(
    EVERYONE.map((who) => [
      who,
      who === "anonymous" ? "unauthenticated" : who === "admin" || who === "lead" ? "ok" : "forbidden",
    ]),
  ) as Record<Who, ActionOutcome>;
}

/** The integrity check: the quality manager's job ("verify integrity"), and the admin's, who runs the servers. */
function integrityCheckersAction(): Record<Who, ActionOutcome> {
  return Object.fromEntries(
    EVERYONE.map((who) => [
      who,
      who === "anonymous" ? "unauthenticated" : who === "admin" || who === "auditor" ? "ok" : "forbidden",
    ]),
  ) as Record<Who, ActionOutcome>;
}

/** An auditor reproduces runs (product.md), and so may a lead; engineers and admins may not. */
function reproducersAction(): Record<Who, ActionOutcome> {
  return Object.fromEntries(
    EVERYONE.map((who) => [
      who,
      who === "anonymous" ? "unauthenticated" : who === "auditor" || who === "lead" ? "ok" : "forbidden",
    ]),
  ) as Record<Who, ActionOutcome>;
}

function leadsOnlyAction(): Record<Who, ActionOutcome> {
  return Object.fromEntries(
    EVERYONE.map((who) => [who, who === "anonymous" ? "unauthenticated" : who === "lead" ? "ok" : "forbidden"]),
  ) as Record<Who, ActionOutcome>;
}

/**
 * Keyed "<file>#<export>" as in the build's server-reference-manifest. The input for each call and
 * the proof that an allowed call did its work are in tests/integration/helpers/action-fixtures.ts.
 */
const ACTIONS: Record<string, Record<Who, ActionOutcome>> = {
  "app/(app)/admin/users/actions.ts#inviteUserAction": adminOnlyAction(),
  "app/(app)/admin/users/actions.ts#setUserRoleAction": adminOnlyAction(),
  "app/(app)/admin/users/actions.ts#deactivateUserAction": adminOnlyAction(),
  "app/(app)/admin/users/actions.ts#reactivateUserAction": adminOnlyAction(),
  "app/(app)/admin/users/actions.ts#revokeInvitationAction": adminOnlyAction(),
  // Every role has a profile, and each call acts on the caller only.
  "app/(app)/profile/actions.ts#changePasswordAction": anonymousElse<ActionOutcome>("unauthenticated", "ok"),
  "app/(app)/profile/actions.ts#setTimeZoneAction": anonymousElse<ActionOutcome>("unauthenticated", "ok"),
  "app/(app)/profile/actions.ts#setDisplayUnitsAction": anonymousElse<ActionOutcome>("unauthenticated", "ok"),
  // The invitation link is the credential: anyone holding a real one may accept it, and lands home.
  "app/(auth)/invite/[token]/actions.ts#acceptInvitationAction": same<ActionOutcome>("ok"),
  // Standards leads write, review, publish and withdraw standards; nobody else.
  "app/(app)/standards/actions.ts#createStandardAction": leadsOnlyAction(),
  "app/(app)/standards/actions.ts#startDraftAction": leadsOnlyAction(),
  "app/(app)/standards/actions.ts#saveDraftAction": leadsOnlyAction(),
  "app/(app)/standards/actions.ts#previewSourceAction": leadsOnlyAction(),
  "app/(app)/standards/actions.ts#submitDraftAction": leadsOnlyAction(),
  "app/(app)/standards/actions.ts#discardDraftAction": leadsOnlyAction(),
  "app/(app)/standards/actions.ts#returnDraftAction": leadsOnlyAction(),
  "app/(app)/standards/actions.ts#approveAndPublishAction": leadsOnlyAction(),
  "app/(app)/standards/actions.ts#withdrawVersionAction": leadsOnlyAction(),
  "app/(app)/audit/integrity/actions.ts#runIntegrityCheckAction": integrityCheckersAction(),
  // After a withdrawal: a lead starts the batch re-run; a lead or the job's responsible engineer signs an outcome.
  "app/(app)/withdrawals/actions.ts#declareSuccessorAction": leadsOnlyAction(),
  "app/(app)/withdrawals/actions.ts#startBatchAction": leadsOnlyAction(),
  "app/(app)/withdrawals/actions.ts#recordOutcomeAction": runnersAction(),
  // Jobs and runs: engineers and leads; auditors change nothing; admins manage people.
  "app/(app)/jobs/actions.ts#createJobAction": runnersAction(),
  "app/(app)/jobs/actions.ts#updateJobAction": runnersAction(),
  "app/(app)/jobs/actions.ts#createRunAction": runnersAction(),
  // The calc package's sign-off: engineers and leads; each step then only by its own person.
  "app/(app)/runs/actions.ts#createCalcAction": runnersAction(),
  "app/(app)/runs/actions.ts#prepareRevisionAction": runnersAction(),
  "app/(app)/runs/actions.ts#checkRevisionAction": runnersAction(),
  "app/(app)/runs/actions.ts#approveRevisionAction": runnersAction(),
  // Reproducing a stored run writes only its audit event: auditors and leads.
  "app/(app)/runs/actions.ts#reproduceRunAction": reproducersAction(),
  // Admins and standards leads maintain the firm's libraries, four eyes between any two of them.
  "app/(app)/libraries/actions.ts#createLibraryAction": libraryEditorsAction(),
  "app/(app)/libraries/actions.ts#startLibraryDraftAction": libraryEditorsAction(),
  "app/(app)/libraries/actions.ts#saveLibraryDraftAction": libraryEditorsAction(),
  "app/(app)/libraries/actions.ts#submitLibraryDraftAction": libraryEditorsAction(),
  "app/(app)/libraries/actions.ts#discardLibraryDraftAction": libraryEditorsAction(),
  "app/(app)/libraries/actions.ts#returnLibraryDraftAction": libraryEditorsAction(),
  "app/(app)/libraries/actions.ts#approveAndPublishLibraryAction": libraryEditorsAction(),
  "app/(app)/libraries/actions.ts#withdrawLibraryVersionAction": libraryEditorsAction(),
  "app/(app)/libraries/actions.ts#withdrawLibraryEntryAction": libraryEditorsAction(),
};

// ---- what the build contains -----------------------------------------------------------------

const buildDir = path.resolve(import.meta.dirname, "..", "..", ".next", "server");
const readJson = (name: string) => JSON.parse(fs.readFileSync(path.join(buildDir, name), "utf8"));

const routeEntries = Object.keys(readJson("app-paths-manifest.json") as Record<string, string>);
const routeHandlerEntries = routeEntries.filter((entry) => entry.endsWith("/route"));

type ManifestAction = { workers: Record<string, unknown>; filename?: string; exportedName?: string };
const manifestActions = readJson("server-reference-manifest.json") as Record<"node" | "edge", Record<string, ManifestAction>>;
const builtActions = [...Object.entries(manifestActions.node), ...Object.entries(manifestActions.edge)].map(([id, entry]) => ({
  id,
  key: `${entry.filename}#${entry.exportedName}`,
  worker: Object.keys(entry.workers)[0],
}));

/** "app/(app)/admin/users/page" → "/admin/users"; dynamic segments get a harmless value. */
function pageUrlOfWorker(worker: string): string {
  const segments = worker
    .replace(/^app\//, "")
    .replace(/\/page$/, "")
    .split("/");
  const url = segments.filter((s) => !/^\(.*\)$/.test(s)).map((s) => (/^\[.*\]$/.test(s) ? "not-a-real-value" : s));
  return `/${url.join("/")}`;
}

/** A URL that reaches a route entry (its rows' path), for asking it which methods it answers. */
function urlOfRouteEntry(entry: string): string {
  const key = Object.keys(API_ROUTES).find((candidate) => candidate.endsWith(` ${entry}`));
  return key ? API_ROUTES[key].path : entry.replace(/\/route$/, "");
}

// ---- asking the server ---------------------------------------------------------------------------

const sessions = {} as Record<Who, SessionCookie | null>;
/** Who each session is, by id: a role refused by the use-case runner is named in its audit event. */
const actors = {} as Record<Who, { id: string } | null>;

beforeAll(async () => {
  sessions.anonymous = null;
  actors.anonymous = null;
  for (const role of ROLES) {
    sessions[role] = await demoSession(role);
    const me = await fetch(appUrl("/api/me"), { headers: { Cookie: sessions[role]! } });
    actors[role] = (await me.json()) as { id: string };
  }
}, journeyTimeout(4));

const headersFor = (who: Who): Record<string, string> => (sessions[who] ? { Cookie: sessions[who]! } : {});

/** Runs `call` for a refused cell between two snapshots: it must change no row of any table. */
async function unchangedBy<T>(refused: boolean, call: () => Promise<T>, except: ExpectedChange[] = []): Promise<T> {
  if (!refused) return call();
  const before = await snapshotRows();
  const result = await call();
  await expectRowsUnchanged(before, { except });
  return result;
}

async function pageOutcome(who: Who, url: string, title: string | undefined): Promise<PageOutcome | string> {
  const response = await fetch(appUrl(url), { headers: headersFor(who), redirect: "manual" });
  const body = await response.text();
  if ([302, 303, 307, 308].includes(response.status)) {
    const target = new URL(response.headers.get("location") ?? "", testEnv.baseUrl).pathname;
    return target === "/sign-in" ? "sign-in" : target === "/home" ? "home" : `redirect to ${target}`;
  }
  // Every page's RSC payload carries the 403 page as a ready fallback, so its text proves nothing;
  // the document title is the one of the page that was rendered.
  const shown = /<title>([^<]*)<\/title>/.exec(body)?.[1];
  if (response.status === 403) return shown === "Not available to your role · Gusset" ? "forbidden" : `403 showing "${shown}"`;
  if (response.status === 404) return shown === "Page not found · Gusset" ? "not-found" : `404 showing "${shown}"`;
  if (response.status === 200) return shown === `${title} · Gusset` ? "ok" : `200 showing "${shown}"`;
  return `status ${response.status}`;
}

async function askRoute(who: Who, method: string, row: ApiRow): Promise<Answer> {
  const headers: Record<string, string> = { ...headersFor(who), Origin: testEnv.baseUrl };
  if (row.body) headers["Content-Type"] = "application/json";
  const response = await fetch(appUrl(row.path), {
    method,
    headers,
    body: row.body ? JSON.stringify(row.body) : undefined,
    redirect: "manual",
  });
  return { status: response.status, headers: response.headers, text: await response.text() };
}

function apiOutcome(method: string, answer: Answer): ApiOutcome | string {
  if (answer.status === 404) return "not-found";
  if (answer.status !== 401 && answer.status !== 403) return "answered";
  const code = answer.status === 401 ? "unauthenticated" : "forbidden";
  if (method === "HEAD") return code; // no body to read
  const body = JSON.parse(answer.text) as unknown;
  return JSON.stringify(body) === JSON.stringify({ error: { code, message: DEFAULT_MESSAGES[code] } })
    ? code
    : `${answer.status} ${answer.text}`;
}

/**
 * Calls a server action the way Next's client does: POST to a page that uses it, `Next-Action: <id>`,
 * the arguments React-encoded in form field "0" — here (previous state, input). The answer is an RSC
 * stream whose root row points at the action's return value, our ActionState; a redirect() comes back
 * as a 303 naming its target.
 */
async function callAction(who: Who, action: (typeof builtActions)[number], input: unknown): Promise<ActionAnswer | string> {
  const body = new FormData();
  body.set("0", JSON.stringify([null, input]));
  const response = await fetch(appUrl(pageUrlOfWorker(action.worker)), {
    method: "POST",
    headers: { ...headersFor(who), "Next-Action": action.id, Origin: testEnv.baseUrl, Accept: "text/x-component" },
    body,
    redirect: "manual",
  });
  const redirect = response.headers.get("x-action-redirect");
  const text = await response.text();
  if (redirect) return { redirect: redirect.split(";")[0] };
  const rows = new Map(
    text
      .split("\n")
      .filter(Boolean)
      .map((line) => [line.slice(0, line.indexOf(":")), line.slice(line.indexOf(":") + 1)]),
  );
  const root = JSON.parse(rows.get("0") ?? "null") as { a?: string } | null;
  const resultRow = root?.a?.startsWith("$@") ? rows.get(root.a.slice(2)) : undefined;
  if (!resultRow) return `status ${response.status}, no action result in: ${text.slice(0, 200)}`;
  return { state: JSON.parse(resultRow) as Extract<ActionAnswer, { state: unknown }>["state"] };
}

// ---- the tests ---------------------------------------------------------------------------------

describe("every route, method and action in the build has a row", () => {
  it("pages and route handlers", () => {
    const covered = new Set([...Object.keys(PAGES), ...Object.keys(API_ROUTES).map((key) => key.split(" ")[1]), ...NOT_ROUTES]);
    expect(
      routeEntries.filter((entry) => !covered.has(entry)),
      "routes without an expected answer",
    ).toEqual([]);
    expect(
      [...covered].filter((entry) => !routeEntries.includes(entry)),
      "rows for routes that no longer exist",
    ).toEqual([]);
  });

  it("every method each route handler answers", async () => {
    const answered: string[] = [];
    for (const entry of routeHandlerEntries) {
      const response = await fetch(appUrl(urlOfRouteEntry(entry)), { method: "OPTIONS", redirect: "manual" });
      const allow = response.headers.get("allow");
      expect(allow, `OPTIONS ${entry} names no methods`).not.toBeNull();
      for (const method of allow!.split(",").map((m) => m.trim())) answered.push(`${method} ${entry}`);
    }
    expect(answered.sort()).toEqual(Object.keys(API_ROUTES).sort());
  });

  it("server actions", () => {
    const keys = builtActions.map((action) => action.key);
    expect(
      keys.filter((key) => !(key in ACTIONS)),
      "server actions without an expected answer",
    ).toEqual([]);
    expect(
      Object.keys(ACTIONS).filter((key) => !keys.includes(key)),
      "rows for actions that no longer exist",
    ).toEqual([]);
    expect(Object.keys(ACTION_FIXTURES).sort(), "an input for every row").toEqual(Object.keys(ACTIONS).sort());
  });
});

describe("sessions used by the matrix", () => {
  it("belong to the right people", async () => {
    for (const role of ROLES) expect(await whoAmI(sessions[role])).toMatchObject({ email: DEMO_BY_ROLE[role].email, role });
  });
});

describe("pages", () => {
  for (const [entry, { path: url, title, expect: expected }] of Object.entries(PAGES)) {
    it(`${url} (${entry})`, async () => {
      const actual: Record<string, PageOutcome | string> = {};
      for (const who of EVERYONE) {
        actual[who] = await unchangedBy(REFUSED_PAGE.includes(expected[who]), () => pageOutcome(who, url, title));
      }
      expect(actual).toEqual(expected);
    });
  }
});

describe("signing in brings people back", () => {
  const signedInPages = Object.values(PAGES).filter(({ expect: e }) => e.anonymous === "sign-in" && e.admin !== "home");
  it("applies to every signed-in page", () => {
    expect(signedInPages.map((page) => page.path)).toEqual([
      "/home",
      "/profile",
      "/standards",
      "/standards/simply-supported-beam",
      "/standards/simply-supported-beam/versions/1",
      "/standards/simply-supported-beam/versions/1/runs",
      "/standards/simply-supported-beam/diff?from=1&to=2",
      "/standards/new",
      "/standards/drafts/not-a-real-draft",
      "/libraries",
      "/libraries/firm-sections",
      "/libraries/materials/versions/1",
      "/libraries/firm-sections/versions/1/entry?key=GI+300x150x10.5",
      "/libraries/firm-sections/diff?from=1&to=999",
      "/libraries/builder",
      "/libraries/new",
      "/libraries/drafts/not-a-real-draft",
      "/jobs",
      "/runs",
      "/jobs/new",
      "/jobs/MF-2291",
      "/jobs/MF-2291/edit",
      "/jobs/MF-2291/run/fixed-end-beam",
      "/runs/00000000-0000-4000-8000-000000000000/sheet",
      "/runs/00000000-0000-4000-8000-000000000000",
      "/runs/00000000-0000-4000-8000-000000000000/trace",
      "/withdrawals",
      "/withdrawals/00000000-0000-4000-8000-000000000000",
      "/runs/compare",
      "/audit",
      "/audit/runs",
      "/audit/integrity",
      "/admin/users",
      "/admin/mailbox",
    ]);
  });
  for (const { path: url } of signedInPages) {
    it(`anonymous ${url} → /sign-in?next=${url}`, async () => {
      const response = await fetch(appUrl(url), { redirect: "manual" });
      const location = new URL(response.headers.get("location") ?? "", testEnv.baseUrl);
      expect(location.pathname).toBe("/sign-in");
      expect(location.searchParams.get("next")).toBe(url);
    });
  }
});

describe("route handlers, every method", () => {
  for (const [key, row] of Object.entries(API_ROUTES)) {
    const method = key.split(" ")[0];
    it(`${method} ${row.path} (${key})`, async () => {
      const actual: Record<string, ApiOutcome | string> = {};
      for (const who of EVERYONE) {
        const refused = row.expect[who] !== "ok";
        // A signed-in person refused for their role: the runner's one write, the access.refused audit event.
        const audited = row.expect[who] === "forbidden" ? refusalWrites("forbidden", actors[who]) : [];
        const answer = await unchangedBy(refused, () => askRoute(who, method, row), [...(row.except ?? []), ...audited]);
        const outcome = apiOutcome(method, answer);
        if (outcome === "answered" && row.expect[who] === "ok") row.ok(answer, who);
        actual[who] = outcome === "answered" ? "ok" : outcome;
      }
      expect(actual).toEqual(row.expect);
    });
  }
});

describe("server actions", () => {
  // builtActions is never empty while ACTIONS has rows: the coverage test above compares the two.
  for (const action of builtActions) {
    it(action.key, async () => {
      const row = ACTIONS[action.key];
      if (!row) throw new Error(`${action.key} has no row`);
      const actual: Record<string, ActionOutcome | string> = {};
      for (const who of EVERYONE) {
        const expected = row[who];
        const { input, succeeded } = await ACTION_FIXTURES[action.key]();
        if (expected === "ok") {
          const answer = await callAction(who, action, input);
          if (typeof answer === "string") throw new Error(`${who}: ${answer}`);
          await succeeded(answer);
          actual[who] = "ok";
          continue;
        }
        // The runner's one write for a signed-in person refused for their role: the access.refused audit event.
        const answer = await unchangedBy(true, () => callAction(who, action, input), refusalWrites(expected, actors[who]));
        const refusal = { state: { ok: false, error: { code: expected, message: DEFAULT_MESSAGES[expected] } } };
        actual[who] = isDeepStrictEqual(answer, refusal) ? expected : `answered ${JSON.stringify(answer)}`;
      }
      expect(actual).toEqual(row);
    });
  }
});
