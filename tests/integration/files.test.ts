// Attachments and calc sheet PDFs through the real route handlers, database and fake S3: a file attached to a job
// or a run downloads as the same bytes with the same sha256; every bad upload (empty, renamed, disallowed type,
// too large, a body cut off on the way, a run of another job) is a 4xx naming the problem with nothing stored;
// the calc sheet PDF is kept once per state of the sheet and served again without opening Chromium while nothing the
// sheet shows has changed (its key, read from the database), and a new seal, a sign-off or a withdrawal of the run's
// version (a banner on the sheet) gives a new one while the old is kept; the tables are append-only for the app's role.
import { createHash, randomBytes } from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { db, pool } from "@/db";
import * as schema from "@/db/schema";
import type { Actor } from "@/lib/domain/actor";
import { runUseCase } from "@/lib/use-cases/run";
import { countPdfPages, sheetsOpened } from "@/lib/pdf/sheet-renderer";
import { SEALER_LOCK } from "@/lib/data/log";
import { forgetServerEnv } from "@/lib/server-env";
import { pdfPages } from "../support/pdf";
import { attachmentKey } from "@/lib/data/files";
import { getObject } from "@/lib/storage/s3";
import { POST as attachRoute } from "@/app/api/jobs/[jobNumber]/attachments/route";
import { GET as downloadRoute } from "@/app/api/attachments/[attachmentId]/route";
import { sealedInLog } from "./helpers/log";
import { GET as sheetPdfRoute } from "@/app/api/runs/[id]/sheet-pdf/route";
import { GET as keptPdfRoute } from "@/app/api/runs/[id]/sheet-pdfs/[pdfId]/route";
import { approveAndPublish, createStandard, saveDraft, submitDraft, withdrawVersion } from "@/lib/use-cases/standards";
import { getStandardBySlug, getVersion, listVersionsOf } from "@/lib/data/standards";
import { createRun } from "@/lib/use-cases/runs";
import { createCalc, prepareRevision } from "@/lib/use-cases/calcs";
import { refusalWrites, snapshotRows, expectRowsUnchanged } from "../support/snapshot";
import { matrixJob, matrixRun } from "./helpers/action-fixtures";
import { createTestUser, signInHeaders } from "./helpers/people";

const base = process.env.BETTER_AUTH_URL ?? "http://127.0.0.1:3000";
const sha256 = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");
const params = (values: Record<string, string>) => ({ params: Promise.resolve(values) });

let engineer: Actor;
let engineerHeaders: Headers;
let auditorHeaders: Headers;
let auditor: Actor;
let job: Awaited<ReturnType<typeof matrixJob>>;

beforeAll(async () => {
  const made = await createTestUser({ role: "engineer", label: "files-engineer" });
  engineer = made.actor;
  engineerHeaders = await signInHeaders(made.actor.email, made.password);
  const madeAuditor = await createTestUser({ role: "auditor", label: "files-auditor" });
  auditor = madeAuditor.actor;
  auditorHeaders = await signInHeaders(madeAuditor.actor.email, madeAuditor.password);
  job = await matrixJob();
});

function withOrigin(headers: Headers): Headers {
  const copy = new Headers(headers);
  copy.set("origin", new URL(base).origin);
  return copy;
}

function upload(fields: Record<string, string | File>, headers = engineerHeaders, jobNumber = job.jobNumber) {
  const body = new FormData();
  for (const [key, value] of Object.entries(fields)) body.set(key, value);
  const request = new Request(`${base}/api/jobs/${jobNumber}/attachments`, {
    method: "POST",
    headers: withOrigin(headers),
    body,
  });
  return attachRoute(request, params({ jobNumber }));
}

function download(attachmentId: string, headers = auditorHeaders) {
  return downloadRoute(new Request(`${base}/api/attachments/${attachmentId}`, { headers }), params({ attachmentId }));
}

/** A PNG's first bytes followed by noise: a real PNG as far as the signature goes, different each call. */
const png = () => new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, ...randomBytes(4096)]);

