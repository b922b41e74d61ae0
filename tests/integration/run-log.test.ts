// The run log and its CSV export, through the route handlers and the real database: the CSV holds exactly the rows
// the data layer returns for the same filters and order (parsed back, field by field, with RFC 4180 quoting and the
// apostrophe before a text that would read as a formula), also when it streams in many small batches; every order
// pages by its cursor with no row lost or repeated; a filter that cannot be read is refused with 400 and a message,
// and nothing is exported; an export writes its audit event and nothing else.
import { and, desc, eq } from "drizzle-orm";
import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { db } from "@/db";
import * as schema from "@/db/schema";
import type { Actor } from "@/lib/domain/actor";
import { parseCsv } from "@/lib/domain/csv";
import { runListQuerySchema, type RunListQuery } from "@/lib/domain/schemas/run-log";
import { listRuns, type RunListRowDto } from "@/lib/data/run-list";
import { runUseCase } from "@/lib/use-cases/run";
import { createJob } from "@/lib/use-cases/jobs";
import { createRun } from "@/lib/use-cases/runs";
import { approveRevision, checkRevision, createCalc, prepareRevision } from "@/lib/use-cases/calcs";
import { exportRunLog, runFilterOf } from "@/lib/use-cases/run-log";
import { runLogCsvStream } from "@/lib/use-cases/run-log-export";
import { GET as exportRoute } from "@/app/api/runs/export/route";
import { GET as listRoute } from "@/app/api/runs/route";
import { expectRowsUnchanged, snapshotRows } from "../support/snapshot";
import { createTestUser, signInHeaders } from "./helpers/people";
import { seededVersionId } from "./helpers/action-fixtures";

const request = vi.hoisted(() => ({ headers: new Headers() }));
vi.mock("next/headers", () => ({
  headers: async () => request.headers,
  cookies: async () => ({ get: () => undefined, getAll: () => [], set: () => undefined }),
}));
afterEach(() => {
  request.headers = new Headers();
});

const HEADER = [
  "run_id",
  "created_at",
  "job_number",
  "job_name",
  "standard",
  "standard_title",
  "version",
  "content_hash",
  "person_id",
  "person",
  "outcome",
  "pass",
  "max_utilisation",
  "purpose",
  "record_sha256",
  "sign_off",
];

/** A run as the CSV must write it, worked out here rather than by the export's own column table. */
function expectedFields(run: RunListRowDto): string[] {
  // Common practice against formula injection: a text cell starting with = + - @ gets a leading apostrophe.
  const text = (value: string) => (/^[=+\-@\t\r]/.test(value) ? `'${value}` : value);
  return [
    run.id,
    run.createdAt,
    text(run.jobNumber),
    text(run.jobName),
    run.slug,
    text(run.title),
    String(run.number),
    run.contentHash,
    run.createdById,
    text(run.createdByName),
    run.outcome,
    run.pass === null ? "" : String(run.pass),
    run.maxUtilisation === null ? "" : String(run.maxUtilisation),
    run.purpose,
    run.recordSha256,
    run.signOff,
  ];
}

let auditor: { actor: Actor; headers: Headers };
let engineer: { actor: Actor; headers: Headers };
let other: Actor;
let lead: Actor;
let jobA: string;
let jobB: string;
/** A job name a spreadsheet would run as a formula, with a comma and quotes to escape. */
const FORMULA_NAME = '=HYPERLINK("http://example.invalid","open"), then "more"';

async function signedIn(role: "auditor" | "engineer") {
  const { actor, password } = await createTestUser({ role, label: `run-log-${role}` });
  const headers = await signInHeaders(actor.email, password);
  headers.set("x-gusset-client-address", "127.0.0.1");
  return { actor, headers };
}

beforeAll(async () => {
  auditor = await signedIn("auditor");
  engineer = await signedIn("engineer");
  other = (await createTestUser({ role: "engineer", label: "run-log-other" })).actor;
  lead = (await createTestUser({ role: "lead", label: "run-log-lead" })).actor;
  const stamp = Date.now().toString(36).toUpperCase();
  jobA = `RL-${stamp}-A`;
  jobB = `RL-${stamp}-B`;
  const a = await runUseCase(createJob, {
    actor: engineer.actor,
    input: { jobNumber: jobA, name: FORMULA_NAME, responsibleEngineerId: lead.id },
  });
  const b = await runUseCase(createJob, {
    actor: other,
    input: { jobNumber: jobB, name: "Weir Street canopy", responsibleEngineerId: lead.id },
  });
  const versionId = await seededVersionId();
  // Spans from short to long: the longest beams fail their checks (the utilisations come from the standard).
  const spans = ["3 m", "4.5 m", "6 m", "9 m", "12 m", "16 m", "20 m"];
  const made: string[] = [];
  for (const L of spans)
    made.push((await runUseCase(createRun, { actor: engineer.actor, input: { jobId: a.jobId, versionId, inputs: { L } } })).id);
  for (const L of ["5 m", "18 m", "7 m"])
    await runUseCase(createRun, { actor: other, input: { jobId: b.jobId, versionId, inputs: { L } } });
  // Sign-off to each step: the first run prepared, the second checked, the third approved.
  const revisionOf = async (runId: string, number: string) => {
    const { calcId } = await runUseCase(createCalc, {
      actor: engineer.actor,
      input: { jobId: a.jobId, number, title: `Beam ${number}` },
    });
    return (
      await runUseCase(prepareRevision, {
        actor: engineer.actor,
        input: { calcId, runId, checkerId: lead.id, issueStatus: "for-approval" },
      })
    ).revisionId;
  };
  await revisionOf(made[0], "C-001");
  const checked = await revisionOf(made[1], "C-002");
  await runUseCase(checkRevision, { actor: lead, input: { revisionId: checked, decision: "approve" } });
  const approved = await revisionOf(made[2], "C-003");
  await runUseCase(checkRevision, { actor: lead, input: { revisionId: approved, decision: "approve" } });
  await runUseCase(approveRevision, { actor: lead, input: { revisionId: approved } });
}, 120_000);

