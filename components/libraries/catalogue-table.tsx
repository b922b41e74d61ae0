"use client";
// The section catalogue as a table: search by designation, filter by shape, sort by any heading, a page
// of 50 rows at a time (a library may hold 5000 sections; only the page is rendered, so typing in the
// search box stays quick). Two modes: browsing a library (each designation a link or a button) and
// picking one section for a run's input (a radio per row, limited to the shapes the standard accepts).
import { useId, useMemo, useState } from "react";
import {
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getPaginationRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type ColumnFiltersState,
  type FilterFn,
  type SortingState,
} from "@tanstack/react-table";
import { normaliseKey, SECTION_SHAPES, type SectionShape } from "@/lib/libraries";
import { Button } from "@/components/ui/button";
import { SelectField, TextField } from "@/components/ui/field";
import { TextLink } from "@/components/ui/text-link";
import { formatProperty, mainDimensions, propertyDisplay, SHAPE_TITLES } from "./format";

export interface CatalogueTableRow {
  /** The designation, as the library keeps it (a library entry's key). */
  key: string;
  shape: SectionShape;
  /** Metres, as the builder takes them. */
  dimensions: Record<string, unknown>;
  /** SI: the values a run uses (a library entry's `properties`: listed where the catalogue gives them). */
  properties: Record<string, number>;
  /** Where the designation links to, in browsing mode. */
  href?: string;
}

export interface CatalogueTableProps {
  rows: readonly CatalogueTableRow[];
  /** What the table lists, for its accessible name: "Sections of Steel sections v3". */
  label?: string;
  /** "browse" (default): designations link (`href`) or call `onOpen`; "picker": one row is chosen. */
  mode?: "browse" | "picker";
  /** Called with a row's key when its designation is activated (browse mode, rows without `href`). */
  onOpen?: (key: string) => void;
  /** Picker mode: the shapes the standard accepts (all when not given); other rows are not offered. */
  shapes?: readonly SectionShape[];
  /** Picker mode: the key chosen so far. */
  value?: string | null;
  /** Picker mode: called with the chosen row's key. */
  onPick?: (key: string) => void;
  /** Rows per page; 50 unless given. */
  pageSize?: number;
}

const PROPERTY_COLUMNS = ["A", "Ix", "Iy", "Sx", "Zx", "J"] as const;

/** On a phone the table scrolls sideways in its box; the designation stays put, as in the app's other tables. */
const STICKY_DESIGNATION =
  "[&_tr>*:first-child]:sticky [&_tr>*:first-child]:left-0 [&_tr>*:first-child]:z-[1] [&_tbody_tr>*:first-child]:bg-paper-raised [&_thead_tr>*:first-child]:bg-paper-sunk";

const byDesignation: FilterFn<CatalogueTableRow> = (row, _column, search: string) =>
  normaliseKey(row.original.key).includes(normaliseKey(search));

