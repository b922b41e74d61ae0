// One design check as a calc sheet prints it: what is checked, demand against capacity, the utilisation
// (rounded up, so 1.004 shows as 1.01 and fails), pass or fail in words as well as colour, the firm's clause,
// where it governs, and what to do when it fails.
import { showValue, type DisplayUnits } from "@/lib/standards/display-units";
import type { EvaluatedCheck } from "@/lib/standards/evaluate";
import { Badge } from "@/components/ui/badge";

function whereText(check: EvaluatedCheck): string | null {
  const where = check.where;
  if (!where) return null;
  const parts = [
    where.member ? `member ${where.member}` : null,
    where.x !== undefined ? `x = ${where.x.toFixed(2)} m` : null,
    where.node ? `node ${where.node}` : null,
    `under ${where.under}`,
  ];
  const checked = check.sectionsChecked ? ` (governing of ${check.sectionsChecked} sections checked)` : "";
  return `${parts.filter(Boolean).join(", ")}${checked}`;
}

/** `children`: what a page adds under the line (a run's page, the utilisation bar). */
export function CheckLine({
  name,
  check,
  units = "si",
  children,
}: {
  name: string;
  check: EvaluatedCheck;
  /** SI as the standard wrote it (the default), or the demand and capacity in US customary units. */
  units?: DisplayUnits;
  children?: React.ReactNode;
}) {
  const where = whereText(check);
  return (
    <div
      className="my-3 rounded-plate bg-paper-raised p-3 ring-1 ring-ink-200"
      data-testid="check"
      data-name={name}
      data-pass={check.pass ? "true" : "false"}
    >
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <span className="font-semibold text-ink-900">{check.label}</span>
        <span className="flex items-center gap-2">
          <span className="text-sm text-ink-700 tabular" data-testid="check-utilisation">
            utilisation {check.utilisationShown}
          </span>
          <Badge tone={check.pass ? "pass" : "fault"}>{check.pass ? "Pass" : "Fail"}</Badge>
        </span>
      </div>
      <p className="mt-1 text-sm text-ink-700 tabular">
        {showValue(check.demandSI, check.demand, units)} {check.relation === "<=" ? "≤" : "≥"}{" "}
        {showValue(check.capacitySI, check.capacity, units)}
        <span className="text-ink-500"> · {check.clause}</span>
      </p>
      {where ? <p className="text-xs text-ink-500">Governs at {where}</p> : null}
      {!check.pass && check.message ? <p className="mt-1 text-sm text-fault-700">{check.message}</p> : null}
      {children}
    </div>
  );
}
