import { routeHandler } from "@/lib/use-cases/next";
import { createRun, readRuns } from "@/lib/use-cases/runs";
import { jsonResponse } from "@/lib/domain/json-response";

// POST /api/runs: validates, evaluates and stores a run (in one statement, its own transaction); 201 with its id, or
// 422 with the failed run's id and message when the frame engine could not analyse the model (the attempt is stored too).
// Bad inputs answer 422 with a message per input and store nothing.
export const POST = routeHandler(createRun, {
  respond: (run) =>
    jsonResponse(
      run.outcome === "succeeded"
        ? { data: run }
        : { data: run, error: { code: "invalid-input", message: run.message ?? "The run failed in the frame engine." } },
      { status: run.outcome === "succeeded" ? 201 : 422, headers: { Location: `/api/runs/${run.id}` } },
    ),
});

// GET /api/runs?job=&standard=&version=&person=&outcome=&pass=&signOff=&from=&to=&tz=&sort=&dir=&cursor=&limit=:
// newest first unless sorted otherwise (date, utilisation, job; asc or desc), with the cursor of the next page (null on
// the last). A filter or cursor that cannot be read answers 400 with what is wrong.
export const GET = routeHandler(readRuns, { queryErrors: "bad-request" });
