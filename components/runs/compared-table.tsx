// Values of two records side by side, each row marked when they differ, with the relative difference of the SI
// values: two runs compared (/runs/compare), and a run's record against its reproduction (the trace).
import { formatRelative, type ComparedValue } from "@/lib/standards/compare-runs";
import { TableFrame } from "@/components/ui/table";

export function ComparedTable<R extends ComparedValue>({
  rows,
  testId,
  headings,
  rowTestId,
  differenceTestId,
  sameWord,
  nameOf,
}: {
  rows: ReadonlyArray<R>;
  testId: string;
  /** The value's heading, then each side's, then the difference's. */
  headings: [string, string, string, string];
  rowTestId: string;
  differenceTestId: string;
  /** What an unchanged row's difference says. */
  sameWord: string;
  /** The row's heading cell: its label and key, and anything else the page adds. */
  nameOf: (row: R) => React.ReactNode;
}) {
  return (
    <TableFrame headings={headings} testId={testId}>
      {rows.map((row) => (
        <tr
          key={`${row.key}:${rowKeyOf(row)}`}
          data-testid={rowTestId}
          data-key={row.key}
          data-changed={row.changed ? "yes" : "no"}
          className={row.changed ? "bg-warn-100/60" : undefined}
        >
          <th scope="row" className="px-4 py-2 text-left font-medium">
            {nameOf(row)}
          </th>
          <td className="px-4 py-2 font-mono text-xs">{row.a ?? "—"}</td>
          <td className="px-4 py-2 font-mono text-xs">{row.b ?? "—"}</td>
          <td className="px-4 py-2 font-mono text-xs" data-testid={differenceTestId}>
            {row.changed ? (row.relative === null ? "differs" : formatRelative(row.relative)) : sameWord}
          </td>
        </tr>
      ))}
    </TableFrame>
  );
}

/** Rows of different groups may share a key (a derived value and a check both called `bending`). */
const rowKeyOf = (row: ComparedValue) => ("group" in row && typeof row.group === "string" ? row.group : "");
