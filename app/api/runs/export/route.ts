import { routeHandler } from "@/lib/use-cases/next";
import { exportRunLog } from "@/lib/use-cases/run-log";
import { runLogCsvResponse } from "@/lib/use-cases/run-log-export";

// GET /api/runs/export?job=&standard=&version=&person=&outcome=&pass=&signOff=&from=&to=&tz=&sort=&dir=: every run
// the filters keep, in the order asked for, as CSV (RFC 4180), streamed in keyset batches. The export is an audit
// event naming the filters. A filter that cannot be read answers 400 with what is wrong; nothing is exported.
export const GET = routeHandler(exportRunLog, { respond: runLogCsvResponse, queryErrors: "bad-request" });
