// Who gets what: every server action the build exposes (its server-reference manifest) and every HTTP
// method every route file exports, against an anonymous visitor and each role, as a table written
// from the product's rules for each role, not from lib/domain/permissions.ts nor from the permissions
// the use cases (lib/use-cases/) declare, so a wrong permission in code fails here. An action or a route method without a row fails the "covers every…" tests.
//
// Each cell is called with a valid input made fresh for it. An allowed cell must do its work (the
// answer and the rows it changes are checked); a refused cell must answer with the runner's code and
// leave every row of every table, and the job queue, as it was (lib/use-cases/run.ts writes nothing
// when it refuses).
import { createHash } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import type { Actor } from "@/lib/domain/actor";
import type { ActionState } from "@/lib/domain/action-state";
import type { Role } from "@/lib/domain/roles";
import { DEFAULT_MESSAGES } from "@/lib/domain/errors";
import { expectRowsUnchanged, refusalWrites, snapshotRows } from "../support/snapshot";
import { ACTION_FIXTURES, matrixJob, matrixRun, seededVersionId, type ActionAnswer } from "./helpers/action-fixtures";
import { db, pool } from "@/db";
import { sealedInLog } from "./helpers/log";
import { logPublicKeyFromSettings } from "@/lib/jobs/log-keys";
import { hashFromHex, leafHash, verifyConsistency, verifyInclusion } from "@/lib/integrity/merkle";
import { verifyTreeHead } from "@/lib/integrity/tree-head";
import * as schema from "@/db/schema";
import { and, desc, eq } from "drizzle-orm";
import { parseCsv } from "@/lib/domain/csv";
import { createTestUser, sessionCount, signInHeaders } from "./helpers/people";
import { runUseCase } from "@/lib/use-cases/run";
import { createStandard } from "@/lib/use-cases/standards";
import { attachHandCalculation, handCalculationKey } from "@/lib/use-cases/standard-attachments";
import { getDraft, listAttachments } from "@/lib/data/standards";
import { getObject, putObject } from "@/lib/storage/s3";
import { attachmentKey, sheetPdfKey } from "@/lib/data/files";
import { attachFile } from "@/lib/use-cases/files";
import { matrixWithdrawal } from "./helpers/withdrawal-action-fixtures";

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

/** allowed: the use case did its work · unauthenticated / forbidden: the runner refused, nothing changed. */
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
// Standards leads write, review, publish and withdraw standards (product.md); nobody else does.
const LEADS_ONLY: Record<Who, Expected> = {
  anonymous: "unauthenticated",
  admin: "forbidden",
  lead: "allowed",
  engineer: "forbidden",
  auditor: "forbidden",
};
// Admins and standards leads maintain the firm's libraries (product.md), four eyes between any two of them.
const LIBRARY_EDITORS: Record<Who, Expected> = {
  anonymous: "unauthenticated",
  admin: "allowed",
  lead: "allowed",
  engineer: "forbidden",
  auditor: "forbidden",
};
/** Those who read the firm's standards: everyone signed in but the admin, whose work is people. */
const LIBRARY_READERS: Record<Who, Expected> = {
  anonymous: "unauthenticated",
  admin: "forbidden",
  lead: "allowed",
  engineer: "allowed",
  auditor: "allowed",
};
/** Engineers create jobs and run published versions in them; leads may do everything an engineer may (product.md). */
const RUNNERS: Record<Who, Expected> = {
  anonymous: "unauthenticated",
  admin: "forbidden",
  lead: "allowed",
  engineer: "allowed",
  auditor: "forbidden",
};
/** An auditor "reproduces" (product.md); a lead answers for the standards whose runs are reproduced. */
const REPRODUCERS: Record<Who, Expected> = {
  anonymous: "unauthenticated",
  admin: "forbidden",
  lead: "allowed",
  engineer: "forbidden",
  auditor: "allowed",
};
/** The auditor alone: "export evidence" (product.md). */
const AUDITOR_ONLY: Record<Who, Expected> = {
  anonymous: "unauthenticated",
  admin: "forbidden",
  lead: "forbidden",
  engineer: "forbidden",
  auditor: "allowed",
};
const PUBLIC: Record<Who, Expected> = {
  anonymous: "allowed",
  admin: "allowed",
  lead: "allowed",
  engineer: "allowed",
  auditor: "allowed",
};

// ---- the verifiable log ---------------------------------------------------------------------------