describe("attachments", () => {
  it("keeps a photo on a job and a PDF on a run; each downloads as the same bytes with its sha256", async () => {
    const photo = png();
    const answer = await upload({
      file: new File([photo], "north gable.png", { type: "image/png" }),
      note: "Site photo, north gable",
    });
    expect(answer.status).toBe(200);
    const { data } = (await answer.json()) as { data: { id: string; sha256: string; added: boolean; runId: string | null } };
    expect(data).toMatchObject({ sha256: sha256(photo), added: true, runId: null });

    const got = await download(data.id);
    expect(got.status).toBe(200);
    expect(got.headers.get("x-content-sha256")).toBe(sha256(photo));
    expect(got.headers.get("content-type")).toBe("image/png");
    expect(got.headers.get("x-content-type-options")).toBe("nosniff");
    expect(got.headers.get("content-disposition")).toBe(
      `attachment; filename="north gable.png"; filename*=UTF-8''north%20gable.png`,
    );
    const back = new Uint8Array(await got.arrayBuffer());
    expect(sha256(back)).toBe(sha256(photo));
    expect(Buffer.from(back).equals(Buffer.from(photo))).toBe(true);

    // The same bytes again at the same place are kept once; on one of the job's runs they are a new attachment.
    const again = (await (await upload({ file: new File([photo], "copy.png", { type: "image/png" }) })).json()) as {
      data: { id: string; added: boolean };
    };
    expect(again.data).toMatchObject({ id: data.id, added: false });
    const { run, jobId: runJobId, jobNumber: runJobNumber } = await matrixRun();
    const pdf = new TextEncoder().encode(`%PDF-1.7\n% site instruction ${randomBytes(8).toString("hex")}\n%%EOF\n`);
    const onRun = await upload(
      { file: new File([pdf], "SI-004.pdf", { type: "application/pdf" }), runId: run.id },
      engineerHeaders,
      runJobNumber,
    );
    expect(onRun.status).toBe(200);
    const onRunData = ((await onRun.json()) as { data: { id: string; runId: string } }).data;
    expect(onRunData.runId).toBe(run.id);
    const rows = await db.select().from(schema.jobAttachments).where(eq(schema.jobAttachments.runId, run.id));
    expect(rows.map((r) => ({ sha256: r.sha256, fileName: r.fileName, bytes: r.bytes }))).toEqual([
      { sha256: sha256(pdf), fileName: "SI-004.pdf", bytes: pdf.length },
    ]);
    expect(Buffer.from((await getObject({ key: attachmentKey(runJobId, sha256(pdf)) }))!.body).equals(Buffer.from(pdf))).toBe(
      true,
    );
  });

  it.each([
    ["an empty file", () => new File([], "empty.pdf", { type: "application/pdf" }), "That file is empty."],
    [
      "a text file renamed .pdf",
      () => new File(["span 6 m, load 12 kN/m"], "notes.pdf", { type: "application/pdf" }),
      "The file's contents do not match its type; export it again as PDF, PNG, JPEG or WebP.",
    ],
    [
      "a type a job does not take",
      () => new File(["<svg/>"], "sketch.svg", { type: "image/svg+xml" }),
      "A job takes PDF, PNG, JPEG or WebP files: sketches, site photos, scanned or exported documents.",
    ],
  ])("refuses %s with a message beside the file field, storing nothing", async (_name, file, message) => {
    const before = await snapshotRows();
    const answer = await upload({ file: file() });
    expect(answer.status).toBe(422);
    expect(await answer.json()).toMatchObject({ error: { code: "invalid-input", fieldErrors: { file: [message] } } });
    await expectRowsUnchanged(before);
  });

  it("refuses a body announced as over 20 MB before reading it, and a body cut off on the way", async () => {
    const before = await snapshotRows();
    const headers = withOrigin(engineerHeaders);
    headers.set("content-length", String(21 * 1024 * 1024));
    headers.set("content-type", "multipart/form-data; boundary=x");
    const tooLarge = await attachRoute(
      new Request(`${base}/api/jobs/${job.jobNumber}/attachments`, { method: "POST", headers, body: "--x--" }),
      params({ jobNumber: job.jobNumber }),
    );
    expect(tooLarge.status).toBe(422);
    expect(await tooLarge.json()).toMatchObject({
      error: { fieldErrors: { file: ["That file is over 20 MB; scan or export it at a lower resolution, or split it."] } },
    });

    // A multipart body whose connection drops after the first part's headers: the form never arrives whole.
    const cut = new ReadableStream<Uint8Array>({
      start(controller) {
        controller.enqueue(
          new TextEncoder().encode(
            '--x\r\nContent-Disposition: form-data; name="file"; filename="a.png"\r\nContent-Type: image/png\r\n\r\n',
          ),
        );
        controller.enqueue(png());
        controller.error(new Error("connection reset"));
      },
    });
    const cutHeaders = withOrigin(engineerHeaders);
    cutHeaders.set("content-type", "multipart/form-data; boundary=x");
    const halfway = await attachRoute(
      new Request(`${base}/api/jobs/${job.jobNumber}/attachments`, {
        method: "POST",
        headers: cutHeaders,
        body: cut,
        duplex: "half",
      } as RequestInit),
      params({ jobNumber: job.jobNumber }),
    );
    expect(halfway.status).toBe(400);
    expect(await halfway.json()).toEqual({
      error: { code: "bad-request", message: "The form did not arrive whole; nothing was stored. Send it again." },
    });
    await expectRowsUnchanged(before);
  });

  it("refuses a run of another job and a job that does not exist, and an auditor, storing nothing", async () => {
    const { run } = await matrixRun();
    const before = await snapshotRows();
    const file = () => new File([png()], "photo.png", { type: "image/png" });
    const elsewhere = await upload({ file: file(), runId: run.id });
    expect(elsewhere.status).toBe(404);
    expect(await elsewhere.json()).toMatchObject({
      error: { fieldErrors: { runId: [`That run is not in job ${job.jobNumber}.`] } },
    });
    const noJob = await upload({ file: file() }, engineerHeaders, "NO-SUCH-JOB");
    expect([noJob.status, ((await noJob.json()) as { error: { message: string } }).error.message]).toEqual([
      404,
      "There is no job NO-SUCH-JOB.",
    ]);
    await expectRowsUnchanged(before);
    const beforeAuditor = await snapshotRows();
    expect((await upload({ file: file() }, auditorHeaders)).status).toBe(403);
    await expectRowsUnchanged(beforeAuditor, { except: refusalWrites("forbidden", auditor) });
  });

  it("is append-only for the app's role", async () => {
    const client = await pool.connect();
    try {
      const updates = {
        job_attachments: "set bytes = bytes + 1",
        calc_sheet_pdfs: "set bytes = bytes + 1",
        calc_sheet_pdf_keys: "set kept_at = now()",
      };
      for (const [table, change] of Object.entries(updates)) {
        for (const statement of [`update ${table} ${change}`, `delete from ${table}`]) {
          await client.query("begin");
          await expect(client.query(statement)).rejects.toMatchObject({ code: "42501" });
          await client.query("rollback");
        }
      }
    } finally {
      client.release();
    }
  });
});

