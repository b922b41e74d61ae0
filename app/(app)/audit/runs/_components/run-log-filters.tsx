"use client";
// The run log's filters: a GET form whose address holds the whole query, so a filtered log can be bookmarked, sent
// to a colleague and reloaded. With JavaScript the address is written without the blank fields and the page changes
// in place; without, the browser submits the form as it is (blank fields are no filter). The order (sort, dir)
// carries over from the table's headings; a new filter starts again at the first page.
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { SIGN_OFF_LABELS, SIGN_OFF_STATES, runLogHref, type RunListQuery } from "@/lib/domain/schemas/run-log";
import type { RunLogOptions } from "@/lib/use-cases/run-log";
import { SelectField, TextField } from "@/components/ui/field";
import { buttonClasses } from "@/components/ui/button";
import { TimeZoneField } from "../../_components/time-zone-field";

export type RunLogFilterValues = Record<
  "job" | "standard" | "version" | "person" | "outcome" | "pass" | "signOff" | "from" | "to" | "sort" | "dir",
  string
>;
export type RunLogFilterErrors = Partial<Record<keyof RunLogFilterValues | "tz" | "cursor" | "limit", string>>;

export function RunLogFilters({
  values,
  errors,
  options,
  timeZone,
}: {
  values: RunLogFilterValues;
  errors: RunLogFilterErrors;
  options: RunLogOptions;
  timeZone?: string;
}) {
  const router = useRouter();
  const [standard, setStandard] = useState(values.standard);
  const versions = options.standards.find((s) => s.slug === standard)?.versions ?? [];

  return (
    <form
      method="get"
      action="/audit/runs"
      role="search"
      aria-label="Filter the run log"
      data-testid="run-log-filters"
      className="mb-6 grid grid-cols-2 items-start gap-x-4 gap-y-3 rounded-plate bg-paper-raised p-4 shadow-sheet ring-1 ring-ink-200 sm:grid-cols-4 lg:grid-cols-6"
      onSubmit={(event) => {
        event.preventDefault();
        const form = Object.fromEntries(new FormData(event.currentTarget)) as Record<string, string>;
        router.push(runLogHref({ ...form, limit: undefined } as Partial<RunListQuery>));
      }}
    >
      <TextField
        label="Job number"
        name="job"
        defaultValue={values.job}
        list="run-log-jobs"
        autoComplete="off"
        error={errors.job}
        className="col-span-2 sm:col-span-1"
        data-testid="run-log-filter-job"
      />
      <datalist id="run-log-jobs">
        {options.jobs.map((job) => (
          <option key={job.jobNumber} value={job.jobNumber}>
            {job.name}
          </option>
        ))}
      </datalist>
      <SelectField
        label="Standard"
        name="standard"
        value={standard}
        onChange={(event) => setStandard(event.target.value)}
        error={errors.standard}
        className="col-span-2"
        data-testid="run-log-filter-standard"
      >
        <option value="">Every standard</option>
        {options.standards.map((s) => (
          <option key={s.slug} value={s.slug}>
            {s.title} ({s.slug})
          </option>
        ))}
      </SelectField>
      <SelectField
        label="Version"
        name="version"
        defaultValue={values.version}
        key={standard}
        error={errors.version}
        data-testid="run-log-filter-version"
      >
        <option value="">{standard ? "Every version" : "Any"}</option>
        {(standard ? versions : [...new Set(options.standards.flatMap((s) => s.versions))].sort((a, b) => a - b)).map((n) => (
          <option key={n} value={n}>
            v{n}
          </option>
        ))}
      </SelectField>
      <SelectField
        label="Frame engine"
        name="outcome"
        defaultValue={values.outcome}
        error={errors.outcome}
        data-testid="run-log-filter-outcome"
      >
        <option value="">Any</option>
        <option value="succeeded">Analysed</option>
        <option value="failed">Failed (not analysed)</option>
      </SelectField>
      <SelectField label="Checks" name="pass" defaultValue={values.pass} error={errors.pass} data-testid="run-log-filter-pass">
        <option value="">Any</option>
        <option value="true">Every check passes</option>
        <option value="false">A check fails</option>
      </SelectField>
      <SelectField
        label="Sign-off"
        name="signOff"
        defaultValue={values.signOff}
        error={errors.signOff}
        data-testid="run-log-filter-sign-off"
      >
        <option value="">Any</option>
        {SIGN_OFF_STATES.map((state) => (
          <option key={state} value={state}>
            {SIGN_OFF_LABELS[state]}
          </option>
        ))}
      </SelectField>
      <SelectField
        label="Run by"
        name="person"
        defaultValue={values.person}
        error={errors.person}
        className="col-span-2 sm:col-span-1 lg:col-span-2"
        data-testid="run-log-filter-person"
      >
        <option value="">Anyone</option>
        {options.people.map((person) => (
          <option key={person.id} value={person.id}>
            {person.name} ({person.email}){person.deactivated ? " — deactivated" : ""}
          </option>
        ))}
      </SelectField>
      <TextField
        type="date"
        label="From"
        name="from"
        defaultValue={values.from}
        error={errors.from}
        data-testid="run-log-filter-from"
      />
      <TextField type="date" label="To" name="to" defaultValue={values.to} error={errors.to} data-testid="run-log-filter-to" />
      <input type="hidden" name="sort" value={values.sort} />
      <input type="hidden" name="dir" value={values.dir} />
      <div className="col-span-2 flex items-center gap-3 self-end lg:col-span-1">
        <button type="submit" className={buttonClasses("primary")} data-testid="run-log-filter-submit">
          Filter
        </button>
        <Link
          href="/audit/runs"
          className="text-sm font-medium text-plate-700 hover:underline"
          data-testid="run-log-filter-clear"
        >
          Clear
        </Link>
      </div>
      <div className="col-span-2 sm:col-span-4 lg:col-span-6">
        <TimeZoneField timeZone={timeZone} />
      </div>
    </form>
  );
}
