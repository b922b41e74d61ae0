"use client";
// The batch re-run on the impact report: start it (a lead, once a successor is named), then its progress, polled
// from GET /api/withdrawals/{id}/batch with TanStack Query every second until every run is done, and the delta
// table: checks that went from pass to fail first, then failed re-runs, then the largest changes of utilisation.
import Link from "next/link";
import { startTransition, useActionState, useEffect, useState } from "react";
import { QueryClient, QueryClientProvider, useQuery, useQueryClient } from "@tanstack/react-query";
import type { BatchProgress } from "@/lib/use-cases/batch-reruns";
import { displayUtilisation } from "@/lib/standards/utilisation";
import { Button } from "@/components/ui/button";
import { FormError, Notice } from "@/components/ui/notice";
import { TableFrame } from "@/components/ui/table";
import { startBatchAction } from "../../actions";

async function fetchProgress(withdrawalId: string): Promise<BatchProgress> {
  const response = await fetch(`/api/withdrawals/${withdrawalId}/batch`, { headers: { accept: "application/json" } });
  const answer = (await response.json().catch(() => null)) as { data?: BatchProgress; error?: { message: string } } | null;
  if (!response.ok || !answer?.data)
    throw new Error(answer?.error?.message ?? "The batch's progress could not be read; retrying.");
  return answer.data;
}

const utilisation = (value: number | null) => (value === null ? "—" : displayUtilisation(value));
const result = (pass: boolean | null) => (pass === null ? "failed" : pass ? "passes" : "fails");

function Progress({ batch }: { batch: NonNullable<BatchProgress["batch"]> }) {
  const percent = batch.total === 0 ? 100 : Math.round((batch.done / batch.total) * 100);
  const finished = batch.done >= batch.total;
  return (
    <div className="space-y-2" data-testid="batch-progress" data-done={batch.done} data-total={batch.total}>
      <p className="text-sm text-ink-700">
        Started by {batch.startedByName}. {batch.done} of {batch.total} re-run
        {finished ? " — complete." : "…"} {batch.failed > 0 ? `${batch.failed} failed. ` : ""}
        {batch.passToFail > 0 ? `${batch.passToFail} went from pass to fail.` : ""}
      </p>
      {batch.stalledForMs !== null ? (
        <Notice tone="warn" testId="batch-stalled">
          No re-run has finished for {Math.floor(batch.stalledForMs / 60_000)} minutes, with {batch.total - batch.done} still to
          do. Re-runs are done by the background worker (<code>npm start</code> starts one): if none is running they wait, and the
          batch goes on where it stopped once one starts. Nothing is lost or done twice.
        </Notice>
      ) : null}
      <div
        role="progressbar"
        aria-label="Batch re-run progress"
        aria-valuemin={0}
        aria-valuemax={batch.total}
        aria-valuenow={batch.done}
        aria-valuetext={`${batch.done} of ${batch.total} runs re-run`}
        className="h-3 w-full overflow-hidden rounded-full bg-ink-100 ring-1 ring-ink-200"
      >
        <div
          className={`h-full ${batch.failed > 0 || batch.passToFail > 0 ? "bg-warn-700" : "bg-plate-700"} transition-[width]`}
          style={{ width: `${percent}%` }}
        />
      </div>
    </div>
  );
}

