// The difference between two versions of a standard, for the review screen and the version history:
// the definition's changes as sentences a reviewer reads ("Input `L` default 6 m → 7.5 m"), then the
// source's changed lines with their old and new line numbers, which review comments attach to.
// Renders on the server; the caller computes the diff with diffStandards (lib/standards/diff.ts).
import {
  hunksOf,
  type DiffSection,
  type EntryChange,
  type FieldChange,
  type LineRow,
  type StandardDiff,
} from "@/lib/standards/diff";

const NOUN: Record<DiffSection, string> = {
  metadata: "Field",
  limitations: "Limitation",
  references: "Reference",
  assumptions: "Assumption",
  inputs: "Input",
  derived: "Derived value",
  nodes: "Node",
  members: "Member",
  load_cases: "Load case",
  combinations: "Load combination",
  envelopes: "Envelope",
  extracts: "Extract",
  checks: "Check",
  verification: "Verification case",
  other: "Field",
};

const GROUPS: { title: string; sections: DiffSection[] }[] = [
  { title: "Description", sections: ["metadata", "limitations", "references", "assumptions"] },
  { title: "Inputs", sections: ["inputs"] },
  { title: "Derived values", sections: ["derived"] },
  { title: "Model", sections: ["nodes", "members", "load_cases", "combinations", "envelopes"] },
  { title: "Extracts", sections: ["extracts"] },
  { title: "Checks", sections: ["checks"] },
  { title: "Verification cases", sections: ["verification"] },
  { title: "Other fields", sections: ["other"] },
];

const METADATA_LABEL: Record<string, string> = {
  title: "Title",
  category: "Category",
  tags: "Tags",
  summary: "Summary",
  scope: "Scope",
};

/** Values longer than this are shown as a removed and an added line instead of inline `old → new`. */
const INLINE_LIMIT = 48;

function Code({ children }: { children: React.ReactNode }) {
  return (
    <code className="rounded bg-paper-sunk px-1 py-0.5 font-mono text-[0.85em] text-ink-900 [overflow-wrap:anywhere]">
      {children}
    </code>
  );
}

function Missing() {
  return <span className="text-ink-500 italic">not set</span>;
}

function LineRef({ change }: { change: { oldLine?: number; newLine?: number } }) {
  const parts = [change.oldLine ? `old line ${change.oldLine}` : null, change.newLine ? `new line ${change.newLine}` : null];
  const text = parts.filter(Boolean).join(", ");
  return text ? <span className="ml-1 text-xs whitespace-nowrap text-ink-500 tabular">({text})</span> : null;
}

/** `old → new`, or for long values a removed line and an added line, each marked by its sign and not only by colour. */
function OldNew({ field }: { field: FieldChange }) {
  const long = (field.old?.length ?? 0) > INLINE_LIMIT || (field.new?.length ?? 0) > INLINE_LIMIT;
  if (!long)
    return (
      <>
        {field.old !== undefined ? <Code>{field.old}</Code> : <Missing />} <span aria-label="changed to">→</span>{" "}
        {field.new !== undefined ? <Code>{field.new}</Code> : <Missing />}
      </>
    );
  return (
    <span className="mt-1 block space-y-1">
      <SignedLine sign="−" said="was" value={field.old} />
      <SignedLine sign="+" said="now" value={field.new} />
    </span>
  );
}

function SignedLine({ sign, said, value }: { sign: "+" | "−"; said: string; value: string | undefined }) {
  const [background, text] = sign === "+" ? ["bg-pass-100", "text-pass-700"] : ["bg-fault-100", "text-fault-700"];
  return (
    <span className={`block rounded px-2 py-1 text-ink-900 [overflow-wrap:anywhere] ${background}`}>
      <span aria-hidden="true" className={`mr-1 font-mono font-semibold ${text}`}>
        {sign}
      </span>
      <span className="sr-only">{said}: </span>
      {value ?? <Missing />}
    </span>
  );
}

function FieldList({ fields, side }: { fields: readonly FieldChange[]; side?: "old" | "new" }) {
  return (
    <ul className="mt-1 ml-4 list-disc space-y-0.5 text-ink-700 marker:text-ink-500">
      {fields.map((field) => (
        <li key={field.field}>
          {field.field ? <span className="font-mono text-[0.85em]">{field.field}</span> : null}
          {field.field ? ": " : null}
          {side === "new" ? <Code>{field.new}</Code> : side === "old" ? <Code>{field.old}</Code> : <OldNew field={field} />}
        </li>
      ))}
    </ul>
  );
}

