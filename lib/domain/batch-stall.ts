// When a batch re-run has stopped moving. Its re-runs are pg-boss jobs done by the background worker; a job whose
// worker was killed is retried once it expires (45 s, lib/jobs/queues.ts), so a batch that has finished nothing for
// several times that long has no worker doing it, or one that fails on every run.

/** Finished nothing for this long, with runs still to do: said on the impact report. */
export const BATCH_STALL_AFTER_MS = 3 * 60_000;

/** Milliseconds since the batch last moved (its start, else its latest finished re-run), or null while it moves or is done. */
export function batchStalledFor(
  batch: { done: number; total: number; startedAt: string; lastFinishedAt: string | null },
  now: Date,
): number | null {
  if (batch.done >= batch.total) return null;
  const since = Date.parse(batch.lastFinishedAt ?? batch.startedAt);
  if (!Number.isFinite(since)) return null;
  const idle = now.getTime() - since;
  return idle >= BATCH_STALL_AFTER_MS ? idle : null;
}
