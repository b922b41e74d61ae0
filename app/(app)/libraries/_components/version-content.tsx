// What a library version holds, by kind: sections as the catalogue table (each designation opens the
// section's drawing and properties), materials with every value's source, load-combination sets with their
// factors per load kind. Withdrawn entries are named first, so nobody picks one unawares.
import type { CombinationSetEntry, LibraryDocument, MaterialEntry } from "@/lib/libraries";
import type { LibraryVersionView } from "@/lib/use-cases/library-reads";
import { CatalogueTable } from "@/components/libraries/catalogue-table";
import { TableFrame } from "@/components/ui/table";
import { Notice } from "@/components/ui/notice";
import { formatSignificant } from "@/lib/standards";

export function entryHref(slug: string, number: number, key: string): string {
  return `/libraries/${encodeURIComponent(slug)}/versions/${number}/entry?key=${encodeURIComponent(key)}`;
}

export function VersionContent({ version }: { version: LibraryVersionView }) {
  const document = version.document as LibraryDocument;
  return (
    <>
      {version.withdrawnEntries.length > 0 ? (
        <Notice tone="fault" testId="withdrawn-entries">
          {version.status === "withdrawn"
            ? "This version is withdrawn: none of its entries may be used in a new run."
            : `Withdrawn from this version, not to be used in a new run: ${version.withdrawnEntries
                .map((entry) => `${entry.key} (${entry.withdrawn?.reason ?? "withdrawn"})`)
                .join("; ")}.`}
        </Notice>
      ) : null}
      {document.kind === "sections" ? (
        <CatalogueTable
          label={`Sections of ${version.title}, version ${version.number}`}
          rows={document.entries.map((entry) => ({
            key: entry.key,
            shape: entry.shape,
            dimensions: entry.dimensions,
            properties: entry.properties,
            href: entryHref(version.slug, version.number, entry.key),
          }))}
        />
      ) : document.kind === "materials" ? (
        <MaterialsTable entries={document.entries} />
      ) : (
        <div className="space-y-8">
          {document.entries.map((set) => (
            <CombinationSet key={set.key} set={set} />
          ))}
        </div>
      )}
    </>
  );
}

/** Pa → MPa, kg/m³ as is, with four significant figures. */
function materialValue(value: { value: number } | undefined, scale: number, unit: string): string {
  return value ? `${formatSignificant(value.value * scale, 4)} ${unit}` : "—";
}

function MaterialsTable({ entries }: { entries: readonly MaterialEntry[] }) {
  return (
    <TableFrame
      testId="materials-table"
      label="Materials"
      headings={["Material", "Family", "E", "G", "fy", "fu", "Density", "Sources"]}
    >
      {entries.map((m) => {
        const sources = [...new Set([m.E, m.G, m.fy, m.fu, m.density].flatMap((v) => (v ? [v.source] : [])))];
        return (
          <tr key={m.key} data-testid="material-row" data-key={m.key} className="align-top">
            <td className="px-4 py-3 font-medium text-ink-900">
              {m.key}
              {m.note ? <p className="max-w-xs text-xs font-normal text-ink-500">{m.note}</p> : null}
            </td>
            <td className="px-4 py-3 text-ink-700">{m.family}</td>
            <td className="px-4 py-3 whitespace-nowrap tabular">{materialValue(m.E, 1e-6, "MPa")}</td>
            <td className="px-4 py-3 whitespace-nowrap tabular">{materialValue(m.G, 1e-6, "MPa")}</td>
            <td className="px-4 py-3 whitespace-nowrap tabular">{materialValue(m.fy, 1e-6, "MPa")}</td>
            <td className="px-4 py-3 whitespace-nowrap tabular">{materialValue(m.fu, 1e-6, "MPa")}</td>
            <td className="px-4 py-3 whitespace-nowrap tabular">{materialValue(m.density, 1, "kg/m³")}</td>
            <td className="px-4 py-3 text-xs text-ink-700">
              <ul className="max-w-sm space-y-1">
                {sources.map((source) => (
                  <li key={source}>{source}</li>
                ))}
              </ul>
            </td>
          </tr>
        );
      })}
    </TableFrame>
  );
}

function CombinationSet({ set }: { set: CombinationSetEntry }) {
  const kinds = set.loadKinds.map((kind) => kind.id);
  return (
    <section aria-labelledby={`set-${set.key}`} data-testid="combination-set" data-key={set.key}>
      <h3 id={`set-${set.key}`} className="text-base font-semibold text-ink-900">
        {set.key}
      </h3>
      <p className="mb-1 text-sm text-ink-700">
        {set.reference} · {set.purpose.replaceAll("-", " ")} ·{" "}
        {set.loadKinds.map((kind) => `${kind.id} ${kind.name.toLowerCase()}`).join(", ")}
      </p>
      {set.note ? <p className="mb-3 max-w-3xl text-xs text-ink-500">{set.note}</p> : null}
      <TableFrame
        testId="combination-table"
        label={`Combinations of ${set.key}`}
        headings={["Combination", "As written", ...kinds]}
      >
        {set.combinations.map((combination) => (
          <tr key={combination.id} data-testid="combination-row">
            <td className="px-4 py-2 font-mono text-xs whitespace-nowrap">{combination.id}</td>
            <td className="px-4 py-2 text-ink-700">{combination.label}</td>
            {kinds.map((kind) => (
              <td key={kind} className="px-4 py-2 text-right whitespace-nowrap tabular">
                {combination.factors[kind] === undefined ? "" : String(combination.factors[kind])}
              </td>
            ))}
          </tr>
        ))}
      </TableFrame>
    </section>
  );
}
