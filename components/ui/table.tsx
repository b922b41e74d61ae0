// The frame every list table shares: a raised sheet, a quiet header row, hairlines between rows.
// Rows are the caller's, so each table keeps its own cells and data-testids.
type Heading = string | { label: string; hidden: true };

export function TableFrame({ headings, testId, children }: { headings: Heading[]; testId: string; children: React.ReactNode }) {
  return (
    <div className="overflow-x-auto rounded-plate bg-paper-raised shadow-sheet ring-1 ring-ink-200">
      <table className="w-full text-left text-sm" data-testid={testId}>
        <thead className="border-b border-ink-200 bg-paper-sunk/60 text-xs font-semibold tracking-wide text-ink-500 uppercase">
          <tr>
            {headings.map((heading) => {
              const label = typeof heading === "string" ? heading : heading.label;
              return (
                <th key={label} scope="col" className="px-4 py-2.5 whitespace-nowrap">
                  {typeof heading === "string" ? label : <span className="sr-only">{label}</span>}
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
