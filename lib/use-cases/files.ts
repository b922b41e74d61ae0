import "server-only";
// Files beside jobs and runs.
//
// Calc sheet PDFs: when a PDF is kept under the key of what the sheet shows now (the sheet's facts read from the
// database and the app's build, lib/use-cases/sheet-key.ts), it is served as it is, without opening Chromium. Else
// the server's Chromium opens the run's print-ready sheet as the person asking and, when the sheet shows a state no
// PDF was kept for (a new sign-off, a withdrawal banner, a new seal), prints it, stores the bytes in S3 under their
// sha256 and keeps a row; otherwise the PDF kept for that state is served. Either way the PDF is then known by the
// key the page printed, the key of the facts it drew. Old PDFs and keys stay, never overwritten. Rendering and S3
// happen before the transaction opens; the rows are written inside it.
//
// Attachments: a file on a job or on one of its runs, its type told from its bytes, stored in S3 under its
// sha256 before the row is written (a failed upload leaves no row). Downloads check who may read the job.
import { createHash } from "node:crypto";
import { AppError } from "@/lib/domain/errors";
import { TYPE_EXTENSIONS, TYPE_WORDS, bytesAreOfType, cleanFileName } from "@/lib/domain/file-signatures";
import {
  attachFileSchema,
  attachmentPlaceSchema,
  attachmentRefSchema,
  runRefSchema,
  sheetPdfRefSchema,
} from "@/lib/domain/schemas/jobs";
import type { JobAttachmentType } from "@/db/schema";
import {
  attachmentKey,
  findSheetPdf,
  findSheetPdfByKey,
  getAttachment,
  insertAttachment,
  insertSheetPdf,
  insertSheetPdfKey,
  listAttachments,
  listSheetPdfs,
  sheetPdfKey,
  type AttachmentDto,
  type SheetPdfDto,
} from "@/lib/data/files";
import { getJob } from "@/lib/data/jobs";
import { getRunSummary } from "@/lib/data/runs";
import { sheetFactsOf } from "./runs";
import { isSheetKey, sheetKeyOf } from "./sheet-key";
import { getObject, putObject } from "@/lib/storage/s3";
import { withOpenSheet } from "@/lib/pdf/sheet-renderer";

/** For the sheet PDF's route: the asking request's session, handed to the renderer for the sheet page. */
export { withRequestCookies } from "@/lib/pdf/sheet-renderer";
import { defineUseCase } from "./use-case";

const sha256Of = (body: Uint8Array) => createHash("sha256").update(body).digest("hex");

async function readStoredPdf(pdf: SheetPdfDto): Promise<Uint8Array> {
  const object = await getObject({ key: sheetPdfKey(pdf.runId, pdf.sha256) });
  if (!object) throw new AppError("unavailable", "That calc sheet PDF's file cannot be read from storage just now; try again.");
  return object.body;
}

export type SheetPdfDownload = SheetPdfDto & { body: Uint8Array; added: boolean };

/** `sheetKey`: the key the page printed, for the PDF to be known by (null when it is known by it already). */
type Rendered =
  | { kind: "kept"; pdf: SheetPdfDto; body: Uint8Array; sheetKey: string | null }
  | { kind: "new"; stateSha256: string; sha256: string; bytes: number; pages: number; body: Uint8Array; sheetKey: string | null };

/** The PDF of a run's calc sheet as it shows now: the one kept for this state, or a new one rendered and kept. */
export const renderSheetPdf = defineUseCase({
  name: "runs.sheet.render",
  permission: "runs.read",
  input: runRefSchema,
  prepare: async ({ id }): Promise<Rendered> => {
    const facts = await sheetFactsOf(id);
    if (!facts) throw new AppError("not-found", "There is no run with that id.");
    // Nothing the sheet shows has changed since a PDF was kept for it: that PDF, without Chromium.
    const key = sheetKeyOf(facts);
    const known = key ? await findSheetPdfByKey({ runId: id, sheetKey: key }) : null;
    if (known) return { kind: "kept", pdf: known, body: await readStoredPdf(known), sheetKey: null };
    return withOpenSheet(id, async (sheet): Promise<Rendered> => {
      const sheetKey = isSheetKey(sheet.sheetKey) ? sheet.sheetKey : null;
      const kept = await findSheetPdf({ runId: id, stateSha256: sheet.stateSha256 });
      if (kept) return { kind: "kept", pdf: kept, body: await readStoredPdf(kept), sheetKey };
      const { body, pages } = await sheet.print();
      const sha256 = sha256Of(body);
      await putObject({ key: sheetPdfKey(id, sha256), body, contentType: "application/pdf" });
      return { kind: "new", stateSha256: sheet.stateSha256, sha256, bytes: body.length, pages, body, sheetKey };
    });
  },
  run: async ({ id }, { actor, prepared }): Promise<SheetPdfDownload> => {
    if (prepared.kind === "kept") {
      // The same state under a key not kept yet (a new build, a name changed and changed back): known by it from now on.
      if (prepared.sheetKey) await insertSheetPdfKey({ runId: id, sheetKey: prepared.sheetKey, pdfId: prepared.pdf.id });
      return { ...prepared.pdf, body: prepared.body, added: false };
    }
    const { stateSha256, sha256, bytes, pages, body, sheetKey } = prepared;
    const added = await insertSheetPdf({ runId: id, stateSha256, sha256, bytes, pages, renderedById: actor.id });
    const pdf = (await findSheetPdf({ runId: id, stateSha256 }))!;
    if (sheetKey) await insertSheetPdfKey({ runId: id, sheetKey, pdfId: pdf.id });
    // Another request kept this state first: serve what it kept (its bytes are read after the commit).
    return { ...pdf, body: added ? body : new Uint8Array(), added };
  },
  audit: ({ result }) =>
    result.added
      ? {
          action: "runs.sheet.render",
          subject: `run:${result.runId}`,
          details: { runId: result.runId, sha256: result.sha256, pages: result.pages, stateSha256: result.stateSha256 },
        }
      : null,
});

