// The frame every list table shares: a raised sheet, a quiet header row, hairlines between rows.
// Rows are the caller's, so each table keeps its own cells and data-testids.
//
// On a narrow screen a wide table scrolls sideways inside its own box (the page itself never does),
// and its first column — the row's key: a name, a job number, a time — stays put while the rest
// slides under it. The box is `relative` so that visually hidden text inside it (sr-only headings and
// labels are absolutely positioned) is placed inside the box, not against the page, where it would
// widen the page.
/**
 * A heading: its text; or text read only by screen readers; or what to show (a sort link) with the column's sort state,
 * for a table sorted on the server.
 */
export type Heading =
  | string
  | { label: string; hidden: true }
  | { label: string; content: React.ReactNode; sort?: "ascending" | "descending" | "none" };

const STICKY_FIRST_COLUMN =
  "[&_tr>*:first-child]:sticky [&_tr>*:first-child]:left-0 [&_tr>*:first-child]:z-[1] [&_tbody_tr>*:first-child]:bg-paper-raised " +
  "[&_tr>*:first-child]:shadow-[inset_-1px_0_0_var(--color-ink-100)]";

export function TableFrame({
  headings,
  testId,
  label,
  children,
}: {
  headings: Heading[];
  testId: string;
  /** What the table lists, for the scrolling region's name (e.g. "People"). */
  label?: string;
  children: React.ReactNode;
}) {
  return (
    <div
      className="relative overflow-x-auto rounded-plate bg-paper-raised shadow-sheet ring-1 ring-ink-200"
      data-testid={`${testId}-scroll`}
      // A scrolling region must be reachable by keyboard to be scrolled without a mouse.
      tabIndex={0}
      role="region"
      aria-label={label ?? `Table of ${headings.map((h) => (typeof h === "string" ? h : h.label)).join(", ")}`}
    >
      <table className={`w-full text-left text-sm ${STICKY_FIRST_COLUMN}`} data-testid={testId}>
        <thead className="border-b border-ink-200 bg-paper-sunk text-xs font-semibold tracking-wide text-ink-500 uppercase">
          <tr>
            {headings.map((heading) => {
              const label = typeof heading === "string" ? heading : heading.label;
              return (
                <th
                  key={label}
                  scope="col"
                  className="bg-paper-sunk px-4 py-2.5 whitespace-nowrap"
                  aria-sort={typeof heading === "object" && "content" in heading ? heading.sort : undefined}
                >
                  {typeof heading === "string" ? (
                    label
                  ) : "content" in heading ? (
                    heading.content
                  ) : (
                    <span className="sr-only">{label}</span>
                  )}
                </th>
              );
            })}
          </tr>
        </thead>
        <tbody className="divide-y divide-ink-100">{children}</tbody>
      </table>
    </div>
  );
}