function ChangeItem({ change }: { change: EntryChange }) {
  const metadata = change.section === "metadata";
  const name = metadata ? (
    <span className="font-medium">{METADATA_LABEL[change.key] ?? change.key}</span>
  ) : (
    <>
      {NOUN[change.section]} <Code>{change.key}</Code>
    </>
  );
  const only = change.fields.length === 1 ? change.fields[0] : undefined;
  let body: React.ReactNode;
  if (change.kind === "added" || change.kind === "removed") {
    const side = change.kind === "added" ? "new" : "old";
    body =
      only && only.field === "" ? (
        <>
          {name} {change.kind}: <Code>{only[side]}</Code>
          <LineRef change={change} />
        </>
      ) : (
        <>
          {name} {change.kind}
          <LineRef change={change} />
          <FieldList fields={change.fields} side={side} />
        </>
      );
  } else if (only) {
    body = (
      <>
        {name} {only.field ? <span className="font-mono text-[0.85em]">{only.field}</span> : "changed:"} <OldNew field={only} />
        <LineRef change={only} />
      </>
    );
  } else {
    body = (
      <>
        {name} changed
        <LineRef change={change} />
        <FieldList fields={change.fields} />
      </>
    );
  }
  const mark = change.kind === "added" ? "+" : change.kind === "removed" ? "−" : "~";
  const tone = change.kind === "added" ? "text-pass-700" : change.kind === "removed" ? "text-fault-700" : "text-warn-700";
  return (
    <li className="flex gap-2" data-testid="version-diff-change" data-kind={change.kind}>
      <span aria-hidden="true" className={`w-3 shrink-0 font-mono font-semibold ${tone}`}>
        {mark}
      </span>
      <div className="min-w-0">{body}</div>
    </li>
  );
}

function rangeText(start: number, count: number): string {
  if (count === 0) return `none (after line ${start})`;
  return count === 1 ? `line ${start}` : `lines ${start}–${start + count - 1}`;
}

function LineCells({ row, lineIdPrefix }: { row: LineRow; lineIdPrefix?: string }) {
  const tone = row.kind === "added" ? "bg-pass-100" : row.kind === "removed" ? "bg-fault-100" : "";
  const signTone = row.kind === "added" ? "text-pass-700" : "text-fault-700";
  const id = lineIdPrefix
    ? row.newLine !== undefined
      ? `${lineIdPrefix}-new-${row.newLine}`
      : `${lineIdPrefix}-old-${row.oldLine}`
    : undefined;
  return (
    <tr id={id} className={tone} data-testid="version-diff-line" data-kind={row.kind}>
      <td className="w-px px-2 text-right text-ink-500 tabular select-none">{row.oldLine ?? ""}</td>
      <td className="w-px px-2 text-right text-ink-500 tabular select-none">{row.newLine ?? ""}</td>
      <td className={`w-px px-1 text-center font-semibold select-none ${signTone}`}>
        {row.kind === "same" ? null : (
          <>
            <span aria-hidden="true">{row.kind === "added" ? "+" : "−"}</span>
            <span className="sr-only">{row.kind}</span>
          </>
        )}
      </td>
      <td className="pr-4 pl-1 whitespace-pre text-ink-900">
        {row.text}
        {row.noNewlineAtEnd ? <span className="ml-2 text-ink-500 italic">(no line break at the end of the file)</span> : null}
      </td>
    </tr>
  );
}

