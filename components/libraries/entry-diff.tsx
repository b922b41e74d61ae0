// The difference between two versions of a library, for the version history and a reviewer: entries
// added, removed and changed, each changed value old → new in the units a reader expects (mm, mm², MPa).
// Renders on the server; the words "added", "removed", "changed" carry the meaning, colour only helps.
import type { LibraryDocument, LibraryEntry, SectionShape } from "@/lib/libraries";
import { LIBRARY_KIND_NAMES } from "@/lib/libraries";
import { Badge } from "@/components/ui/badge";
import { TableFrame } from "@/components/ui/table";
import { diffLibraryDocuments, type ValueChange } from "./entry-changes";
import { formatMm, formatNumber, formatPropertyWithUnit, formatSlope, mainDimensions, SHAPE_TITLES } from "./format";

export interface EntryDiffProps {
  /** The earlier version's document; null for a library's first version. */
  before: LibraryDocument | null;
  after: LibraryDocument;
  /** How to name the two versions in the headings: "version 3", "version 4". */
  beforeLabel?: string;
  afterLabel?: string;
}

/** Material values are kept in SI (Pa, kg/m³, 1/K) and read in MPa and kg/m³. */
const MATERIAL_UNITS: Record<string, [number, string]> = {
  E: [1e-6, "MPa"],
  G: [1e-6, "MPa"],
  fy: [1e-6, "MPa"],
  fu: [1e-6, "MPa"],
  density: [1, "kg/m³"],
  alpha: [1, "/K"],
};

/** A changed value as a reader wants it: lengths in mm, properties in their table units, strengths in MPa. */
export function formatChangedValue(kind: LibraryDocument["kind"], path: string, value: unknown, shape?: SectionShape): string {
  if (value === undefined) return "(none)";
  if (typeof value === "string") return `“${value}”`;
  if (typeof value !== "number") return String(value);
  const [head, tail] = path.split(".");
  if (kind === "sections" && head === "dimensions") return tail === "taper" ? formatSlope(value) : `${formatMm(value)} mm`;
  if (kind === "sections" && (head === "properties" || head === "listed")) return formatPropertyWithUnit(tail, value, shape);
  if (kind === "materials" && tail === "value" && head in MATERIAL_UNITS) {
    const [scale, unit] = MATERIAL_UNITS[head];
    return `${formatNumber(value * scale)} ${unit}`;
  }
  return String(Number(value.toPrecision(6)));
}

/** A path as a reader names it: "dimensions.tf" → "tf", "properties.Ix" → "Ix used by runs", "E.value" → "E". */
function describePath(kind: LibraryDocument["kind"], path: string): string {
  if (kind === "materials") return path.replace(/\.value$/, "").replace(/\.source$/, " source");
  if (kind !== "sections") return path;
  const [head, ...rest] = path.split(".");
  const name = rest.join(".");
  if (head === "dimensions") return name;
  if (head === "listed") return `${name} listed`;
  if (head === "properties") return `${name} used by runs`;
  return path;
}

function summary(kind: LibraryDocument["kind"], entry: LibraryEntry): string {
  if (kind === "sections" && "shape" in entry && "dimensions" in entry)
    return `${SHAPE_TITLES[entry.shape]}, ${mainDimensions(entry.shape, entry.dimensions as Record<string, unknown>)} mm`;
  if (kind === "materials" && "family" in entry) return entry.family;
  if (kind === "combinations" && "reference" in entry) return `${entry.combinations.length} combinations, ${entry.reference}`;
  return "";
}

export function EntryDiff({ before, after, beforeLabel = "the earlier version", afterLabel = "this version" }: EntryDiffProps) {
  const diff = diffLibraryDocuments(before, after);
  const kind = diff.kind;
  const noun = LIBRARY_KIND_NAMES[kind].one;
  const nothing = diff.added.length + diff.removed.length + diff.changed.length + diff.document.length === 0;
  return (
    <section className="space-y-5" data-testid="entry-diff" aria-label={`Changes from ${beforeLabel} to ${afterLabel}`}>
      <p className="text-sm text-ink-700" data-testid="entry-diff-counts">
        From {beforeLabel} to {afterLabel}: {diff.added.length} added, {diff.removed.length} removed, {diff.changed.length}{" "}
        changed, {diff.unchanged} unchanged ({LIBRARY_KIND_NAMES[kind].many.toLowerCase()}).
      </p>
      {nothing && <p className="text-sm text-ink-500">Nothing changed.</p>}
      {diff.document.length > 0 && (
        <Changes kind={kind} title="The library" changes={diff.document} testId="entry-diff-document" />
      )}
      <EntryList title={`Added ${noun}s`} tone="pass" word="added" entries={diff.added} kind={kind} testId="entry-diff-added" />
      <EntryList
        title={`Removed ${noun}s`}
        tone="fault"
        word="removed"
        entries={diff.removed}
        kind={kind}
        testId="entry-diff-removed"
      />
      {diff.changed.length > 0 && (
        <div className="space-y-4" data-testid="entry-diff-changed">
          <h3 className="text-base font-semibold text-ink-900">Changed {noun}s</h3>
          {diff.changed.map((c) => (
            <Changes
              key={c.key}
              kind={kind}
              title={c.formerKey ? `${c.key} (was ${c.formerKey})` : c.key}
              changes={c.changes}
              shape={"shape" in c.after ? c.after.shape : undefined}
              testId={`entry-diff-changed-${c.key}`}
            />
          ))}
        </div>
      )}
    </section>
  );
}

function EntryList(props: {
  title: string;
  tone: "pass" | "fault";
  word: string;
  entries: LibraryEntry[];
  kind: LibraryDocument["kind"];
  testId: string;
}) {
  if (props.entries.length === 0) return null;
  return (
    <div className="space-y-2" data-testid={props.testId}>
      <h3 className="text-base font-semibold text-ink-900">{props.title}</h3>
      <ul className="divide-y divide-ink-100 rounded-plate bg-paper-raised ring-1 ring-ink-200">
        {props.entries.map((e) => (
          <li key={e.key} className="flex flex-wrap items-center gap-x-3 gap-y-1 px-4 py-2 text-sm" data-entry={e.key}>
            <Badge tone={props.tone}>{props.word}</Badge>
            <span className="font-medium text-ink-900">{e.key}</span>
            <span className="text-ink-500">{summary(props.kind, e)}</span>
          </li>
        ))}
      </ul>
    </div>
  );
}

function Changes(props: {
  kind: LibraryDocument["kind"];
  title: string;
  changes: ValueChange[];
  shape?: SectionShape;
  testId: string;
}) {
  return (
    <div className="space-y-2" data-testid={props.testId}>
      <h4 className="text-sm font-semibold text-ink-900">
        <Badge tone="warn">changed</Badge> {props.title}
      </h4>
      {props.changes.length > 0 && (
        <TableFrame headings={["Value", "Before", "After"]} testId={`${props.testId}-table`} label={`Changes to ${props.title}`}>
          {props.changes.map((c) => (
            <tr key={c.path} data-path={c.path}>
              <td className="px-4 py-2 font-mono text-xs whitespace-nowrap text-ink-700">{describePath(props.kind, c.path)}</td>
              <td className="tabular px-4 py-2 text-ink-700">{formatChangedValue(props.kind, c.path, c.before, props.shape)}</td>
              <td className="tabular px-4 py-2 text-ink-900">
                <span aria-hidden="true">→ </span>
                {formatChangedValue(props.kind, c.path, c.after, props.shape)}
              </td>
            </tr>
          ))}
        </TableFrame>
      )}
    </div>
  );
}
