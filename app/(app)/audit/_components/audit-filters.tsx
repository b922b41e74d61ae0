// The trail's filters as a plain GET form: the address it leads to holds the whole query and can be
// bookmarked or sent to a colleague. Values are shown as typed, with any error beneath its field.
import Link from "next/link";
import { AUDIT_ACTION_LABELS, type AuditAction } from "@/lib/domain/audit-actions";
import type { AuditPersonDto } from "@/lib/data/audit";
import { buttonClasses } from "@/components/ui/button";
import { TimeZoneField } from "./time-zone-field";

export type AuditFilterValues = { actor: string; action: string; from: string; to: string; signIns: boolean };
export type AuditFilterErrors = Partial<Record<keyof AuditFilterValues | "tz" | "before" | "limit", string>>;

const ACTIONS = (Object.entries(AUDIT_ACTION_LABELS) as [AuditAction, string][]).sort(([, a], [, b]) => a.localeCompare(b));

const control = (invalid: boolean) =>
  `block w-full rounded-plate bg-paper-raised px-3 py-2 text-sm text-ink-900 ring-1 ring-inset focus:outline-none focus:ring-2 ${
    invalid ? "ring-fault-600 focus:ring-fault-600" : "ring-ink-300 focus:ring-plate-500"
  }`;

function Field({
  id,
  label,
  error,
  className,
  children,
}: {
  id: string;
  label: string;
  error?: string;
  className: string;
  children: React.ReactNode;
}) {
  return (
    <div className={className}>
      <label htmlFor={id} className="mb-1 block text-sm font-medium text-ink-700">
        {label}
      </label>
      {children}
      {error ? (
        <p id={`${id}-error`} className="mt-1 text-sm text-fault-700" data-testid={`${id}-error`}>
          {error}
        </p>
      ) : null}
    </div>
  );
}

type TextFilter = "actor" | "action" | "from" | "to";

/** What every control of the form carries: its id, name, the value shown back, and its error's wiring. */
function controlProps(name: TextFilter, values: AuditFilterValues, errors: AuditFilterErrors) {
  const id = `audit-filter-${name}`;
  const error = errors[name];
  return {
    id,
    name,
    defaultValue: values[name],
    className: control(Boolean(error)),
    ...(error ? { "aria-invalid": true as const, "aria-describedby": `${id}-error` } : {}),
  };
}

export function AuditFilters({
  values,
  errors,
  people,
  timeZone,
}: {
  values: AuditFilterValues;
  errors: AuditFilterErrors;
  people: AuditPersonDto[];
  timeZone?: string;
}) {
  return (
    <form
      method="get"
      action="/audit"
      role="search"
      aria-label="Filter the audit trail"
      data-testid="audit-filters"
      className="mb-6 flex flex-wrap items-start gap-x-4 gap-y-3 rounded-plate bg-paper-raised p-4 shadow-sheet ring-1 ring-ink-200"
    >
      <Field id="audit-filter-actor" label="Who" error={errors.actor} className="w-full sm:w-64">
        <select {...controlProps("actor", values, errors)}>
          <option value="">Everyone</option>
          {people.map((person) => (
            <option key={person.id} value={person.id}>
              {person.name} ({person.email}){person.deactivated ? " — deactivated" : ""}
            </option>
          ))}
        </select>
      </Field>
      <Field id="audit-filter-action" label="What" error={errors.action} className="w-full sm:w-60">
        <select {...controlProps("action", values, errors)}>
          <option value="">Every action</option>
          {ACTIONS.map(([action, label]) => (
            <option key={action} value={action}>
              {label}
            </option>
          ))}
        </select>
      </Field>
      {(["from", "to"] as const).map((name) => (
        <Field
          key={name}
          id={`audit-filter-${name}`}
          label={name === "from" ? "From" : "To"}
          error={errors[name]}
          className="w-[calc(50%-0.5rem)] sm:w-40"
        >
          <input type="date" {...controlProps(name, values, errors)} />
        </Field>
      ))}
      {/* A line of its own, so the controls above keep their widths and this never strays. */}
      <div className="flex basis-full flex-wrap items-center gap-x-6 gap-y-3">
        <label className="flex items-center gap-2 text-sm text-ink-700">
          <input
            type="checkbox"
            name="signIns"
            value="1"
            defaultChecked={values.signIns}
            className="h-4 w-4 accent-plate-700"
            data-testid="audit-filter-sign-ins"
          />
          Show sign-ins
        </label>
        <div className="flex items-center gap-3">
          <button type="submit" className={buttonClasses("primary")} data-testid="audit-filter-submit">
            Filter
          </button>
          <Link href="/audit" className="text-sm font-medium text-plate-700 hover:underline" data-testid="audit-filter-clear">
            Clear
          </Link>
        </div>
      </div>
      <TimeZoneField timeZone={timeZone} />
    </form>
  );
}