/** An audit event written as the app's role, committed: a record for the log to seal. */
async function matrixAuditEvent(): Promise<string> {
  const { rows } = await pool.query<{ id: string }>(
    `insert into audit_events (action, details) values ('access.refused', '{"useCase": "matrix log", "permission": "none"}')
     returning id::text`,
  );
  return rows[0].id;
}

// ---- the people who call -------------------------------------------------------------------------

const headersFor: Partial<Record<Who, Headers>> = {};
const actorFor: Partial<Record<Who, Actor | null>> = {};

beforeAll(async () => {
  headersFor.anonymous = new Headers();
  actorFor.anonymous = null;
  for (const role of ["admin", "lead", "engineer", "auditor"] as const) {
    const { actor, password } = await createTestUser({ role, label: `matrix-${role}` });
    headersFor[role] = await signInHeaders(actor.email, password);
    actorFor[role] = actor;
  }
});

// ---- server actions ------------------------------------------------------------------------------

type AnyAction = (previous: ActionState<unknown>, payload: unknown) => Promise<ActionState<unknown>>;

/**
 * Keyed "<file>#<export>" exactly as the build's server-reference manifest names them. The input
 * for each call and the proof that an allowed call did its work are in helpers/action-fixtures.ts.
 */
const ACTIONS: Record<string, Record<Who, Expected>> = {
  "app/(app)/admin/users/actions.ts#inviteUserAction": ADMIN_ONLY,
  "app/(app)/admin/users/actions.ts#setUserRoleAction": ADMIN_ONLY,
  "app/(app)/admin/users/actions.ts#deactivateUserAction": ADMIN_ONLY,
  "app/(app)/admin/users/actions.ts#reactivateUserAction": ADMIN_ONLY,
  "app/(app)/admin/users/actions.ts#revokeInvitationAction": ADMIN_ONLY,
  // Every role has a profile, and each call acts on the caller only.
  "app/(app)/profile/actions.ts#changePasswordAction": SIGNED_IN,
  "app/(app)/profile/actions.ts#setTimeZoneAction": SIGNED_IN,
  "app/(app)/profile/actions.ts#setDisplayUnitsAction": SIGNED_IN,
  // The integrity check: the quality manager's job ("verify integrity"), and the admin's, who runs the servers.
  "app/(app)/audit/integrity/actions.ts#runIntegrityCheckAction": {
    anonymous: "unauthenticated",
    admin: "allowed",
    lead: "forbidden",
    engineer: "forbidden",
    auditor: "allowed",
  },
  // Public: the link is the credential; anyone holding a real one may accept it.
  "app/(auth)/invite/[token]/actions.ts#acceptInvitationAction": PUBLIC,
  "app/(app)/standards/actions.ts#createStandardAction": LEADS_ONLY,
  "app/(app)/standards/actions.ts#startDraftAction": LEADS_ONLY,
  "app/(app)/standards/actions.ts#saveDraftAction": LEADS_ONLY,
  "app/(app)/standards/actions.ts#previewSourceAction": LEADS_ONLY,
  "app/(app)/standards/actions.ts#submitDraftAction": LEADS_ONLY,
  "app/(app)/standards/actions.ts#discardDraftAction": LEADS_ONLY,
  "app/(app)/standards/actions.ts#returnDraftAction": LEADS_ONLY,
  "app/(app)/standards/actions.ts#approveAndPublishAction": LEADS_ONLY,
  "app/(app)/standards/actions.ts#withdrawVersionAction": LEADS_ONLY,
  // Jobs and runs: engineers and leads; an auditor reads everything and changes nothing; admins manage people.
  "app/(app)/jobs/actions.ts#createJobAction": RUNNERS,
  "app/(app)/jobs/actions.ts#updateJobAction": RUNNERS,
  "app/(app)/jobs/actions.ts#createRunAction": RUNNERS,
  // The calc package's sign-off: engineers and leads, each step then only by its own person (the fixtures check
  // that a caller who is not that person is told who is).
  "app/(app)/runs/actions.ts#createCalcAction": RUNNERS,
  "app/(app)/runs/actions.ts#prepareRevisionAction": RUNNERS,
  "app/(app)/runs/actions.ts#checkRevisionAction": RUNNERS,
  "app/(app)/runs/actions.ts#approveRevisionAction": RUNNERS,
  // Reproducing a stored run writes only its audit event: auditors and leads.
  "app/(app)/runs/actions.ts#reproduceRunAction": REPRODUCERS,
  "app/(app)/libraries/actions.ts#createLibraryAction": LIBRARY_EDITORS,
  "app/(app)/libraries/actions.ts#startLibraryDraftAction": LIBRARY_EDITORS,
  "app/(app)/libraries/actions.ts#saveLibraryDraftAction": LIBRARY_EDITORS,
  "app/(app)/libraries/actions.ts#submitLibraryDraftAction": LIBRARY_EDITORS,
  "app/(app)/libraries/actions.ts#discardLibraryDraftAction": LIBRARY_EDITORS,
  "app/(app)/libraries/actions.ts#returnLibraryDraftAction": LIBRARY_EDITORS,
  "app/(app)/libraries/actions.ts#approveAndPublishLibraryAction": LIBRARY_EDITORS,
  "app/(app)/libraries/actions.ts#withdrawLibraryVersionAction": LIBRARY_EDITORS,
  "app/(app)/libraries/actions.ts#withdrawLibraryEntryAction": LIBRARY_EDITORS,
  // After a withdrawal: a lead starts the batch re-run; a lead, or the responsible engineer of the calc's job (the
  // fixture checks that a caller who is neither is told who may), signs an affected calc revision's outcome.
  "app/(app)/withdrawals/actions.ts#declareSuccessorAction": LEADS_ONLY,
  "app/(app)/withdrawals/actions.ts#startBatchAction": LEADS_ONLY,
  "app/(app)/withdrawals/actions.ts#recordOutcomeAction": RUNNERS,
};