function Deltas({ deltas }: { deltas: BatchProgress["deltas"] }) {
  if (deltas.length === 0) return null;
  return (
    <TableFrame
      testId="batch-deltas"
      label="Delta table of the re-runs"
      headings={["Job", "Result", "Largest utilisation", "Checks from pass to fail", "Run", "Re-run"]}
    >
      {deltas.map((item) => {
        const failing = item.checks.filter((c) => c.before?.pass && c.after && !c.after.pass);
        return (
          <tr key={item.originalRunId} data-testid="batch-delta" data-newly-failing={item.newlyFailing}>
            <td className="px-4 py-3 font-mono text-sm whitespace-nowrap">{item.jobNumber}</td>
            <td className="px-4 py-3 text-sm">
              {item.status === "failed" && !item.newRunId ? (
                <span className="text-fault-700">not run: {item.message}</span>
              ) : (
                <span
                  className={`whitespace-nowrap ${item.passAfter === false || item.passAfter === null ? "text-fault-700" : ""}`}
                >
                  {result(item.passBefore)} → {result(item.passAfter)}
                  {item.message ? <span className="block text-xs">{item.message}</span> : null}
                </span>
              )}
            </td>
            <td className="px-4 py-3 text-sm whitespace-nowrap tabular">
              {utilisation(item.utilisationBefore)} → {utilisation(item.utilisationAfter)}
            </td>
            <td className="px-4 py-3 text-sm text-fault-700">{failing.map((c) => c.label).join(", ") || "—"}</td>
            <td className="px-4 py-3">
              <Link href={`/runs/${item.originalRunId}`} className="font-mono text-sm text-plate-800 hover:underline">
                {item.originalRunId.slice(0, 8)}
              </Link>
            </td>
            <td className="px-4 py-3">
              {item.newRunId ? (
                <Link href={`/runs/${item.newRunId}`} className="font-mono text-sm text-plate-800 hover:underline">
                  {item.newRunId.slice(0, 8)}
                </Link>
              ) : (
                "—"
              )}
            </td>
          </tr>
        );
      })}
    </TableFrame>
  );
}

function Panel({
  withdrawalId,
  mappingId,
  first,
  canStart,
  blocked,
}: {
  withdrawalId: string;
  /** The mapping in force; a batch on an older one does not stop a new batch. */
  mappingId: string | null;
  first: BatchProgress;
  canStart: boolean;
  blocked: string | null;
}) {
  const client = useQueryClient();
  const [state, start, pending] = useActionState(startBatchAction, null);
  const query = useQuery({
    queryKey: ["batch", withdrawalId],
    queryFn: () => fetchProgress(withdrawalId),
    initialData: first,
    refetchInterval: (q) => {
      const batch = q.state.data?.batch;
      return batch && batch.done < batch.total ? 1000 : false;
    },
  });
  useEffect(() => {
    if (state?.ok) void client.invalidateQueries({ queryKey: ["batch", withdrawalId] });
  }, [state, client, withdrawalId]);
  const progress = query.data ?? first;
  return (
    <div className="space-y-4" data-testid="batch-panel">
      {progress.batch ? <Progress batch={progress.batch} /> : null}
      {progress.batch && progress.batch.mappingId === mappingId ? null : canStart && !blocked ? (
        <form
          onSubmit={(event) => {
            event.preventDefault();
            startTransition(() => start({ withdrawalId }));
          }}
          className="space-y-2"
        >
          <p className="text-sm text-ink-700">
            Re-runs every affected run on the successor, as a new run linked to its original (closed jobs included, as
            remediation). Each waits for its own check like any run.
          </p>
          <FormError message={state && !state.ok ? state.error.message : null} />
          <Button type="submit" pending={pending} pendingLabel="Starting…" data-testid="batch-start">
            Re-run every affected run
          </Button>
        </form>
      ) : (
        <Notice tone="info">{blocked ?? "A standards lead starts the batch re-run."}</Notice>
      )}
      {query.error ? <FormError message={query.error.message} /> : null}
      <Deltas deltas={progress.deltas} />
    </div>
  );
}

export function BatchPanel(props: {
  withdrawalId: string;
  mappingId: string | null;
  first: BatchProgress;
  canStart: boolean;
  blocked: string | null;
}) {
  const [client] = useState(() => new QueryClient({ defaultOptions: { queries: { retry: 2, refetchOnWindowFocus: false } } }));
  return (
    <QueryClientProvider client={client}>
      <Panel {...props} />
    </QueryClientProvider>
  );
}
