// What a catalogue file would import, shown before anything is kept: the counts, then every problem by row
// (nothing can be imported while there is one), then each listed value that differs from the builder's by
// more than the tolerance, then the sections themselves. Renders on the server from importCatalogue's result.
import type { CatalogueImport } from "@/lib/libraries";
import { Notice } from "@/components/ui/notice";
import { TableFrame } from "@/components/ui/table";
import { CatalogueTable, type CatalogueTableRow } from "./catalogue-table";
import { formatPercent, formatProperty, propertyDisplay } from "./format";

export interface ImportPreviewProps {
  /** importCatalogue's result for the file and mapping. */
  result: CatalogueImport;
  /** The file's name, for the headings. */
  fileName?: string;
  /** The tolerance the import was run with; 0.01 unless given. */
  tolerance?: number;
  /** Most problems and differences listed (the rest are counted); 500 unless given. */
  limit?: number;
}

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

export function ImportPreview({ result, fileName, tolerance = 0.01, limit = 500 }: ImportPreviewProps) {
  const { problems, differences, rows } = result;
  const percent = formatPercent(tolerance).replace("+", "");
  const problemRows = new Set(problems.map((p) => p.row)).size;
  const differingSections = new Set(differences.map((d) => d.row)).size;
  const sorted = [...problems].sort((a, b) => (a.row ?? 0) - (b.row ?? 0));
  const shapeOfRow = new Map(rows.map((r) => [r.row, r.section.shape]));
  const tableRows: CatalogueTableRow[] = rows.map((r) => ({
    key: r.designation,
    shape: r.section.shape,
    dimensions: r.section.dimensions,
    properties: { ...(r.section.properties as unknown as Record<string, number>), ...(r.listed as Record<string, number>) },
  }));

  return (
    <section className="space-y-6" data-testid="import-preview" aria-label={`Import preview${fileName ? ` of ${fileName}` : ""}`}>
      <dl className="grid grid-cols-2 gap-3 sm:grid-cols-4" data-testid="import-counts">
        <Count label="Sections built" value={rows.length} testId="count-sections" />
        <Count label="Problems" value={problems.length} testId="count-problems" />
        <Count label="Rows with problems" value={problemRows} testId="count-problem-rows" />
        <Count label={`Differences over ${percent}`} value={differences.length} testId="count-differences" />
      </dl>

      {!result.ok ? (
        <Notice tone="fault" title="Nothing is imported until every problem is fixed" testId="import-verdict">
          The file has {plural(problems.length, "problem")}. Correct the file or the column mapping and read it again; the
          sections below are shown only to help you check it.
        </Notice>
      ) : differences.length > 0 ? (
        <Notice tone="warn" title="Nothing is kept yet" testId="import-verdict">
          {plural(differences.length, "listed value")} in {plural(differingSections, "section")} differ from the builder&apos;s by
          more than {percent}. Check each against the catalogue&apos;s source before you import: where a catalogue lists a value,
          runs use the listed one.
        </Notice>
      ) : (
        <Notice tone="pass" title="Every row was built" testId="import-verdict">
          Every listed value agrees with the builder&apos;s within {percent}. Nothing is kept until you import.
        </Notice>
      )}

      {problems.length > 0 && (
        <div className="space-y-2">
          <h3 className="text-base font-semibold text-ink-900">Problems</h3>
          <TableFrame headings={["Row", "Column", "Problem"]} testId="import-problems" label="Problems of the file">
            {sorted.slice(0, limit).map((p, i) => (
              <tr key={i} data-row={p.row ?? "file"}>
                <td className="tabular px-4 py-2 whitespace-nowrap">{p.row ?? "whole file"}</td>
                <td className="px-4 py-2 whitespace-nowrap">{p.column ?? "—"}</td>
                <td className="min-w-72 px-4 py-2 text-fault-700">{p.message}</td>
              </tr>
            ))}
          </TableFrame>
          <More shown={Math.min(limit, problems.length)} total={problems.length} what="problems" />
        </div>
      )}

      {differences.length > 0 && (
        <div className="space-y-2">
          <h3 className="text-base font-semibold text-ink-900">Listed values that differ by more than {percent}</h3>
          <TableFrame
            headings={["Designation", "Row", "Property", "Unit", "Listed", "Computed", "Difference"]}
            testId="import-differences"
            label="Listed values that differ from the builder's"
          >
            {differences.slice(0, limit).map((d) => {
              const shape = shapeOfRow.get(d.row);
              const show = propertyDisplay(d.property, shape);
              return (
                <tr key={`${d.row}-${d.property}`} data-row={d.row} data-property={d.property}>
                  <td className="px-4 py-2 font-medium whitespace-nowrap text-ink-900">{d.designation}</td>
                  <td className="tabular px-4 py-2">{d.row}</td>
                  <td className="px-4 py-2 whitespace-nowrap italic">{show.symbol}</td>
                  <td className="px-4 py-2 whitespace-nowrap text-ink-500">{show.unit || "ratio"}</td>
                  <td className="tabular px-4 py-2 text-right">{formatProperty(d.property, d.listed, shape)}</td>
                  <td className="tabular px-4 py-2 text-right">{formatProperty(d.property, d.computed, shape)}</td>
                  <td className="tabular px-4 py-2 whitespace-nowrap text-warn-700">{formatPercent(d.relativeDifference)}</td>
                </tr>
              );
            })}
          </TableFrame>
          <More shown={Math.min(limit, differences.length)} total={differences.length} what="differences" />
        </div>
      )}

      {rows.length > 0 && (
        <div className="space-y-2">
          <h3 className="text-base font-semibold text-ink-900">Sections the file gives</h3>
          <p className="text-sm text-ink-500">Listed values where the file gives them, the builder&apos;s elsewhere.</p>
          <CatalogueTable rows={tableRows} label={`Sections in ${fileName ?? "the file"}`} />
        </div>
      )}
    </section>
  );
}

function Count({ label, value, testId }: { label: string; value: number; testId: string }) {
  return (
    <div className="rounded-plate bg-paper-raised px-4 py-3 ring-1 ring-ink-200">
      <dt className="text-xs text-ink-500">{label}</dt>
      <dd className="tabular text-xl font-semibold text-ink-900" data-testid={testId}>
        {value}
      </dd>
    </div>
  );
}

function More({ shown, total, what }: { shown: number; total: number; what: string }) {
  if (shown >= total) return null;
  return (
    <p className="text-sm text-ink-500">
      The first {shown} of {total} {what} are listed.
    </p>
  );
}
