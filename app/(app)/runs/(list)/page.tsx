import type { Metadata } from "next";
import { requirePageActor } from "@/lib/auth/session";
import { runUseCase } from "@/lib/use-cases/run";
import { readRuns } from "@/lib/use-cases/runs";
import { PageHeader } from "@/components/ui/page-header";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { SelectField, TextField } from "@/components/ui/field";
import { orNotFound } from "../../_components/or-not-found";
import { RunList } from "../_components/run-list";
import { RunLogLink } from "../../audit/runs/_components/run-log-link";

export const metadata: Metadata = { title: "Runs" };

export default async function RunsPage({ searchParams }: PageProps<"/runs">) {
  const actor = await requirePageActor("runs.read", { next: "/runs" });
  const params = await searchParams;
  const one = (value: string | string[] | undefined) => (Array.isArray(value) ? value[0] : value)?.trim() || undefined;
  const filter = {
    job: one(params.job),
    standard: one(params.standard),
    outcome: one(params.outcome) as "succeeded" | "failed" | undefined,
    pass: one(params.pass) as "true" | "false" | undefined,
    cursor: one(params.cursor),
  };
  const { runs, nextCursor } = await orNotFound(() => runUseCase(readRuns, { actor, input: { ...filter, limit: 50 } }));
  const filtered = Boolean(filter.job || filter.standard || filter.outcome || filter.pass);

  return (
    <>
      <PageHeader
        title="Runs"
        lead="Every run of a published version, newest first: the inputs given, the frame engine's results and the checks, kept for good."
        actions={<RunLogLink actor={actor} testId="runs-run-log-link" />}
      />
      <form
        method="get"
        className="mb-4 grid items-end gap-3 sm:grid-cols-[10rem_minmax(0,1fr)_12rem_auto]"
        data-testid="runs-filter"
      >
        <TextField label="Job number" name="job" defaultValue={filter.job ?? ""} />
        <TextField label="Standard (short name)" name="standard" defaultValue={filter.standard ?? ""} />
        <SelectField label="Result" name="pass" defaultValue={filter.pass ?? ""}>
          <option value="">Any</option>
          <option value="true">Every check passes</option>
          <option value="false">A check fails</option>
        </SelectField>
        <Button type="submit" variant="secondary">
          Filter
        </Button>
      </form>
      {runs.length === 0 ? (
        filtered || filter.cursor ? (
          <p className="rounded-plate bg-paper-raised px-4 py-6 text-ink-700 ring-1 ring-ink-200" data-testid="runs-none">
            No run matches these filters.
          </p>
        ) : (
          <EmptyState title="No runs yet">
            Runs are made inside a job: open a job and run a published standard. Each run is stored for good, so that any number
            on a drawing can be traced back to it.
          </EmptyState>
        )
      ) : (
        <RunList
          first={{ runs, nextCursor }}
          filter={{ job: filter.job, standard: filter.standard, outcome: filter.outcome, pass: filter.pass }}
        />
      )}
    </>
  );
}
