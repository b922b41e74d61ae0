// The library entries a run used, as its record names them: the input, the entry, its library's version and the
// entry's hash (shortened on the run's page, whole on its trace).
import type { RunRecordEntry } from "@/lib/standards/run-record";

export function LibraryEntriesUsed({
  entries,
  testId,
  wholeHash = false,
}: {
  entries: ReadonlyArray<RunRecordEntry>;
  testId: string;
  wholeHash?: boolean;
}) {
  return (
    <ul data-testid={testId}>
      {entries.map((entry) => (
        <li key={entry.input}>
          <span className="font-mono text-xs">{entry.input}</span>: {entry.key} ({entry.library} v{entry.version},{" "}
          <span className="font-mono text-xs break-all">sha256:{wholeHash ? entry.entryHash : entry.entryHash.slice(0, 12)}</span>
          )
        </li>
      ))}
    </ul>
  );
}