type ManifestEntry = { workers: Record<string, unknown>; filename?: string; exportedName?: string };

const repoRoot = path.resolve(import.meta.dirname, "..", "..");
const manifestFile = path.join(repoRoot, ".next", "server", "server-reference-manifest.json");

/** Every server action in the build (`npm test` builds before it runs vitest), as "<file>#<export>". */
function readBuiltActions(): { key: string; filename: string; exportedName: string }[] {
  if (!fs.existsSync(manifestFile))
    throw new Error(`${manifestFile} is missing: run the tests through \`npm test\`, which builds the app`);
  const manifest = JSON.parse(fs.readFileSync(manifestFile, "utf8")) as Record<"node" | "edge", Record<string, ManifestEntry>>;
  return [...Object.values(manifest.node), ...Object.values(manifest.edge)].map((entry) => {
    if (!entry.filename || !entry.exportedName)
      throw new Error(`a manifest entry without a file or export name: ${JSON.stringify(entry)}`);
    return { key: `${entry.filename}#${entry.exportedName}`, filename: entry.filename, exportedName: entry.exportedName };
  });
}

async function loadAction(key: string): Promise<AnyAction> {
  const [filename, exportedName] = key.split("#");
  const loaded = (await import(/* @vite-ignore */ path.join(repoRoot, filename))) as Record<string, unknown>;
  const action = loaded[exportedName];
  if (typeof action !== "function") throw new Error(`${filename} exports no function ${exportedName}`);
  return action as AnyAction;
}

async function callAction(action: AnyAction, input: unknown): Promise<ActionAnswer> {
  try {
    return { state: await action(null, input) };
  } catch (error) {
    // redirect() after success is Next's way of answering: digest "NEXT_REDIRECT;<type>;<url>;<status>;".
    const digest = String((error as { digest?: unknown }).digest ?? "");
    if (digest.startsWith("NEXT_REDIRECT;")) return { redirect: digest.split(";")[2] };
    throw error;
  }
}

describe("server actions", () => {
  it("covers every server action in the build's manifest, and nothing else", () => {
    const built = readBuiltActions().map((action) => action.key);
    expect(
      built.filter((key) => !(key in ACTIONS)),
      "server actions without a row",
    ).toEqual([]);
    expect(
      Object.keys(ACTIONS).filter((key) => !built.includes(key)),
      "rows for actions that are not in the build",
    ).toEqual([]);
    expect(Object.keys(ACTION_FIXTURES).sort(), "an input for every row").toEqual(Object.keys(ACTIONS).sort());
  });

  for (const [key, row] of Object.entries(ACTIONS)) {
    it.each(EVERYONE)(`${key} as %s`, async (who) => {
      const action = await loadAction(key);
      const { input, succeeded } = await ACTION_FIXTURES[key]();
      request.headers = headersFor[who]!;
      const expected = row[who];
      if (expected === "allowed") {
        await succeeded(await callAction(action, input));
        return;
      }
      const before = await snapshotRows();
      const outcome = await callAction(action, input);
      expect(outcome).toEqual({ state: { ok: false, error: { code: expected, message: DEFAULT_MESSAGES[expected] } } });
      await expectRowsUnchanged(before, { except: refusalWrites(expected, actorFor[who]) });
    });
  }
});

