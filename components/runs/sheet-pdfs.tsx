// The calc sheet PDFs kept for a run, one per state its sheet has shown (a new sign-off or a withdrawal banner
// made a new one), oldest first, each downloadable as it was.
import type { SheetPdfDto } from "@/lib/data/files";
import { LocalTime } from "@/components/local-time";

export function SheetPdfs({ runId, pdfs }: { runId: string; pdfs: SheetPdfDto[] }) {
  return (
    <div data-testid="sheet-pdfs">
      <p className="mb-2 text-sm text-ink-700">
        <a
          href={`/api/runs/${runId}/sheet-pdf`}
          className="font-medium text-plate-700 underline"
          data-testid="sheet-pdf-download"
        >
          Download the calc sheet as PDF
        </a>{" "}
        — rendered on the server as the sheet shows now; a PDF is kept for each state the sheet has shown.
      </p>
      {pdfs.length === 0 ? (
        <p className="text-sm text-ink-500">No PDF of this sheet has been made yet.</p>
      ) : (
        <ol className="space-y-1 text-sm" data-testid="sheet-pdf-list">
          {pdfs.map((pdf, index) => (
            <li key={pdf.id} data-testid="sheet-pdf" data-sha256={pdf.sha256}>
              <a href={`/api/runs/${runId}/sheet-pdfs/${pdf.id}`} className="text-plate-700 underline">
                State {index + 1}
              </a>{" "}
              <span className="text-ink-500">
                ({pdf.pages} page{pdf.pages === 1 ? "" : "s"}, {Math.max(1, Math.round(pdf.bytes / 1024))} kB, made for{" "}
                {pdf.renderedByName}, <LocalTime iso={pdf.renderedAt} />)
              </span>{" "}
              <span className="font-mono text-xs break-all text-ink-500">sha256 {pdf.sha256}</span>
            </li>
          ))}
        </ol>
      )}
    </div>
  );
}
