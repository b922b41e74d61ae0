// Attachments and calc sheet PDFs through the real route handlers, database and fake S3: a file attached to a job
// or a run downloads as the same bytes with the same sha256; every bad upload (empty, renamed, disallowed type,
// too large, a body cut off on the way, a run of another job) is a 4xx naming the problem with nothing stored;
// the calc sheet PDF is kept once per state of the sheet, and a withdrawal of the run's version (a banner on the
// sheet) gives a new one while the old is kept; both tables are append-only for the app's role.
import { createHash, randomBytes } from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db, pool } from "@/db";
import * as schema from "@/db/schema";
import type { Actor } from "@/lib/domain/actor";
import { runUseCase } from "@/lib/use-cases/run";
import { countPdfPages } from "@/lib/pdf/sheet-renderer";
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
      for (const table of ["job_attachments", "calc_sheet_pdfs"]) {
        for (const statement of [`update ${table} set bytes = bytes + 1`, `delete from ${table}`]) {
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
  let versionId: string;
  let runId: string;

  it("keeps one PDF per state of the sheet: the same state again is the kept PDF; a withdrawal banner makes a new one", async () => {
    // A version of our own to withdraw, so the seeded standards stay in use for the other tests.
    const lead = (await createTestUser({ role: "lead", label: "files-lead" })).actor;
    const reviewer = (await createTestUser({ role: "lead", label: "files-reviewer" })).actor;
    const seeded = (await getStandardBySlug("fixed-end-beam"))!;
    const source = (await getVersion({ id: (await listVersionsOf(seeded.id))[0].id }))!.source;
    const slug = `files-beam-${Date.now().toString(36)}`;
    const { draftId } = await runUseCase(createStandard, {
      actor: lead,
      input: { slug, title: "Fixed-end beam for the PDF test" },
    });
    await runUseCase(saveDraft, { actor: lead, input: { draftId, source } });
    const { reviewId } = await runUseCase(submitDraft, { actor: lead, input: { draftId, changelog: "First." } });
    ({ versionId } = await runUseCase(approveAndPublish, { actor: reviewer, input: { reviewId } }));
    runId = (
      await runUseCase(createRun, { actor: engineer, input: { jobId: job.jobId, versionId, inputs: {}, unitSystem: "si" } })
    ).id;
    // The sheet shows the run's seal once the sealer has it: wait for it, so both asks below see one state.
    await sealedInLog("run", runId);

    const ask = () =>
      sheetPdfRoute(new Request(`${base}/api/runs/${runId}/sheet-pdf`, { headers: engineerHeaders }), params({ id: runId }));
    const first = await ask();
    expect(first.status).toBe(200);
    const firstBytes = new Uint8Array(await first.arrayBuffer());
    expect(first.headers.get("x-content-sha256")).toBe(sha256(firstBytes));
    const again = await ask();
    expect(again.headers.get("x-content-sha256")).toBe(sha256(firstBytes));
    expect(again.headers.get("x-sheet-state-sha256")).toBe(first.headers.get("x-sheet-state-sha256"));

    await runUseCase(withdrawVersion, { actor: lead, input: { versionId, reason: "Wrong deflection limit for this test" } });
    const withdrawn = await ask();
    const withdrawnBytes = new Uint8Array(await withdrawn.arrayBuffer());
    expect(withdrawn.headers.get("x-sheet-state-sha256")).not.toBe(first.headers.get("x-sheet-state-sha256"));
    expect(sha256(withdrawnBytes)).not.toBe(sha256(firstBytes));

    const kept = await db.select().from(schema.calcSheetPdfs).where(eq(schema.calcSheetPdfs.runId, runId));
    expect(kept.map((row) => row.sha256).sort()).toEqual([sha256(firstBytes), sha256(withdrawnBytes)].sort());
    expect(
      kept.every((row) => row.pages === countPdfPages(row.sha256 === sha256(firstBytes) ? firstBytes : withdrawnBytes)),
    ).toBe(true);
    // The first state is still there, byte for byte.
    const firstRow = kept.find((row) => row.sha256 === sha256(firstBytes))!;
    const old = await keptPdfRoute(
      new Request(`${base}/api/runs/${runId}/sheet-pdfs/${firstRow.id}`, { headers: auditorHeaders }),
      params({ id: runId, pdfId: firstRow.id }),
    );
    expect(Buffer.from(await old.arrayBuffer()).equals(Buffer.from(firstBytes))).toBe(true);
  });

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