// ---- route handlers ------------------------------------------------------------------------------

const HTTP_METHODS = ["GET", "HEAD", "OPTIONS", "POST", "PUT", "PATCH", "DELETE"] as const;
type Method = (typeof HTTP_METHODS)[number];
type RouteHandler = (request: Request, context: { params: Promise<Record<string, string>> }) => Promise<Response>;

type Cell = { who: Who; actor: Actor | null };
/** The request headers for one cell, and the person whose session they carry when it is not the caller's. */
type CellSession = { headers: Headers; sessionOf?: string };
type RouteRow = {
  route: string;
  method: Method;
  /** The URL asked for: a route with a catch-all segment may have several rows, one per path. */
  path: string;
  expected: Record<Who, Expected>;
  /** The session to send; the matrix session of the caller unless a row needs one of its own. */
  session?: (cell: Cell) => Promise<CellSession>;
  /** What to ask for in this cell, when it needs rows of its own first (made before the snapshot is taken). */
  request?: (cell: Cell) => Promise<CellRequest>;
  /** What an allowed call answers, and the rows it changed. */
  succeeded: (response: Response, cell: Cell & CellSession & CellRequest) => Promise<void>;
};
/** The URL, the route's dynamic segments and the body of one cell's call. */
type CellRequest = {
  path?: string;
  params?: Record<string, string>;
  body?: BodyInit;
  expectBytes?: Uint8Array;
  /** What the check of an allowed call needs to know about the rows made for it (ids). */
  made?: Record<string, string>;
};

/**
 * One row per (route file, exported method). app/api/auth/[...all] is better-auth's own endpoint set
 * (protected by better-auth itself and tested in sign-in.test.ts and password-reset.test.ts); its
 * rows here probe a session read, a sign-out, and the sign-up that must not exist.
 */