const ask = (route: typeof exportRoute, path: string, headers: Headers) =>
  route(new Request(`http://127.0.0.1:3000${path}`, { headers }), { params: Promise.resolve({}) });

/** What the data layer returns for a query, every row. */
async function dataLayerRows(query: Partial<RunListQuery>): Promise<RunListRowDto[]> {
  return listRuns({ ...runFilterOf(runListQuerySchema.parse(query)), limit: 100_000 });
}

describe("the CSV export", () => {
  const filters = (): [string, Partial<RunListQuery>][] => [
    ["one job", { job: jobA }],
    ["one job, a check fails", { job: jobA, pass: "false" }],
    ["one job, every check passes, largest utilisation first", { job: jobA, pass: "true", sort: "utilisation" }],
    ["a person, oldest first", { person: other.id, dir: "asc" }],
    ["one job, signed off to approved", { job: jobA, signOff: "approved" }],
    ["one job, prepared", { job: jobA, signOff: "prepared" }],
    ["one job, not issued, by job number", { job: jobA, signOff: "not-issued", sort: "job", dir: "desc" }],
    [
      "a standard and version, today, analysed",
      { person: engineer.actor.id, standard: "fixed-end-beam", outcome: "succeeded", from: today(), to: today() },
    ],
  ];

  it("holds exactly the rows the data layer returns for the same filters and order", async () => {
    const counts: Record<string, number> = {};
    for (const [name, query] of filters()) {
      const search = new URLSearchParams(Object.entries(query).map(([k, v]) => [k, String(v)]));
      const response = await ask(exportRoute, `/api/runs/export?${search}`, auditor.headers);
      expect(response.status, name).toBe(200);
      expect(response.headers.get("content-type")).toBe("text/csv; charset=utf-8; header=present");
      expect(response.headers.get("content-disposition")).toMatch(
        /^attachment; filename="gusset-run-log-\d{8}T\d{6}Z\.csv"; filename\*=UTF-8''gusset-run-log-\d{8}T\d{6}Z\.csv$/,
      );
      const text = await response.text();
      expect(text.endsWith("\r\n"), name).toBe(true);
      const [header, ...records] = parseCsv(text);
      expect(header).toEqual(HEADER);
      expect(records, name).toEqual((await dataLayerRows(query)).map(expectedFields));
      counts[name] = records.length;
    }
    // The filters are not empty, nor all the same: each kept what it names.
    expect(counts).toMatchObject({
      "one job": 7,
      "one job, signed off to approved": 1,
      "one job, prepared": 1,
      "one job, not issued, by job number": 4,
      "a person, oldest first": 3,
    });
    expect(counts["one job, a check fails"]).toBeGreaterThan(0);
    expect(counts["one job, a check fails"] + counts["one job, every check passes, largest utilisation first"]).toBe(7);
  });

  it("quotes and neutralises text as RFC 4180 and common practice ask", async () => {
    const response = await ask(exportRoute, `/api/runs/export?job=${jobA}`, auditor.headers);
    const text = await response.text();
    // The name arrives as text: an apostrophe first, quoted for its comma, its quotes doubled.
    expect(text).toContain(`,"'=HYPERLINK(""http://example.invalid"",""open""), then ""more""",`);
    expect(parseCsv(text)[1][3]).toBe(`'${FORMULA_NAME}`);
  });

  it("streams in batches, each read after the last, and still holds exactly the filtered rows", async () => {
    const started = await runUseCase(exportRunLog, { actor: auditor.actor, input: { job: jobA, sort: "utilisation" } });
    // The first batch is the use case's; three rows a batch after it.
    const stream = runLogCsvStream({ ...started, first: started.first.slice(0, 3) }, 3);
    const chunks: string[] = [];
    const reader = stream.getReader();
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      chunks.push(new TextDecoder().decode(value));
    }
    expect(chunks.length).toBe(1 + 3); // the header, then batches of 3, 3 and 1
    const [, ...records] = parseCsv(chunks.join(""));
    expect(records).toEqual((await dataLayerRows({ job: jobA, sort: "utilisation" })).map(expectedFields));
  });

  it("writes its audit event with the filters, and changes nothing else", async () => {
    const before = await snapshotRows();
    const response = await ask(exportRoute, `/api/runs/export?job=${jobA}&pass=false&sort=job`, auditor.headers);
    expect(response.status).toBe(200);
    await response.text();
    await expectRowsUnchanged(before, {
      except: [
        {
          table: "audit_events",
          change: "added",
          why: "the export is recorded with its filters",
          where: (row) => row.action === "runs.export" && row.actor_id === auditor.actor.id,
        },
      ],
    });
    const [event] = await db
      .select()
      .from(schema.auditEvents)
      .where(and(eq(schema.auditEvents.action, "runs.export"), eq(schema.auditEvents.actorId, auditor.actor.id)))
      .orderBy(desc(schema.auditEvents.id))
      .limit(1);
    expect(event.details).toEqual({ filters: { job: jobA, pass: "false", sort: "job" }, asOf: expect.any(String) });
  });
});

