import "server-only";
// The run log's CSV, streamed: the export use case (run-log.ts) has checked the permission, parsed the filters,
// recorded the audit event and read the first batch; the rest is read batch after batch as the client takes it
// (a ReadableStream pulled by the response), each batch one keyset query on the pool — never a long transaction,
// never the whole result in memory. Rows made after the export began are left out (asOf).
import { csvRecord, type CsvValue } from "@/lib/domain/csv";
import { attachmentDisposition } from "@/lib/domain/file-signatures";
import { cursorAfter, listRuns, type RunListRowDto } from "@/lib/data/run-list";
import { outsideTransaction } from "@/lib/data/transaction";
import { EXPORT_BATCH, exportFilterOf, type RunExport } from "./run-log";

/** The columns, in order: the header row's names and each run's values. */
export const RUN_CSV_COLUMNS: readonly [string, (run: RunListRowDto) => CsvValue][] = [
  ["run_id", (r) => r.id],
  ["created_at", (r) => r.createdAt],
  ["job_number", (r) => r.jobNumber],
  ["job_name", (r) => r.jobName],
  ["standard", (r) => r.slug],
  ["standard_title", (r) => r.title],
  ["version", (r) => r.number],
  ["content_hash", (r) => r.contentHash],
  ["person_id", (r) => r.createdById],
  ["person", (r) => r.createdByName],
  ["outcome", (r) => r.outcome],
  ["pass", (r) => r.pass],
  ["max_utilisation", (r) => r.maxUtilisation],
  ["purpose", (r) => r.purpose],
  ["record_sha256", (r) => r.recordSha256],
  ["sign_off", (r) => r.signOff],
];

export const RUN_CSV_HEADER = csvRecord(RUN_CSV_COLUMNS.map(([name]) => name));

export const runCsvRecord = (run: RunListRowDto) => csvRecord(RUN_CSV_COLUMNS.map(([, value]) => value(run)));

/** The header, then every row the export filters, as UTF-8 text in chunks of one batch. */
export function runLogCsvStream(started: RunExport, batch = EXPORT_BATCH): ReadableStream<Uint8Array> {
  const encoder = new TextEncoder();
  const filter = exportFilterOf(started.query, started.asOf);
  let rows: RunListRowDto[] | null = started.first;
  let headerSent = false;
  return new ReadableStream<Uint8Array>(
    {
      async pull(controller) {
        if (!headerSent) {
          headerSent = true;
          controller.enqueue(encoder.encode(RUN_CSV_HEADER));
          return;
        }
        if (rows === null) {
          controller.close();
          return;
        }
        const chunk = rows.map(runCsvRecord).join("");
        const last = rows.at(-1);
        const full = rows.length === batch;
        // The next batch is asked for now and read while this one goes out; none after a short batch.
        rows = null;
        if (chunk) controller.enqueue(encoder.encode(chunk));
        if (full && last) {
          const sort = started.query.sort;
          rows = await outsideTransaction(() => listRuns({ ...filter, after: cursorAfter(last, sort), limit: batch }));
          if (rows.length === 0) rows = null;
        }
      },
    },
    // One batch waiting at most: memory stays at a batch or two whatever the export's size.
    { highWaterMark: 1 },
  );
}

/** The CSV file's name: the run log and the instant it was read up to, e.g. gusset-run-log-20261203T021500Z.csv. */
export function runLogFileName(asOf: string): string {
  return `gusset-run-log-${asOf.replace(/[-:]/g, "").replace(/\.\d+Z$/, "Z")}.csv`;
}

export function runLogCsvResponse(started: RunExport): Response {
  return new Response(runLogCsvStream(started), {
    headers: {
      "Content-Type": "text/csv; charset=utf-8; header=present",
      "Content-Disposition": attachmentDisposition(runLogFileName(started.asOf)),
      "Cache-Control": "private, no-store",
      "X-Content-Type-Options": "nosniff",
    },
  });
}