export function VersionDiff({
  diff,
  oldLabel,
  newLabel,
  context = 3,
  lineIdPrefix,
  testId = "version-diff",
}: {
  diff: StandardDiff;
  /** What the two sides are called, e.g. "Version 1" and "Version 2" or "Published" and "Draft". */
  oldLabel: string;
  newLabel: string;
  /** Unchanged lines shown around each change; Infinity shows the whole file. */
  context?: number;
  /** Gives each line row an id (`<prefix>-new-12`, `<prefix>-old-7` for a removed line) for links and review comments. */
  lineIdPrefix?: string;
  testId?: string;
}) {
  if (diff.identical)
    return (
      <p className="text-sm text-ink-700" data-testid={testId}>
        {newLabel} and {oldLabel} have the same source: nothing changed.
      </p>
    );
  const structured = diff.structured;
  const hunks = hunksOf(diff.lines, context);
  return (
    <div className="space-y-8 text-sm" data-testid={testId}>
      <section aria-labelledby={`${testId}-definition`} className="space-y-4">
        <h2 id={`${testId}-definition`} className="text-base font-semibold text-ink-950">
          What changed from {oldLabel} to {newLabel}
        </h2>
        {structured.comparable ? (
          <>
            {structured.changes.length === 0 ? (
              <p className="text-ink-700">
                The definition is unchanged{structured.narrativeChanged ? "; only the narrative changed" : ""}.
              </p>
            ) : null}
            {GROUPS.map((group) => {
              const changes = structured.changes.filter((c) => group.sections.includes(c.section));
              if (changes.length === 0) return null;
              return (
                <div key={group.title}>
                  <h3 className="text-xs font-semibold tracking-wide text-ink-500 uppercase">{group.title}</h3>
                  <ul className="mt-2 space-y-2 text-ink-900">
                    {changes.map((change) => (
                      <ChangeItem key={`${change.section}:${change.key}`} change={change} />
                    ))}
                  </ul>
                </div>
              );
            })}
            {structured.narrativeChanged && structured.changes.length > 0 ? (
              <div>
                <h3 className="text-xs font-semibold tracking-wide text-ink-500 uppercase">Narrative</h3>
                <p className="mt-2 text-ink-900">The narrative changed; its lines are below.</p>
              </div>
            ) : null}
          </>
        ) : (
          <div className="rounded-plate bg-warn-100 px-4 py-3 text-warn-700 ring-1 ring-warn-700/20 ring-inset" role="status">
            <p className="font-semibold">The definitions could not be compared field by field.</p>
            <ul className="mt-1 list-disc pl-5">
              {structured.problems.map(({ side, problem }, i) => (
                <li key={i}>
                  {side === "old" ? oldLabel : newLabel}
                  {problem.line ? `, line ${problem.line}` : ""}: {problem.message}
                </li>
              ))}
            </ul>
            <p className="mt-1">Every change is in the lines below.</p>
          </div>
        )}
      </section>

      <section aria-labelledby={`${testId}-lines`} className="space-y-3">
        <h2 id={`${testId}-lines`} className="text-base font-semibold text-ink-950">
          Changed lines
        </h2>
        <p className="text-ink-700">
          <span className="font-mono font-semibold text-pass-700" aria-hidden="true">
            +
          </span>{" "}
          {diff.added} {diff.added === 1 ? "line" : "lines"} added,{" "}
          <span className="font-mono font-semibold text-fault-700" aria-hidden="true">
            −
          </span>{" "}
          {diff.removed} removed.
        </p>
        <div
          className="relative overflow-x-auto rounded-plate bg-paper-raised shadow-sheet ring-1 ring-ink-200"
          // A scrolling region must be reachable by keyboard to be scrolled without a mouse.
          tabIndex={0}
          role="region"
          aria-label={`Changed lines, ${oldLabel} to ${newLabel}`}
          data-testid={`${testId}-lines-scroll`}
        >
          <table className="min-w-full border-collapse font-mono text-xs leading-5">
            <caption className="sr-only">
              Lines of {oldLabel} and {newLabel}: removed lines are marked −, added lines +.
            </caption>
            <thead className="border-b border-ink-200 bg-paper-sunk font-sans text-ink-500">
              <tr>
                <th scope="col" className="px-2 py-1.5 text-right align-bottom font-semibold">
                  {oldLabel}
                </th>
                <th scope="col" className="px-2 py-1.5 text-right align-bottom font-semibold">
                  {newLabel}
                </th>
                <th scope="col" className="px-1 py-1.5">
                  <span className="sr-only">Change</span>
                </th>
                <th scope="col" className="px-1 py-1.5 text-left font-semibold">
                  Text
                </th>
              </tr>
            </thead>
            {hunks.map((hunk) => (
              <tbody key={`${hunk.oldStart}:${hunk.newStart}`} className="border-b border-ink-100 last:border-b-0">
                <tr className="bg-plate-50">
                  <th
                    colSpan={4}
                    scope="rowgroup"
                    className="px-2 py-1 text-left font-sans font-normal whitespace-nowrap text-plate-800"
                  >
                    {oldLabel} {rangeText(hunk.oldStart, hunk.oldCount)} · {newLabel} {rangeText(hunk.newStart, hunk.newCount)}
                  </th>
                </tr>
                {hunk.rows.map((row) => (
                  <LineCells key={`${row.oldLine ?? "-"}:${row.newLine ?? "-"}`} row={row} lineIdPrefix={lineIdPrefix} />
                ))}
              </tbody>
            ))}
          </table>
        </div>
      </section>
    </div>
  );
}