describe("calc sheet PDFs", () => {
  let lead: Actor;
  let reviewer: Actor;

  beforeAll(async () => {
    lead = (await createTestUser({ role: "lead", label: "files-lead" })).actor;
    reviewer = (await createTestUser({ role: "lead", label: "files-reviewer" })).actor;
  });

  /** A published version of our own, to withdraw, so the seeded standards stay in use for the other tests. */
  async function ownVersion(): Promise<string> {
    const seeded = (await getStandardBySlug("fixed-end-beam"))!;
    const source = (await getVersion({ id: (await listVersionsOf(seeded.id))[0].id }))!.source;
    const slug = `files-beam-${Date.now().toString(36)}`;
    const { draftId } = await runUseCase(createStandard, {
      actor: lead,
      input: { slug, title: "Fixed-end beam for the PDF test" },
    });
    await runUseCase(saveDraft, { actor: lead, input: { draftId, source } });
    const { reviewId } = await runUseCase(submitDraft, { actor: lead, input: { draftId, changelog: "First." } });
    return (await runUseCase(approveAndPublish, { actor: reviewer, input: { reviewId } })).versionId;
  }

  const newRun = async (versionId: string) =>
    (await runUseCase(createRun, { actor: engineer, input: { jobId: job.jobId, versionId, inputs: {}, unitSystem: "si" } })).id;

  /** The sheet's PDF through the route: its bytes, sha256 and state, and how many times Chromium opened the sheet for it. */
  async function askPdf(runId: string, headers = engineerHeaders) {
    const before = sheetsOpened();
    const answer = await sheetPdfRoute(new Request(`${base}/api/runs/${runId}/sheet-pdf`, { headers }), params({ id: runId }));
    expect(answer.status).toBe(200);
    const bytes = new Uint8Array(await answer.arrayBuffer());
    expect(answer.headers.get("x-content-sha256")).toBe(sha256(bytes));
    return { bytes, sha256: sha256(bytes), state: answer.headers.get("x-sheet-state-sha256"), opened: sheetsOpened() - before };
  }

  /** A kept PDF as its own address serves it, to whoever may read runs. */
  async function keptBytes(runId: string, pdfSha256: string): Promise<Buffer> {
    const [row] = await db
      .select()
      .from(schema.calcSheetPdfs)
      .where(and(eq(schema.calcSheetPdfs.runId, runId), eq(schema.calcSheetPdfs.sha256, pdfSha256)));
    const answer = await keptPdfRoute(
      new Request(`${base}/api/runs/${runId}/sheet-pdfs/${row.id}`, { headers: auditorHeaders }),
      params({ id: runId, pdfId: row.id }),
    );
    expect(answer.status).toBe(200);
    return Buffer.from(await answer.arrayBuffer());
  }

  /** A PDF's text, its pages run together and every run of white space one space. */
  const textOf = (bytes: Uint8Array) => pdfPages(bytes).join(" ").replace(/\s+/g, " ");

  const keysOf = (runId: string) => db.select().from(schema.calcSheetPdfKeys).where(eq(schema.calcSheetPdfKeys.runId, runId));

  it("serves the kept PDF without Chromium while nothing the sheet shows changes; a new seal, a sign-off and a withdrawal banner each give a new PDF, the old ones served byte for byte", async () => {
    const versionId = await ownVersion();
    // The sealer held off (its advisory lock, taken here), so that the first PDF shows the run waiting for its seal.
    const sealer = await pool.connect();
    let runId: string;
    let waiting: Awaited<ReturnType<typeof askPdf>>;
    try {
      await sealer.query("select pg_advisory_lock($1)", [SEALER_LOCK]);
      runId = await newRun(versionId);
      waiting = await askPdf(runId);
      expect(waiting.opened).toBe(1);
      expect(textOf(waiting.bytes)).toContain("waits for the sealer");
      // Nothing changed: the kept PDF, the same bytes, and Chromium not opened.
      expect(await askPdf(runId)).toMatchObject({ opened: 0, sha256: waiting.sha256, state: waiting.state });
    } finally {
      await sealer.query("select pg_advisory_unlock($1)", [SEALER_LOCK]);
      sealer.release();
    }

    // The run sealed under a tree head: a new state of the sheet, printed with its seal.
    await sealedInLog("run", runId);
    const sealed = await askPdf(runId);
    expect(sealed.opened).toBe(1);
    expect(sealed.state).not.toBe(waiting.state);
    expect(sealed.sha256).not.toBe(waiting.sha256);
    expect(textOf(sealed.bytes)).not.toContain("waits for the sealer");
    expect(await askPdf(runId)).toMatchObject({ opened: 0, sha256: sealed.sha256 });

    // Issued as revision A of a calc, for a lead to check: the header and the sign-off block change.
    const calcNumber = `C-${Date.now().toString(36).slice(-5).toUpperCase()}`;
    const { calcId } = await runUseCase(createCalc, {
      actor: engineer,
      input: { jobId: job.jobId, number: calcNumber, title: "Beam for the sheet key" },
    });
    await runUseCase(prepareRevision, {
      actor: engineer,
      input: { calcId, runId, checkerId: reviewer.id, issueStatus: "for-approval" },
    });
    const signed = await askPdf(runId);
    expect(signed.opened).toBe(1);
    expect(signed.state).not.toBe(sealed.state);
    expect(textOf(signed.bytes)).toContain(`Calc ${calcNumber} rev A`);
    expect(await askPdf(runId)).toMatchObject({ opened: 0, sha256: signed.sha256 });

    // The version withdrawn: the sheet's banner says so.
    await runUseCase(withdrawVersion, { actor: lead, input: { versionId, reason: "Wrong deflection limit for this test" } });
    const withdrawn = await askPdf(runId);
    expect(withdrawn.opened).toBe(1);
    expect(withdrawn.state).not.toBe(signed.state);
    expect(textOf(withdrawn.bytes)).toContain("Wrong deflection limit for this test");
    expect(await askPdf(runId)).toMatchObject({ opened: 0, sha256: withdrawn.sha256 });

    // Four states, four PDFs, each kept once under the key of what it showed; every one still served as it was.
    const states = [waiting, sealed, signed, withdrawn];
    const kept = await db.select().from(schema.calcSheetPdfs).where(eq(schema.calcSheetPdfs.runId, runId));
    expect(kept.map((row) => row.sha256).sort()).toEqual(states.map((state) => state.sha256).sort());
    expect(kept.every((row) => row.pages === countPdfPages(states.find((state) => state.sha256 === row.sha256)!.bytes))).toBe(
      true,
    );
    const keys = await keysOf(runId);
    expect(keys.map((key) => key.pdfId).sort()).toEqual(kept.map((row) => row.id).sort());
    for (const state of states) expect((await keptBytes(runId, state.sha256)).equals(Buffer.from(state.bytes))).toBe(true);
  }, 90_000);

  it("opens the sheet in Chromium for a state its key does not name (another build, none known, a name changed), and keeps no PDF twice", async () => {
    const versionId = (await listVersionsOf((await getStandardBySlug("fixed-end-beam"))!.id))[0].id;
    const runId = await newRun(versionId);
    await sealedInLog("run", runId);
    const first = await askPdf(runId);
    expect(first.opened).toBe(1);
    // Whoever asks: the sheet shows nothing of the person asking, so an auditor gets the same PDF without Chromium.
    expect(await askPdf(runId, auditorHeaders)).toMatchObject({ opened: 0, sha256: first.sha256 });

    const build = process.env.GUSSET_BUILD_ID;
    expect(build, "scripts/test.mjs gives the tests the test server's build").toBeTruthy();
    try {
      // Another build than the one the server draws the sheet with: the key names no PDF, so the sheet is opened; it
      // shows the state kept already, and that PDF is served.
      process.env.GUSSET_BUILD_ID = `${build}-other`;
      forgetServerEnv();
      expect(await askPdf(runId)).toMatchObject({ opened: 1, sha256: first.sha256, state: first.state });
      // No build known (next dev, a script): no key, always opened.
      delete process.env.GUSSET_BUILD_ID;
      forgetServerEnv();
      expect(await askPdf(runId)).toMatchObject({ opened: 1, sha256: first.sha256 });
    } finally {
      process.env.GUSSET_BUILD_ID = build;
      forgetServerEnv();
    }
    expect(await askPdf(runId)).toMatchObject({ opened: 0, sha256: first.sha256 });

    // The preparer's name, printed on the sheet, changes: a new key and a new PDF; changed back, the first PDF again,
    // known by its key, without Chromium.
    const [{ name }] = await db.select({ name: schema.user.name }).from(schema.user).where(eq(schema.user.id, engineer.id));
    let renamed: Awaited<ReturnType<typeof askPdf>>;
    try {
      await db
        .update(schema.user)
        .set({ name: `${name} Jr` })
        .where(eq(schema.user.id, engineer.id));
      renamed = await askPdf(runId);
      expect(renamed.opened).toBe(1);
      expect(renamed.sha256).not.toBe(first.sha256);
      expect(textOf(renamed.bytes)).toContain(`${name} Jr`);
    } finally {
      await db.update(schema.user).set({ name }).where(eq(schema.user.id, engineer.id));
    }
    expect(await askPdf(runId)).toMatchObject({ opened: 0, sha256: first.sha256 });

    const kept = await db.select().from(schema.calcSheetPdfs).where(eq(schema.calcSheetPdfs.runId, runId));
    expect(kept.map((row) => row.sha256).sort()).toEqual([first.sha256, renamed.sha256].sort());
    expect((await keysOf(runId)).length).toBe(2);
  }, 90_000);

  it("answers 404 for a run or a kept PDF that does not exist, and 401 without a session", async () => {
    const none = "00000000-0000-4000-8000-000000000000";
    const missing = await sheetPdfRoute(
      new Request(`${base}/api/runs/${none}/sheet-pdf`, { headers: engineerHeaders }),
      params({ id: none }),
    );
    expect([missing.status, ((await missing.json()) as { error: { message: string } }).error.message]).toEqual([
      404,
      "There is no run with that id.",
    ]);
    const { run } = await matrixRun();
    const noPdf = await keptPdfRoute(
      new Request(`${base}/api/runs/${run.id}/sheet-pdfs/${none}`, { headers: engineerHeaders }),
      params({ id: run.id, pdfId: none }),
    );
    expect(noPdf.status).toBe(404);
    const anonymous = await sheetPdfRoute(new Request(`${base}/api/runs/${run.id}/sheet-pdf`), params({ id: run.id }));
    expect(anonymous.status).toBe(401);
  });
});