const ROUTES: RouteRow[] = [
  {
    route: "app/api/me/route.ts",
    method: "GET",
    path: "/api/me",
    expected: SIGNED_IN,
    succeeded: async (response, { actor }) => {
      expect(response.status).toBe(200);
      expect(await response.json()).toEqual({ id: actor!.id, name: actor!.name, email: actor!.email, role: actor!.role });
    },
  },
  {
    route: "app/api/health/route.ts",
    method: "GET",
    path: "/api/health",
    expected: PUBLIC,
    succeeded: async (response) => {
      expect(response.status).toBe(200);
      expect(await response.json()).toEqual({ status: "ok", checks: { database: "up", queue: "up" } });
    },
  },
  {
    route: "app/api/auth/[...all]/route.ts",
    method: "GET",
    path: "/api/auth/get-session",
    expected: PUBLIC,
    succeeded: async (response, { actor }) => {
      expect(response.status).toBe(200);
      const body = (await response.json()) as { user: { id: string; email: string; role: string } } | null;
      if (actor) expect(body?.user).toMatchObject({ id: actor.id, email: actor.email, role: actor.role });
      else expect(body).toBeNull();
    },
  },
  {
    route: "app/api/auth/[...all]/route.ts",
    method: "POST",
    path: "/api/auth/sign-out",
    expected: PUBLIC,
    // A session of its own for each cell, so signing out leaves the matrix sessions alone.
    session: async ({ actor }) => {
      if (!actor) return { headers: new Headers() };
      const { actor: person, password } = await createTestUser({ role: actor.role });
      const headers = await signInHeaders(person.email, password);
      expect(await sessionCount(person.id)).toBe(1);
      return { headers, sessionOf: person.id };
    },
    succeeded: async (response, { sessionOf }) => {
      expect(response.status).toBe(200);
      expect(await response.json()).toEqual({ success: true });
      expect(response.headers.getSetCookie().join("\n")).toMatch(/better-auth\.session_token=;/);
      if (sessionOf) expect(await sessionCount(sessionOf)).toBe(0); // the session row is gone
    },
  },
  // Hand calculations: a lead attaches one to the standard of their own draft; everyone signed in downloads one.
  {
    route: "app/api/standards/drafts/[draftId]/hand-calculations/route.ts",
    method: "POST",
    path: "/api/standards/drafts/:draftId/hand-calculations",
    expected: LEADS_ONLY,
    request: async ({ actor }) => {
      const author = actor?.role === "lead" ? actor : (await createTestUser({ role: "lead", label: "matrix-author" })).actor;
      const { draftId } = await runUseCase(createStandard, {
        actor: author,
        input: { slug: `matrix-hand-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 6)}`, title: "Matrix beam" },
      });
      const body = new FormData();
      const bytes = matrixPdf();
      body.set("file", new File([bytes], "matrix-check.pdf", { type: "application/pdf" }));
      return { path: `/api/standards/drafts/${draftId}/hand-calculations`, params: { draftId }, body, expectBytes: bytes };
    },
    succeeded: async (response, { params, expectBytes }) => {
      const sha256 = createHash("sha256").update(expectBytes!).digest("hex");
      expect(response.status).toBe(200);
      expect(await response.json()).toMatchObject({
        data: { sha256, fileName: "matrix-check.pdf", contentType: "application/pdf", bytes: expectBytes!.length, added: true },
      });
      const draft = (await getDraft(params!.draftId))!;
      expect((await listAttachments(draft.standardId)).map((a) => a.sha256)).toEqual([sha256]);
      expect((await getObject({ key: handCalculationKey(sha256) }))?.body).toEqual(expectBytes);
    },
  },
  {
    route: "app/api/standards/hand-calculations/[sha256]/route.ts",
    method: "GET",
    path: "/api/standards/hand-calculations/:sha256",
    expected: LIBRARY_READERS,
    request: async () => {
      const { actor: author } = await createTestUser({ role: "lead", label: "matrix-author" });
      const { draftId } = await runUseCase(createStandard, {
        actor: author,
        input: { slug: `matrix-hand-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 6)}`, title: "Matrix beam" },
      });
      const bytes = matrixPdf();
      const file = new File([bytes], "matrix-check.pdf", { type: "application/pdf" });
      const { sha256 } = await runUseCase(attachHandCalculation, { actor: author, input: { draftId, file } });
      return { path: `/api/standards/hand-calculations/${sha256}`, params: { sha256 }, expectBytes: bytes };
    },
    succeeded: async (response, { expectBytes }) => {
      expect(response.status).toBe(200);
      expect(response.headers.get("content-type")).toBe("application/pdf");
      expect(response.headers.get("content-disposition")).toMatch(/^attachment; filename="matrix-check\.pdf"/);
      expect(new Uint8Array(await response.arrayBuffer())).toEqual(expectBytes);
    },
  },
  // The verifiable log: anyone in the firm reads the signed heads and asks for a proof; what they get verifies.
  {
    route: "app/api/log/heads/route.ts",
    method: "GET",
    path: "/api/log/heads",
    expected: SIGNED_IN,
    request: async () => {
      await sealedInLog("audit-event", await matrixAuditEvent());
      return {};
    },
    succeeded: async (response) => {
      expect(response.status).toBe(200);
      expect(response.headers.get("content-type")).toBe("application/x-ndjson; charset=utf-8");
      const heads = (await response.text())
        .trim()
        .split("\n")
        .map((line) => JSON.parse(line) as { size: number; rootHash: string; sealedAt: string; signature: string });
      const { pem } = logPublicKeyFromSettings();
      expect(heads.length).toBeGreaterThan(0);
      for (const [i, head] of heads.entries()) {
        expect(verifyTreeHead(head, head.signature, pem)).toBe(true);
        if (i > 0) expect(head.size).toBeGreaterThan(heads[i - 1].size);
      }
    },
  },
  {
    route: "app/api/log/inclusion/route.ts",
    method: "GET",
    path: "/api/log/inclusion",
    expected: SIGNED_IN,
    request: async () => {
      const ref = await matrixAuditEvent();
      await sealedInLog("audit-event", ref);
      return { path: `/api/log/inclusion?kind=audit-event&ref=${ref}`, params: { ref } };
    },
    succeeded: async (response, { params }) => {
      expect(response.status).toBe(200);
      const { data } = (await response.json()) as {
        data: {
          sealed: true;
          leaf: { ref: string; entry: string; leafIndex: number };
          head: { size: number; rootHash: string };
          proof: string[];
        };
      };
      expect(data.leaf.ref).toBe(params!.ref);
      const leaf = leafHash(new TextEncoder().encode(data.leaf.entry));
      const proof = data.proof.map((hex) => hashFromHex(hex));
      expect(verifyInclusion(data.leaf.leafIndex, data.head.size, leaf, proof, hashFromHex(data.head.rootHash))).toBe(true);
    },
  },
  {
    route: "app/api/log/consistency/route.ts",
    method: "GET",
    path: "/api/log/consistency",
    expected: SIGNED_IN,
    request: async () => {
      const older = await sealedInLog("audit-event", await matrixAuditEvent());
      const newer = await sealedInLog("audit-event", await matrixAuditEvent());
      return { path: `/api/log/consistency?from=${older}&to=${newer}` };
    },
    succeeded: async (response) => {
      expect(response.status).toBe(200);
      const { data } = (await response.json()) as {
        data: { from: { size: number; rootHash: string }; to: { size: number; rootHash: string }; proof: string[] };
      };
      const proof = data.proof.map((hex) => hashFromHex(hex));
      const [from, to] = [hashFromHex(data.from.rootHash), hashFromHex(data.to.rootHash)];
      expect(data.to.size).toBeGreaterThan(data.from.size);
      expect(verifyConsistency(data.from.size, data.to.size, from, to, proof)).toBe(true);
    },
  },
  // Runs: engineers and leads run; everyone but admins (whose work is people) reads them.
  {
    route: "app/api/runs/route.ts",
    method: "POST",
    path: "/api/runs",
    expected: RUNNERS,
    request: async () => {
      const { jobId } = await matrixJob();
      const versionId = await seededVersionId();
      return { made: { jobId }, body: JSON.stringify({ jobId, versionId, inputs: { L: "6.5 m" } }) };
    },
    succeeded: async (response, { made }) => {
      expect(response.status).toBe(201);
      const body = (await response.json()) as { data: { id: string; outcome: string; pass: boolean; sha256: string } };
      const rows = await db.select().from(schema.runs).where(eq(schema.runs.jobId, made!.jobId));
      expect(rows.map((r) => r.id)).toEqual([body.data.id]);
      expect(body.data).toMatchObject({ outcome: "succeeded", pass: true, sha256: rows[0].recordSha256 });
      expect(response.headers.get("location")).toBe(`/api/runs/${body.data.id}`);
    },
  },
  {
    route: "app/api/runs/route.ts",
    method: "GET",
    path: "/api/runs",
    expected: LIBRARY_READERS,
    request: async () => {
      const { jobNumber, run } = await matrixRun();
      return { path: `/api/runs?job=${jobNumber}`, made: { id: run.id } };
    },
    succeeded: async (response, { made }) => {
      expect(response.status).toBe(200);
      const body = (await response.json()) as { data: { runs: { id: string }[]; nextCursor: string | null } };
      expect(body.data.runs.map((r) => r.id)).toEqual([made!.id]);
      expect(body.data.nextCursor).toBeNull();
    },
  },
  {
    route: "app/api/runs/[id]/route.ts",
    method: "GET",
    path: "/api/runs/:id",
    expected: LIBRARY_READERS,
    request: async () => {
      const { run } = await matrixRun();
      return { path: `/api/runs/${run.id}`, params: { id: run.id } };
    },
    succeeded: async (response, { params }) => {
      expect(response.status).toBe(200);
      const body = (await response.json()) as { data: { id: string; recordSha256: string; record: { id: string } } };
      const [row] = await db.select().from(schema.runs).where(eq(schema.runs.id, params!.id));
      expect(body.data).toMatchObject({ id: row.id, recordSha256: row.recordSha256, record: { id: row.id } });
    },
  },
  // The run log as CSV: the auditor's alone ("export evidence"); the export is recorded in the audit trail.
  {
    route: "app/api/runs/export/route.ts",
    method: "GET",
    path: "/api/runs/export",
    expected: AUDITOR_ONLY,
    request: async () => {
      const { jobNumber, run } = await matrixRun();
      return { path: `/api/runs/export?job=${jobNumber}`, made: { id: run.id, jobNumber } };
    },
    succeeded: async (response, { made, actor }) => {
      expect(response.status).toBe(200);
      const rows = parseCsv(await response.text());
      expect(rows[0].slice(0, 3)).toEqual(["run_id", "created_at", "job_number"]);
      expect(rows.slice(1).map((row) => row[0])).toEqual([made!.id]);
      const [event] = await db
        .select()
        .from(schema.auditEvents)
        .where(and(eq(schema.auditEvents.action, "runs.export"), eq(schema.auditEvents.actorId, actor!.id)))
        .orderBy(desc(schema.auditEvents.id))
        .limit(1);
      expect(event.details).toMatchObject({ filters: { job: made!.jobNumber } });
    },
  },
  // A withdrawal's batch re-run progress: whoever reads runs (the impact report polls it).
  {
    route: "app/api/withdrawals/[id]/batch/route.ts",
    method: "GET",
    path: "/api/withdrawals/:id/batch",
    expected: LIBRARY_READERS,
    request: async () => {
      const { withdrawalId } = await matrixWithdrawal();
      return { path: `/api/withdrawals/${withdrawalId}/batch`, params: { id: withdrawalId } };
    },
    succeeded: async (response) => {
      expect(response.status).toBe(200);
      expect(await response.json()).toEqual({ data: { batch: null, deltas: [] } });
    },
  },
  // Calc sheet PDFs: whoever reads runs gets the sheet rendered by the server's Chromium (as them) and kept.
  {
    route: "app/api/runs/[id]/sheet-pdf/route.ts",
    method: "GET",
    path: "/api/runs/:id/sheet-pdf",
    expected: LIBRARY_READERS,
    request: async () => {
      const { run } = await matrixRun();
      return { path: `/api/runs/${run.id}/sheet-pdf`, params: { id: run.id } };
    },
    succeeded: async (response, { params }) => {
      expect(response.status).toBe(200);
      expect(response.headers.get("content-type")).toBe("application/pdf");
      const body = new Uint8Array(await response.arrayBuffer());
      const sha256 = createHash("sha256").update(body).digest("hex");
      expect(Buffer.from(body.subarray(0, 5)).toString("latin1")).toBe("%PDF-");
      expect(response.headers.get("x-content-sha256")).toBe(sha256);
      const kept = await db.select().from(schema.calcSheetPdfs).where(eq(schema.calcSheetPdfs.runId, params!.id));
      expect(kept.map((row) => ({ sha256: row.sha256, bytes: row.bytes }))).toEqual([{ sha256, bytes: body.length }]);
      expect((await getObject({ key: sheetPdfKey(params!.id, sha256) }))?.body).toEqual(body);
    },
  },
  {
    route: "app/api/runs/[id]/sheet-pdfs/[pdfId]/route.ts",
    method: "GET",
    path: "/api/runs/:id/sheet-pdfs/:pdfId",
    expected: LIBRARY_READERS,
    request: async () => {
      const { run, engineer } = await matrixRun();
      const bytes = matrixPdf();
      const sha256 = createHash("sha256").update(bytes).digest("hex");
      await putObject({ key: sheetPdfKey(run.id, sha256), body: bytes, contentType: "application/pdf" });
      const [{ id: pdfId }] = await db
        .insert(schema.calcSheetPdfs)
        .values({ runId: run.id, stateSha256: sha256, sha256, bytes: bytes.length, pages: 1, renderedById: engineer.id })
        .returning({ id: schema.calcSheetPdfs.id });
      return { path: `/api/runs/${run.id}/sheet-pdfs/${pdfId}`, params: { id: run.id, pdfId }, expectBytes: bytes };
    },
    succeeded: async (response, { expectBytes }) => {
      expect(response.status).toBe(200);
      expect(response.headers.get("content-type")).toBe("application/pdf");
      expect(new Uint8Array(await response.arrayBuffer())).toEqual(expectBytes);
    },
  },
  // Attachments: engineers and leads attach files to jobs and runs; whoever reads jobs downloads them.
  {
    route: "app/api/jobs/[jobNumber]/attachments/route.ts",
    method: "POST",
    path: "/api/jobs/:jobNumber/attachments",
    expected: RUNNERS,
    request: async () => {
      const { jobId, jobNumber } = await matrixJob();
      const body = new FormData();
      const bytes = matrixPdf();
      body.set("file", new File([bytes], "site-sketch.pdf", { type: "application/pdf" }));
      body.set("note", "Sketch of the north gable");
      return { path: `/api/jobs/${jobNumber}/attachments`, params: { jobNumber }, body, expectBytes: bytes, made: { jobId } };
    },
    succeeded: async (response, { expectBytes, made }) => {
      const sha256 = createHash("sha256").update(expectBytes!).digest("hex");
      expect(response.status).toBe(200);
      expect(await response.json()).toMatchObject({
        data: { sha256, fileName: "site-sketch.pdf", contentType: "application/pdf", bytes: expectBytes!.length, added: true },
      });
      const rows = await db.select().from(schema.jobAttachments).where(eq(schema.jobAttachments.jobId, made!.jobId));
      expect(rows.map((r) => ({ sha256: r.sha256, runId: r.runId, note: r.note }))).toEqual([
        { sha256, runId: null, note: "Sketch of the north gable" },
      ]);
      expect((await getObject({ key: attachmentKey(made!.jobId, sha256) }))?.body).toEqual(expectBytes);
    },
  },
  {
    route: "app/api/attachments/[attachmentId]/route.ts",
    method: "GET",
    path: "/api/attachments/:attachmentId",
    expected: LIBRARY_READERS,
    request: async () => {
      const { jobNumber, engineer } = await matrixJob();
      const bytes = matrixPdf();
      const file = new File([bytes], "site-photo-notes.pdf", { type: "application/pdf" });
      const { id } = await runUseCase(attachFile, { actor: engineer, input: { jobNumber, file } });
      return { path: `/api/attachments/${id}`, params: { attachmentId: id }, expectBytes: bytes };
    },
    succeeded: async (response, { expectBytes }) => {
      expect(response.status).toBe(200);
      expect(response.headers.get("content-type")).toBe("application/pdf");
      expect(response.headers.get("x-content-sha256")).toBe(createHash("sha256").update(expectBytes!).digest("hex"));
      expect(new Uint8Array(await response.arrayBuffer())).toEqual(expectBytes);
    },
  },
];

