/**
 * The catalogue's results: one row per network with its current metrics, sortable by the column headers
 * (sorting happens on the server, in the URL), a tick per row and one for the whole page.
 */
import { useMemo } from "react";
import { Link } from "react-router-dom";
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { fmtPFloor, fmtZ, nullLabel } from "../../../components/figures/significance";
import { paths } from "../../../config/paths";
import type { CatalogueRow } from "../api/get-catalogue";
import { SORT_OF_COLUMN } from "../utils/use-catalogue-url";

const col = createColumnHelper<CatalogueRow>();

const fmt = (v: number | null, digits: number) => (v === null ? "—" : v.toFixed(digits));

export function ResultsTable({
  rows,
  loaded,
  selected,
  toggle,
  setMany,
  nullModel,
  sorting,
  setSorting,
  page,
  pages,
}: {
  rows: CatalogueRow[];
  /** An answer has arrived (so no rows means nothing matches, not still loading). */
  loaded: boolean;
  selected: string[];
  toggle: (ref: string) => void;
  setMany: (refs: string[], on: boolean) => void;
  nullModel: string;
  sorting: SortingState;
  setSorting: (next: SortingState) => void;
  page: number;
  pages: number;
}) {
  const pageRefs = rows.map((r) => r.ref);
  const allOnPage = pageRefs.length > 0 && pageRefs.every((r) => selected.includes(r));

  const columns = useMemo(
    () => [
      col.display({
        id: "select",
        header: () => (
          <input
            type="checkbox"
            className="h-4 w-4 accent-moss-700"
            aria-label="Select every network on this page"
            checked={allOnPage}
            onChange={(e) => setMany(pageRefs, e.target.checked)}
          />
        ),
        cell: (c) => (
          <input
            type="checkbox"
            className="h-4 w-4 accent-moss-700"
            aria-label={`Select ${c.row.original.ref}`}
            checked={selected.includes(c.row.original.ref)}
            onChange={() => toggle(c.row.original.ref)}
          />
        ),
      }),
      col.accessor("ref", {
        header: "Network",
        cell: (c) => (
          <Link className="font-semibold whitespace-nowrap text-moss-700 underline" to={paths.dataset.href(c.row.original.accession)}>
            {c.getValue()}
          </Link>
        ),
      }),
      col.accessor("title", {
        header: "Title",
        cell: (c) => (
          <span className="block min-w-48">
            <span className="text-stone-900">{c.getValue()}</span>
            <span className="block text-xs text-stone-600">{c.row.original.name}</span>
          </span>
        ),
      }),
      col.accessor("interactionType", { header: "Interaction", cell: (c) => (c.getValue() ?? "—").replace(/-/g, " ") }),
      col.accessor("kind", { header: "Kind", enableSorting: false, cell: (c) => `${c.getValue()}${c.row.original.directed ? ", directed" : ""}${c.row.original.weighted ? ", weighted" : ""}` }),
      col.accessor("S", { header: "S", cell: (c) => c.getValue() }),
      col.accessor("C", { header: "C", cell: (c) => fmt(c.getValue(), 3) }),
      col.accessor("Q", { header: "Q", cell: (c) => fmt(c.getValue(), 3) }),
      col.accessor("z", {
        header: () => <NullModelHeader figure="z" nullModel={nullModel} />,
        cell: (c) => <span className="whitespace-nowrap">{c.row.original.z === null ? "—" : fmtZ(c.getValue(), c.row.original.zSe)}</span>,
      }),
      col.accessor("p", {
        header: () => <NullModelHeader figure="p" nullModel={nullModel} />,
        enableSorting: false,
        cell: (c) => <span className="whitespace-nowrap">{fmtPFloor(c.getValue(), c.row.original.pAtFloor)}</span>,
      }),
      col.accessor("country", { header: "Country", enableSorting: false, cell: (c) => c.getValue() ?? "—" }),
      col.accessor((r) => r.startYear, {
        id: "year",
        header: "Year",
        cell: (c) => (c.row.original.startYear === null ? "—" : c.row.original.endYear && c.row.original.endYear !== c.row.original.startYear ? `${c.row.original.startYear}–${c.row.original.endYear}` : String(c.row.original.startYear)),
      }),
    ],
    [selected, allOnPage, pageRefs, setMany, toggle, nullModel],
  );

  const table = useReactTable({
    data: rows,
    columns,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    // first click ascending, second descending, third back to the default order
    sortDescFirst: false,
    pageCount: pages,
    state: { sorting },
    onSortingChange: (updater) => setSorting(typeof updater === "function" ? updater(sorting) : updater),
    getRowId: (r) => r.ref,
  });

  return (
    <div className="relative overflow-x-auto rounded-lg bg-white ring-1 ring-stone-200" data-testid="catalogue-table-box">
      <table className="min-w-full text-left text-sm">
        <caption className="sr-only">Published networks, page {page} of {pages}</caption>
        <thead className="border-b border-stone-200 bg-stone-50 text-stone-700">
          {table.getHeaderGroups().map((hg) => (
            <tr key={hg.id}>
              {hg.headers.map((h) => {
                const sortable = h.column.id in SORT_OF_COLUMN;
                const dir = h.column.getIsSorted();
                return (
                  <th key={h.id} scope="col" className="px-3 py-2 font-semibold whitespace-nowrap" aria-sort={dir === "asc" ? "ascending" : dir === "desc" ? "descending" : undefined}>
                    {sortable ? (
                      <button type="button" className="inline-flex items-center gap-1 font-semibold hover:text-moss-700" onClick={h.column.getToggleSortingHandler()}>
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        <span aria-hidden="true" className="text-xs">
                          {dir === "asc" ? "▲" : dir === "desc" ? "▼" : "↕"}
                        </span>
                        <span className="sr-only">, sort</span>
                      </button>
                    ) : (
                      flexRender(h.column.columnDef.header, h.getContext())
                    )}
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody>
          {table.getRowModel().rows.map((r) => (
            <tr key={r.id} className={`border-b border-stone-100 last:border-0 ${selected.includes(r.id) ? "bg-moss-50" : ""}`}>
              {r.getVisibleCells().map((c) => (
                <td key={c.id} className={`px-3 py-2 align-top ${["S", "C", "Q", "z", "p"].includes(c.column.id) ? "text-right tabular-nums" : ""}`}>
                  {flexRender(c.column.columnDef.cell, c.getContext())}
                </td>
              ))}
            </tr>
          ))}
          {loaded && rows.length === 0 && (
            <tr>
              <td colSpan={columns.length} className="px-4 py-6 text-center text-stone-700">
                No published network matches. Remove a filter or search for other words.
              </td>
            </tr>
          )}
        </tbody>
      </table>
    </div>
  );
}

/** The header of the z or p column, naming the null model the figures are against. */
function NullModelHeader({ figure, nullModel }: { figure: "z" | "p"; nullModel: string }) {
  return (
    <>
      {figure} <span className="font-normal text-stone-600" title={nullLabel(nullModel)}>· {nullModel}</span>
    </>
  );
}