describe("paging by cursor", () => {
  for (const [name, query] of [
    ["newest first", {}],
    ["oldest first", { dir: "asc" }],
    ["largest utilisation first", { sort: "utilisation" }],
    ["smallest utilisation first", { sort: "utilisation", dir: "asc" }],
    ["by job number", { sort: "job" }],
    ["by job number, Z to A", { sort: "job", dir: "desc" }],
  ] as const) {
    it(`${name}: two at a time, every row once, in order`, async () => {
      const filter = { ...query, standard: "fixed-end-beam", from: today(), to: today() };
      const search = (cursor: string | null) =>
        new URLSearchParams([...Object.entries(filter), ["limit", "2"], ...(cursor ? [["cursor", cursor]] : [])]);
      const seen: string[] = [];
      let cursor: string | null = null;
      for (let page = 0; page < 100; page++) {
        const response = await ask(listRoute, `/api/runs?${search(cursor)}`, engineer.headers);
        expect(response.status).toBe(200);
        const { data } = (await response.json()) as { data: { runs: { id: string }[]; nextCursor: string | null } };
        seen.push(...data.runs.map((r) => r.id));
        cursor = data.nextCursor;
        if (!cursor) break;
      }
      const all = (await dataLayerRows(filter)).map((r) => r.id);
      expect(all.length).toBeGreaterThanOrEqual(10);
      expect(seen).toEqual(all);
    });
  }

  it("still reads the cursor GET /api/runs has always given", async () => {
    const response = await ask(listRoute, `/api/runs?job=${jobA}&limit=3`, engineer.headers);
    const { data } = (await response.json()) as { data: { runs: { id: string; createdAt: string }[]; nextCursor: string } };
    const last = data.runs.at(-1)!;
    expect(data.nextCursor).toBe(`${last.createdAt}_${last.id}`);
  });
});

describe("filters that cannot be read", () => {
  const refused: [string, string, RegExp][] = [
    ["a day that does not exist", "from=2026-02-30", /^from: That date does not exist\./],
    ["a date in another form", "to=03/12/2026", /^to: Enter a date as YYYY-MM-DD\./],
    ["the last day before the first", "from=2026-03-02&to=2026-03-01", /^to: The last day is before the first day\./],
    ["an unknown status", "outcome=done", /^outcome: Filter by succeeded or failed\./],
    ["an unknown pass", "pass=maybe", /^pass: Filter by pass \(true\) or fail \(false\)\./],
    ["an unknown sign-off", "signOff=signed", /^signOff: Filter by not-issued, prepared, checked or approved\./],
    ["an unknown order", "sort=size", /^sort: Sort by date, utilisation or job\./],
    [
      "a cursor Gusset did not give",
      "cursor=2026-01-01_not-an-id",
      /^cursor: That page cursor is not one Gusset gave for this order\./,
    ],
    [
      "a date cursor for the utilisation order",
      "sort=utilisation&cursor=2026-01-01T00:00:00.000Z_00000000-0000-4000-8000-000000000000",
      /^cursor: /,
    ],
    ["a version that is not a number", "version=two", /^version: A version is a whole number from 1\./],
  ];
  for (const [name, search, message] of refused) {
    it(`${name}: 400 with what is wrong, from the list and the export alike, and nothing exported`, async () => {
      for (const [route, path, headers] of [
        [listRoute, "/api/runs", engineer.headers],
        [exportRoute, "/api/runs/export", auditor.headers],
      ] as const) {
        const before = await snapshotRows();
        const response = await ask(route, `${path}?${search}`, headers);
        expect(response.status, path).toBe(400);
        const body = (await response.json()) as {
          error: { code: string; message: string; fieldErrors: Record<string, string[]> };
        };
        expect(body.error.code).toBe("bad-request");
        expect(body.error.message).toMatch(message);
        await expectRowsUnchanged(before);
      }
    });
  }
});

function today(): string {
  return new Date().toISOString().slice(0, 10);
}