/** A kept calc sheet PDF, by its id. */
export const readSheetPdf = defineUseCase({
  name: "runs.sheet.read",
  permission: "runs.read",
  input: sheetPdfRefSchema,
  prepare: async ({ id, pdfId }): Promise<SheetPdfDownload> => {
    const pdf = await findSheetPdf({ runId: id, id: pdfId });
    if (!pdf) throw new AppError("not-found", "This run has no calc sheet PDF with that id.");
    return { ...pdf, body: await readStoredPdf(pdf), added: false };
  },
  run: async (_input, { prepared }) => prepared,
  audit: null,
});

/** The calc sheet PDFs kept for a run, oldest first. */
export const readSheetPdfs = defineUseCase({
  name: "runs.sheet.list",
  permission: "runs.read",
  input: runRefSchema,
  run: async ({ id }) => listSheetPdfs(id),
  audit: null,
});

export type AttachResult = {
  id: string;
  added: boolean;
  jobNumber: string;
  runId: string | null;
  sha256: string;
  fileName: string;
  contentType: JobAttachmentType;
  bytes: number;
};

/** Keeps a file on a job or on one of its runs. The same bytes attached again at the same place are kept once. */
export const attachFile = defineUseCase({
  name: "jobs.attachment.add",
  permission: "files.attach",
  input: attachFileSchema,
  prepare: async ({ jobNumber, runId, file }) => {
    const job = await getJob({ jobNumber });
    if (!job) throw new AppError("not-found", `There is no job ${jobNumber}.`);
    if (runId) {
      const run = await getRunSummary(runId);
      if (!run || run.jobId !== job.id)
        throw new AppError("not-found", `Job ${job.jobNumber} has no run with that id.`, {
          fieldErrors: { runId: [`That run is not in job ${job.jobNumber}.`] },
        });
    }
    const contentType = file.type as JobAttachmentType;
    const body = new Uint8Array(await file.arrayBuffer());
    if (!bytesAreOfType(body, contentType))
      throw new AppError("invalid-input", `That file is not a ${TYPE_WORDS[contentType]} file, whatever its name says.`, {
        fieldErrors: { file: ["The file's contents do not match its type; export it again as PDF, PNG, JPEG or WebP."] },
      });
    const sha256 = sha256Of(body);
    await putObject({ key: attachmentKey(job.id, sha256), body, contentType });
    return {
      jobId: job.id,
      jobNumber: job.jobNumber,
      sha256,
      contentType,
      bytes: body.length,
      fileName: cleanFileName(file.name, `attachment.${TYPE_EXTENSIONS[contentType]}`),
    };
  },
  run: async ({ runId, note }, { actor, prepared }): Promise<AttachResult> => {
    const { jobId, jobNumber, ...file } = prepared;
    const { id, added } = await insertAttachment({ jobId, runId: runId || null, note, uploadedById: actor.id, ...file });
    return { id, added, jobNumber, runId: runId || null, ...file };
  },
  audit: ({ result }) =>
    result.added
      ? {
          action: "jobs.attachment.add",
          subject: result.runId ? `run:${result.runId}` : null,
          details: {
            jobNumber: result.jobNumber,
            runId: result.runId,
            sha256: result.sha256,
            fileName: result.fileName,
            bytes: result.bytes,
          },
        }
      : null,
});

export type AttachmentDownload = AttachmentDto & { body: Uint8Array };

/** An attachment's bytes, for whoever may read jobs; checked against its sha256 before they are served. */
export const readAttachment = defineUseCase({
  name: "jobs.attachment.read",
  permission: "jobs.read",
  input: attachmentRefSchema,
  prepare: async ({ attachmentId }): Promise<AttachmentDownload> => {
    const attachment = await getAttachment(attachmentId);
    if (!attachment) throw new AppError("not-found", "There is no attachment with that id.");
    const object = await getObject({ key: attachmentKey(attachment.jobId, attachment.sha256) });
    if (!object) throw new AppError("unavailable", "That attachment's file cannot be read from storage just now; try again.");
    if (sha256Of(object.body) !== attachment.sha256)
      throw new AppError("unavailable", "That attachment's stored bytes no longer match its sha256; tell the firm's admin.");
    return { ...attachment, body: object.body };
  },
  run: async (_input, { prepared }) => prepared,
  audit: null,
});

/** The files on a job (runId null) or on one of its runs, oldest first. */
export const readAttachments = defineUseCase({
  name: "jobs.attachment.list",
  permission: "jobs.read",
  input: attachmentPlaceSchema,
  run: async ({ jobId, runId }) => listAttachments({ jobId, runId }),
  audit: null,
});