export function CatalogueTable({
  rows,
  label,
  mode = "browse",
  onOpen,
  shapes,
  value,
  onPick,
  pageSize = 50,
}: CatalogueTableProps) {
  const id = useId();
  const picker = mode === "picker";
  const [search, setSearch] = useState("");
  const [shapeFilter, setShapeFilter] = useState<ColumnFiltersState>([]);
  const [sorting, setSorting] = useState<SortingState>([]);

  const offered = useMemo(() => (shapes ? rows.filter((r) => shapes.includes(r.shape)) : rows), [rows, shapes]);
  const shapesPresent = useMemo(() => SECTION_SHAPES.filter((s) => offered.some((r) => r.shape === s)), [offered]);
  const chosen = picker && value ? (offered.find((r) => normaliseKey(r.key) === normaliseKey(value)) ?? null) : null;

  const columns = useMemo<ColumnDef<CatalogueTableRow>[]>(
    () => [
      { id: "designation", header: "Designation", accessorKey: "key", sortingFn: "alphanumeric" },
      {
        id: "shape",
        header: "Shape",
        accessorFn: (r) => SHAPE_TITLES[r.shape],
        filterFn: (row, _column, wanted: string) => row.original.shape === wanted,
      },
      {
        id: "dimensions",
        header: "Dimensions (mm)",
        accessorFn: (r) => mainDimensions(r.shape, r.dimensions),
        enableSorting: false,
      },
      ...PROPERTY_COLUMNS.map((key): ColumnDef<CatalogueTableRow> => ({
        id: key,
        header: `${key} (${propertyDisplay(key).unit})`,
        accessorFn: (r) => r.properties[key],
        sortUndefined: "last",
        sortDescFirst: false,
        cell: (c) => {
          const v = c.getValue<number | undefined>();
          return v === undefined ? "—" : formatProperty(key, v);
        },
      })),
    ],
    [],
  );

  // TanStack Table hands back a new table object each render by design; nothing here memoises on it.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: offered as CatalogueTableRow[],
    columns,
    state: { sorting, globalFilter: search, columnFilters: shapeFilter },
    onSortingChange: setSorting,
    onGlobalFilterChange: setSearch,
    onColumnFiltersChange: setShapeFilter,
    globalFilterFn: byDesignation,
    getColumnCanGlobalFilter: (column) => column.id === "designation",
    getCoreRowModel: getCoreRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getPaginationRowModel: getPaginationRowModel(),
    initialState: { pagination: { pageIndex: 0, pageSize } },
    getRowId: (r) => r.key,
  });

  const matching = table.getFilteredRowModel().rows.length;
  const { pageIndex } = table.getState().pagination;
  const first = matching === 0 ? 0 : pageIndex * pageSize + 1;
  const last = Math.min(matching, (pageIndex + 1) * pageSize);
  const shapeWanted = (shapeFilter.find((f) => f.id === "shape")?.value as string | undefined) ?? "";
  const pick = (key: string) => onPick?.(key);

  return (
    <div className="space-y-3" data-testid="catalogue-table">
      <div className="flex flex-wrap items-end gap-3">
        <TextField
          label="Search designations"
          type="search"
          value={search}
          onChange={(e) => setSearch(e.target.value)}
          className="w-full sm:w-64"
          data-testid="catalogue-search"
        />
        <SelectField
          label="Shape"
          value={shapeWanted}
          onChange={(e) => setShapeFilter(e.target.value ? [{ id: "shape", value: e.target.value }] : [])}
          className="w-full sm:w-56"
          data-testid="catalogue-shape"
        >
          <option value="">{shapes ? "Every shape accepted" : "Every shape"}</option>
          {shapesPresent.map((s) => (
            <option key={s} value={s}>
              {SHAPE_TITLES[s]}
            </option>
          ))}
        </SelectField>
      </div>
      {picker && (
        <p className="text-sm text-ink-700" data-testid="catalogue-chosen">
          {chosen ? (
            <>
              Chosen: <strong className="font-semibold text-ink-900">{chosen.key}</strong>
            </>
          ) : (
            "No section chosen yet."
          )}
          {shapes ? ` This input accepts ${shapes.map((s) => SHAPE_TITLES[s].toLowerCase()).join(", ")} sections.` : ""}
        </p>
      )}
      <p className="text-sm text-ink-500" role="status" data-testid="catalogue-count">
        {matching === 0
          ? search
            ? `No section matches “${search}”.`
            : "No section to show."
          : `Showing ${first}–${last} of ${matching} section${matching === 1 ? "" : "s"}${matching < offered.length ? ` (${offered.length} in all)` : ""}, ${pageSize} to a page.`}
      </p>
      <div
        className="relative overflow-x-auto rounded-plate bg-paper-raised shadow-sheet ring-1 ring-ink-200"
        tabIndex={0}
        role="region"
        aria-label={label ?? "Section catalogue"}
      >
        <table className={`w-full text-left text-sm ${picker ? "" : STICKY_DESIGNATION}`} data-testid="catalogue-table-rows">
          <thead className="border-b border-ink-200 bg-paper-sunk text-xs font-semibold tracking-wide text-ink-500">
            <tr>
              {picker && (
                <th scope="col" className="px-3 py-2.5">
                  <span className="sr-only">Choose</span>
                </th>
              )}
              {table.getFlatHeaders().map((header) => {
                const sorted = header.column.getIsSorted();
                const title = flexRender(header.column.columnDef.header, header.getContext());
                return (
                  <th
                    key={header.id}
                    scope="col"
                    className="px-4 py-2.5 whitespace-nowrap"
                    aria-sort={
                      sorted === "asc"
                        ? "ascending"
                        : sorted === "desc"
                          ? "descending"
                          : header.column.getCanSort()
                            ? "none"
                            : undefined
                    }
                  >
                    {header.column.getCanSort() ? (
                      <button
                        type="button"
                        onClick={header.column.getToggleSortingHandler()}
                        className="inline-flex items-center gap-1 rounded-plate hover:text-ink-900"
                        data-testid={`sort-${header.id}`}
                      >
                        {title}
                        <span aria-hidden="true">{sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}</span>
                        <span className="sr-only">
                          {sorted === "asc" ? ", sorted ascending" : sorted === "desc" ? ", sorted descending" : ", sort"}
                        </span>
                      </button>
                    ) : (
                      title
                    )}
                  </th>
                );
              })}
            </tr>
          </thead>
          <tbody className="divide-y divide-ink-100">
            {table.getRowModel().rows.map((row) => {
              const r = row.original;
              const isChosen = chosen?.key === r.key;
              return (
                <tr
                  key={row.id}
                  data-row={r.key}
                  className={`${isChosen ? "bg-plate-50" : ""} ${picker || onOpen ? "cursor-pointer hover:bg-paper-sunk" : ""}`}
                  onClick={picker ? () => pick(r.key) : onOpen && !r.href ? () => onOpen(r.key) : undefined}
                >
                  {picker && (
                    <td className="px-3 py-2">
                      <input
                        type="radio"
                        name={`${id}-pick`}
                        checked={isChosen}
                        onChange={() => pick(r.key)}
                        onClick={(e) => e.stopPropagation()} // the row's click would pick it again
                        aria-label={`Choose ${r.key}`}
                        className="accent-plate-700"
                      />
                    </td>
                  )}
                  {row.getVisibleCells().map((cell) => (
                    <td
                      key={cell.id}
                      className={`px-4 py-2 whitespace-nowrap ${cell.column.id === "designation" ? "font-medium text-ink-900" : cell.column.id === "shape" || cell.column.id === "dimensions" ? "text-ink-700" : "tabular text-right"}`}
                    >
                      {cell.column.id === "designation" ? (
                        <Designation row={r} browse={!picker} onOpen={onOpen} />
                      ) : (
                        flexRender(cell.column.columnDef.cell, cell.getContext())
                      )}
                    </td>
                  ))}
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      {table.getPageCount() > 1 && (
        <nav className="flex flex-wrap items-center gap-3" aria-label="Pages of the catalogue">
          <Button variant="secondary" size="sm" onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()}>
            Previous page
          </Button>
          <span className="text-sm text-ink-700 tabular">
            Page {pageIndex + 1} of {table.getPageCount()}
          </span>
          <Button variant="secondary" size="sm" onClick={() => table.nextPage()} disabled={!table.getCanNextPage()}>
            Next page
          </Button>
        </nav>
      )}
    </div>
  );
}

function Designation({ row, browse, onOpen }: { row: CatalogueTableRow; browse: boolean; onOpen?: (key: string) => void }) {
  if (browse && row.href) return <TextLink href={row.href}>{row.key}</TextLink>;
  if (browse && onOpen)
    return (
      <button
        type="button"
        className="text-plate-700 underline-offset-2 hover:underline"
        onClick={(e) => {
          e.stopPropagation(); // the row's own click would open it a second time
          onOpen(row.key);
        }}
      >
        {row.key}
      </button>
    );
  return <>{row.key}</>;
}
