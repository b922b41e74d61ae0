import "server-only";
// Files kept beside jobs and runs: attachments (sketches, site photos, PDFs) and the calc sheet PDFs rendered for
// each state of a run's sheet, with the sheet keys each is known by. The bytes live in S3 under keys made from their
// sha256; these rows say what they are, and are append-only.
import { and, asc, eq, isNull } from "drizzle-orm";
import { calcSheetPdfKeys, calcSheetPdfs, jobAttachments, user, type JobAttachmentType } from "@/db/schema";
import { currentDb } from "./transaction";

/** The S3 key of a calc sheet PDF: content-addressed, so a key is never written with other bytes. */
export const sheetPdfKey = (runId: string, sha256: string) => `runs/${runId}/sheets/${sha256}.pdf`;
/** The S3 key of a job's attachment (a run's attachments are kept under its job). */
export const attachmentKey = (jobId: string, sha256: string) => `jobs/${jobId}/attachments/${sha256}`;

export type SheetPdfDto = {
  id: string;
  runId: string;
  stateSha256: string;
  sha256: string;
  bytes: number;
  pages: number;
  renderedByName: string;
  renderedAt: string;
};

const sheetPdfColumns = {
  id: calcSheetPdfs.id,
  runId: calcSheetPdfs.runId,
  stateSha256: calcSheetPdfs.stateSha256,
  sha256: calcSheetPdfs.sha256,
  bytes: calcSheetPdfs.bytes,
  pages: calcSheetPdfs.pages,
  renderedByName: user.name,
  renderedAt: calcSheetPdfs.renderedAt,
};

function selectSheetPdfs() {
  return currentDb().select(sheetPdfColumns).from(calcSheetPdfs).innerJoin(user, eq(user.id, calcSheetPdfs.renderedById));
}

const toSheetPdf = (row: Omit<SheetPdfDto, "renderedAt"> & { renderedAt: Date }): SheetPdfDto => ({
  ...row,
  renderedAt: row.renderedAt.toISOString(),
});

export async function findSheetPdf(
  where: { runId: string } & ({ stateSha256: string } | { id: string }),
): Promise<SheetPdfDto | null> {
  const [row] = await selectSheetPdfs().where(
    and(
      eq(calcSheetPdfs.runId, where.runId),
      "id" in where ? eq(calcSheetPdfs.id, where.id) : eq(calcSheetPdfs.stateSha256, where.stateSha256),
    ),
  );
  return row ? toSheetPdf(row) : null;
}

/** The PDF kept under a sheet key (what the sheet showed and the build that drew it), if any. */
export async function findSheetPdfByKey(where: { runId: string; sheetKey: string }): Promise<SheetPdfDto | null> {
  const [row] = await selectSheetPdfs()
    .innerJoin(calcSheetPdfKeys, eq(calcSheetPdfKeys.pdfId, calcSheetPdfs.id))
    .where(and(eq(calcSheetPdfKeys.runId, where.runId), eq(calcSheetPdfKeys.sheetKey, where.sheetKey)));
  return row ? toSheetPdf(row) : null;
}

/** Names a kept PDF by a sheet key; a key already kept keeps its PDF (false). */
export async function insertSheetPdfKey(values: { runId: string; sheetKey: string; pdfId: string }): Promise<boolean> {
  const inserted = await currentDb()
    .insert(calcSheetPdfKeys)
    .values(values)
    .onConflictDoNothing()
    .returning({ pdfId: calcSheetPdfKeys.pdfId });
  return inserted.length > 0;
}

/** Oldest first: the order the sheet's states were kept in. */
export async function listSheetPdfs(runId: string): Promise<SheetPdfDto[]> {
  const rows = await selectSheetPdfs()
    .where(eq(calcSheetPdfs.runId, runId))
    .orderBy(asc(calcSheetPdfs.renderedAt), asc(calcSheetPdfs.id));
  return rows.map(toSheetPdf);
}

/** Keeps a rendered state; false when that state of the sheet was kept already (by a render that finished first). */
export async function insertSheetPdf(values: typeof calcSheetPdfs.$inferInsert): Promise<boolean> {
  const inserted = await currentDb()
    .insert(calcSheetPdfs)
    .values(values)
    .onConflictDoNothing()
    .returning({ id: calcSheetPdfs.id });
  return inserted.length > 0;
}

export type AttachmentDto = {
  id: string;
  jobId: string;
  runId: string | null;
  sha256: string;
  fileName: string;
  contentType: JobAttachmentType;
  bytes: number;
  note: string | null;
  uploadedByName: string;
  uploadedAt: string;
};

const attachmentColumns = {
  id: jobAttachments.id,
  jobId: jobAttachments.jobId,
  runId: jobAttachments.runId,
  sha256: jobAttachments.sha256,
  fileName: jobAttachments.fileName,
  contentType: jobAttachments.contentType,
  bytes: jobAttachments.bytes,
  note: jobAttachments.note,
  uploadedByName: user.name,
  uploadedAt: jobAttachments.uploadedAt,
};

const toAttachment = (row: Omit<AttachmentDto, "uploadedAt"> & { uploadedAt: Date }): AttachmentDto => ({
  ...row,
  uploadedAt: row.uploadedAt.toISOString(),
});

/** A job's own attachments (runId null), or one run's; oldest first. */
export async function listAttachments(where: { jobId: string; runId: string | null }): Promise<AttachmentDto[]> {
  const rows = await currentDb()
    .select(attachmentColumns)
    .from(jobAttachments)
    .innerJoin(user, eq(user.id, jobAttachments.uploadedById))
    .where(
      and(
        eq(jobAttachments.jobId, where.jobId),
        where.runId === null ? isNull(jobAttachments.runId) : eq(jobAttachments.runId, where.runId),
      ),
    )
    .orderBy(asc(jobAttachments.uploadedAt), asc(jobAttachments.id));
  return rows.map(toAttachment);
}

export async function getAttachment(id: string): Promise<AttachmentDto | null> {
  const [row] = await currentDb()
    .select(attachmentColumns)
    .from(jobAttachments)
    .innerJoin(user, eq(user.id, jobAttachments.uploadedById))
    .where(eq(jobAttachments.id, id));
  return row ? toAttachment(row) : null;
}

/** Keeps an attachment; false when the same bytes are already attached at the same place (job, or run). */
export async function insertAttachment(values: typeof jobAttachments.$inferInsert): Promise<{ id: string; added: boolean }> {
  const [inserted] = await currentDb()
    .insert(jobAttachments)
    .values(values)
    .onConflictDoNothing()
    .returning({ id: jobAttachments.id });
  if (inserted) return { id: inserted.id, added: true };
  const [existing] = await currentDb()
    .select({ id: jobAttachments.id })
    .from(jobAttachments)
    .where(
      and(
        eq(jobAttachments.jobId, values.jobId),
        values.runId ? eq(jobAttachments.runId, values.runId) : isNull(jobAttachments.runId),
        eq(jobAttachments.sha256, values.sha256),
      ),
    );
  return { id: existing.id, added: false };
}
