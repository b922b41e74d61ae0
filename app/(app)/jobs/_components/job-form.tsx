"use client";
// A job's details: the same form creates a job and, with its status, changes one. The schema is the use case's
// own, so the browser and the server refuse the same things with the same words.
import { startTransition, useActionState } from "react";
import { useForm, type Resolver } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { createJobSchema, JOB_STATUS_IDS, JOB_STATUS_LABELS, updateJobSchema } from "@/lib/domain/schemas/jobs";
import { Button } from "@/components/ui/button";
import { SelectField, TextField } from "@/components/ui/field";
import { FormError } from "@/components/ui/notice";
import { actionErrors } from "@/components/action-errors";
import { createJobAction, updateJobAction } from "../actions";

type Person = { id: string; name: string; role: string };
type Values = z.input<typeof updateJobSchema>;
type Output = z.output<typeof updateJobSchema>;
const FIELDS = ["jobNumber", "name", "client", "site", "responsibleEngineerId", "status"] as const;

export function JobForm({
  people,
  job,
}: {
  people: Person[];
  /** The job being changed; a new job without it. */
  job?: Omit<Values, "client" | "site"> & { client: string | null; site: string | null };
}) {
  const [createState, create, creating] = useActionState(createJobAction, null);
  const [updateState, update, updating] = useActionState(updateJobAction, null);
  const editing = job !== undefined;
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<Values, unknown, Output>({
    // One form for both: a new job has no id or status yet, so its schema leaves them out.
    resolver: (editing ? zodResolver(updateJobSchema) : zodResolver(createJobSchema)) as unknown as Resolver<
      Values,
      unknown,
      Output
    >,
    defaultValues: job
      ? { ...job, client: job.client ?? "", site: job.site ?? "" }
      : { jobNumber: "", name: "", client: "", site: "", responsibleEngineerId: "" },
  });
  const server = editing ? actionErrors(updateState, FIELDS) : actionErrors(createState, FIELDS);
  const error = (name: (typeof FIELDS)[number]) => errors[name]?.message ?? server.field[name];
  return (
    <form
      noValidate
      className="max-w-xl space-y-4"
      data-testid="job-form"
      onSubmit={handleSubmit((values) => {
        const fields = { ...values, client: values.client ?? undefined, site: values.site ?? undefined };
        startTransition(() => (editing ? update(fields) : create(fields)));
      })}
    >
      <FormError message={server.form} />
      <TextField
        label="Job number"
        hint="As the drawings write it, e.g. MF-2291."
        data-testid="job-number"
        error={error("jobNumber")}
        {...register("jobNumber")}
      />
      <TextField label="Job name" data-testid="job-name" error={error("name")} {...register("name")} />
      <TextField label="Client (optional)" data-testid="job-client" error={error("client")} {...register("client")} />
      <TextField label="Site (optional)" data-testid="job-site" error={error("site")} {...register("site")} />
      <SelectField
        label="Responsible engineer"
        hint="Approves the job's calcs once a checker has checked them."
        data-testid="job-responsible"
        error={error("responsibleEngineerId")}
        {...register("responsibleEngineerId")}
      >
        <option value="">Choose…</option>
        {people.map((person) => (
          <option key={person.id} value={person.id}>
            {person.name} ({person.role === "lead" ? "standards lead" : "engineer"})
          </option>
        ))}
      </SelectField>
      {editing ? (
        <SelectField
          label="Status"
          hint="A closed job takes no new design runs."
          data-testid="job-status-field"
          error={error("status")}
          {...register("status")}
        >
          {JOB_STATUS_IDS.map((value) => (
            <option key={value} value={value}>
              {JOB_STATUS_LABELS[value]}
            </option>
          ))}
        </SelectField>
      ) : null}
      <Button type="submit" pending={creating || updating} pendingLabel="Saving…" data-testid="job-submit">
        {editing ? "Save changes" : "Create job"}
      </Button>
    </form>
  );
}