/** A small PDF, different each call (so each cell stores its own file). */
function matrixPdf(): Uint8Array<ArrayBuffer> {
  return new TextEncoder().encode(`%PDF-1.4\n% hand calculation for the access matrix ${Date.now()} ${Math.random()}\n%%EOF\n`);
}

// Every route file; the methods each exports are the ones Next serves.
const routeModules = import.meta.glob<Record<string, unknown>>("/app/**/route.ts");

async function exportedMethods(): Promise<string[]> {
  const found: string[] = [];
  for (const [file, load] of Object.entries(routeModules)) {
    for (const [name, value] of Object.entries(await load())) {
      if ((HTTP_METHODS as readonly string[]).includes(name) && typeof value === "function")
        found.push(`${file.slice(1)}#${name}`);
    }
  }
  return found.sort();
}

async function loadHandler(row: RouteRow): Promise<RouteHandler> {
  const load = routeModules[`/${row.route}`];
  if (!load) throw new Error(`no route file ${row.route}`);
  return (await load())[row.method] as RouteHandler;
}

function makeRequest(row: RouteRow, headers: Headers, asked: CellRequest = {}): Request {
  const withOrigin = new Headers(headers);
  withOrigin.set("origin", new URL(process.env.BETTER_AUTH_URL ?? "http://127.0.0.1:3000").origin);
  return new Request(`${process.env.BETTER_AUTH_URL ?? "http://127.0.0.1:3000"}${asked.path ?? row.path}`, {
    method: row.method,
    headers: withOrigin,
    ...(asked.body !== undefined ? { body: asked.body } : {}),
  });
}

