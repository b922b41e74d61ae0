"use client";
// Runs the whole integrity check (lib/use-cases/integrity-check.ts) and shows what it found, the first problem first.
import { startTransition, useActionState } from "react";
import { Button } from "@/components/ui/button";
import { FormError, Notice } from "@/components/ui/notice";
import { actionErrors } from "@/components/action-errors";
import { runIntegrityCheckAction } from "../actions";

export function IntegrityCheckForm() {
  const [state, check, pending] = useActionState(runIntegrityCheckAction, null);
  const server = actionErrors(state, []);
  const report = state?.ok ? state.data : null;
  return (
    <div data-testid="integrity-check">
      <Button
        type="button"
        onClick={() => startTransition(() => check({}))}
        pending={pending}
        pendingLabel="Checking every record…"
      >
        Run the integrity check
      </Button>
      <FormError message={server.form} />
      {report ? (
        <div className="mt-4" data-testid="integrity-report">
          <Notice
            tone={report.ok ? "pass" : "fault"}
            title={
              report.ok
                ? "Everything matches"
                : `${report.problems.length === 50 ? "50 or more" : report.problems.length} problem(s) found`
            }
          >
            <p>
              {report.leaves.toLocaleString("en")} sealed records rebuilt into the tree, {report.heads.toLocaleString("en")}{" "}
              signed tree heads and {report.nodes.toLocaleString("en")} stored subtrees compared, in{" "}
              {(report.durationMs / 1000).toFixed(1)} s
              {report.pending.count > 0 ? `; ${report.pending.count} new record(s) wait for the sealer` : ""}.
            </p>
            {report.ok ? (
              <p className="mt-1">
                Every record hashes to what its leaf sealed, every head&apos;s root is the tree&apos;s at its size, each head
                extends the one before, and every head carries the log key&apos;s signature.
              </p>
            ) : null}
          </Notice>
          {report.problems.length > 0 ? (
            <ol className="mt-3 list-decimal space-y-1 pl-6 text-sm text-ink-900" data-testid="integrity-problems">
              {report.problems.map((problem, i) => (
                <li key={i}>
                  <span className="text-ink-500">
                    {problem.leafIndex === null ? "not in the tree" : `leaf ${problem.leafIndex}`}:
                  </span>{" "}
                  {problem.message}
                </li>
              ))}
            </ol>
          ) : null}
        </div>
      ) : null}
    </div>
  );
}
