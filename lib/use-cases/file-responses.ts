import "server-only";
// How the file use cases answer a download: the bytes with their type, size, name and sha256.
import { attachmentDisposition } from "@/lib/domain/file-signatures";
import type { AttachmentDownload, SheetPdfDownload } from "./files";

export function sheetPdfResponse(pdf: SheetPdfDownload): Response {
  // Another request kept this state of the sheet a moment earlier: fetch the PDF it kept.
  if (pdf.body.length === 0)
    return new Response(null, { status: 303, headers: { Location: `/api/runs/${pdf.runId}/sheet-pdfs/${pdf.id}` } });
  const name = `calc-sheet-run-${pdf.runId.slice(0, 8)}-${pdf.sha256.slice(0, 12)}.pdf`;
  return new Response(Buffer.from(pdf.body), {
    headers: {
      "Content-Type": "application/pdf",
      "Content-Length": String(pdf.body.length),
      "Content-Disposition": attachmentDisposition(name),
      "Cache-Control": "private, no-store",
      "X-Content-SHA256": pdf.sha256,
      "X-Sheet-State-SHA256": pdf.stateSha256,
    },
  });
}

export function attachmentResponse(file: AttachmentDownload): Response {
  return new Response(Buffer.from(file.body), {
    headers: {
      "Content-Type": file.contentType,
      "Content-Length": String(file.body.length),
      "Content-Disposition": attachmentDisposition(file.fileName),
      "Cache-Control": "private, no-store",
      "X-Content-SHA256": file.sha256,
      // The browser must not guess another type from the bytes (an image is never run as a page).
      "X-Content-Type-Options": "nosniff",
    },
  });
}