describe("route handlers", () => {
  it("covers every HTTP method every route file exports", async () => {
    const exported = await exportedMethods();
    const covered = [...new Set(ROUTES.map((row) => `${row.route}#${row.method}`))].sort();
    expect(
      exported.filter((key) => !covered.includes(key)),
      "exported methods without a row",
    ).toEqual([]);
    expect(
      covered.filter((key) => !exported.includes(key)),
      "rows for methods no route exports",
    ).toEqual([]);
  });

  for (const row of ROUTES) {
    it.each(EVERYONE)(`${row.method} ${row.path} as %s`, async (who) => {
      const handler = await loadHandler(row);
      const cell = { who, actor: actorFor[who]! };
      const session = row.session ? await row.session(cell) : { headers: headersFor[who]! };
      const { headers } = session;
      const asked = row.request ? await row.request(cell) : {};
      const params = { params: Promise.resolve(asked.params ?? {}) };
      const expected = row.expected[who];
      if (expected === "allowed") {
        await row.succeeded(await handler(makeRequest(row, headers, asked), params), { ...cell, ...session, ...asked });
        return;
      }
      const before = await snapshotRows();
      const response = await handler(makeRequest(row, headers, asked), params);
      expect(response.status).toBe(expected === "unauthenticated" ? 401 : 403);
      expect(await response.json()).toEqual({ error: { code: expected, message: DEFAULT_MESSAGES[expected] } });
      await expectRowsUnchanged(before, { except: refusalWrites(expected, cell.actor) });
    });
  }
});
