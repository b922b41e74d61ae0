import { routeHandler } from "@/lib/use-cases/next";
import { readRun } from "@/lib/use-cases/runs";
import { readRunRecord } from "@/lib/standards/run-record";
import { jsonResponse } from "@/lib/domain/json-response";

// GET /api/runs/{id}: the run's summary and its canonical record (parsed), with the record's sha256 to check it by.
export const GET = routeHandler(readRun, {
  respond: ({ record, ...summary }) => jsonResponse({ data: { ...summary, record: readRunRecord(record) } }),
});
