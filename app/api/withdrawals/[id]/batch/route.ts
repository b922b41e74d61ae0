import { routeHandler } from "@/lib/use-cases/next";
import { readBatchProgress } from "@/lib/use-cases/batch-reruns";

// GET /api/withdrawals/{id}/batch: the latest batch re-run of a withdrawal (how many of how many are done, failed,
// went from pass to fail) and its delta table; `{ batch: null }` before one is started. The impact report polls it.
export const GET = routeHandler(readBatchProgress);
