/**
 * The Catalogue: full-text search, filters with counts per value, range filters, a sortable paginated
 * table (every setting in the URL, so a link reproduces the view), and a selection kept across pages.
 * Actions on the selection or on everything matching (bundles) are passed in by the route.
 */
import { FigureCautions, fmtPFloor, fmtZ, isLiberal, nullInfo, nullLabel } from "../../../components/figures/significance";
import { useMemo, useState, type ReactNode } from "react";
import { Link, useSearchParams } from "react-router-dom";
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { Alert, Button } from "../../../components/ui/form";
import { paths } from "../../../config/paths";
import { useCatalogue, type CatalogueFacets, type CatalogueRow, type FacetValue } from "../api/get-catalogue";
import {
  CATALOGUE_PAGE_SIZES,
  LIST_FILTERS,
  PAGE_SIZE,
  RANGE_FILTERS,
  filterOnly,
  hasFilters,
  listValues,
  rangeProblems,
  rangeProblemsFromApi,
  toggleValue,
  valueLabel,
  withParams,
  type ListFilter,
} from "../utils/catalogue-params";
import { SEARCH_EXAMPLE } from "@shared/types/catalogue";
import { MAX_COMPARE } from "@shared/types/network-view";
import { ApiClientError } from "../../../lib/api-client";
import { useSelection } from "../utils/selection";
import { NOT_RECORDED_LABELS, type NotRecordedField } from "@shared/validation/not-recorded";

export interface CatalogueActionsContext {
  /** Selected network references, across pages. */
  selected: string[];
  /** The current filters (no paging or sorting): "everything matching". */
  filter: URLSearchParams;
  /** How many networks match the filters. */
  total: number;
  clearSelection: () => void;
  /** Takes these references out of the selection. */
  dropFromSelection: (refs: string[]) => void;
}

const FILTER_TITLES: Record<ListFilter, string> = {
  interactionType: "Interaction type",
  kind: "Kind",
  weighted: "Weights",
  habitat: "Habitat",
  country: "Country",
  licence: "Licence",
  continent: "Continent",
};

const SORT_OF_COLUMN: Record<string, string> = { ref: "accession", title: "title", interactionType: "type", S: "S", C: "C", Q: "Q", z: "z", year: "year" };
const COLUMN_OF_SORT = Object.fromEntries(Object.entries(SORT_OF_COLUMN).map(([c, s]) => [s, c]));

const fmt = (v: number | null, digits: number) => (v === null ? "—" : v.toFixed(digits));

/**
 * One facet's values. A tick shows at once (optimistic): the click is kept locally until the URL (and the
 * next answer) agree, while the counts beside the values are dimmed until fresh counts arrive.
 */
function FacetGroup({ name, values, chosen, onToggle, stale }: { name: ListFilter; values: FacetValue[]; chosen: string[]; onToggle: (v: string) => void; stale: boolean }) {
  const [all, setAll] = useState(false);
  const [pending, setPending] = useState<Record<string, boolean>>({});
  const chosenKey = chosen.join(",");
  const [seenKey, setSeenKey] = useState(chosenKey);
  if (seenKey !== chosenKey) {
    // the URL caught up: forget the local ticks (adjusting state while rendering, as React recommends)
    setSeenKey(chosenKey);
    setPending({});
  }
  const shown = all ? values : values.slice(0, 8);
  // a value just ticked stays listed even if the previous answer's facet did not hold it
  if (!values.length && !chosen.length) return null;
  return (
    <fieldset className="border-t border-stone-200 pt-3">
      <legend className="text-sm font-bold text-stone-800">{FILTER_TITLES[name]}</legend>
      <ul className="mt-1 space-y-1">
        {shown.map((f) => {
          const id = `facet-${name}-${f.value}`;
          const checked = pending[f.value] ?? chosen.includes(f.value);
          return (
            <li key={f.value} className="flex items-center gap-2 text-sm">
              <input
                id={id}
                type="checkbox"
                className="h-4 w-4 accent-moss-700"
                checked={checked}
                onChange={() => {
                  setPending((p) => ({ ...p, [f.value]: !checked }));
                  onToggle(f.value);
                }}
              />
              <label htmlFor={id} className="flex flex-1 justify-between gap-2 text-stone-800">
                <span>{f.label ?? valueLabel(name, f.value)}</span>
                <span className={`tabular-nums ${stale ? "text-stone-400" : "text-stone-600"}`} aria-label={stale ? "count updating" : `${f.count} networks`}>
                  {f.count}
                </span>
              </label>
            </li>
          );
        })}
      </ul>
      {values.length > 8 && (
        <button type="button" className="mt-1 text-sm font-semibold text-moss-700 underline" onClick={() => setAll(!all)}>
          {all ? "Show fewer" : `Show all ${values.length}`}
        </button>
      )}
    </fieldset>
  );
}

function RangeFilters({
  params,
  facets,
  apiProblems,
  onApply,
}: {
  params: URLSearchParams;
  facets: CatalogueFacets | undefined;
  /** Problems the server found in the URL's ranges (a shared link), per range key. */
  apiProblems: Record<string, string>;
  onApply: (next: Record<string, string>) => void;
}) {
  const [problems, setProblems] = useState<Record<string, string>>({});
  const shown = { ...apiProblems, ...problems };
  return (
    <form
      key={params.toString()}
      aria-label="Range filters"
      className="space-y-3 border-t border-stone-200 pt-3"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        const f = new FormData(e.currentTarget);
        const next: Record<string, string> = {};
        for (const r of RANGE_FILTERS) {
          next[r.min] = String(f.get(r.min) ?? "").trim();
          next[r.max] = String(f.get(r.max) ?? "").trim();
        }
        const found = rangeProblems(next);
        setProblems(found);
        if (Object.keys(found).length) {
          // focus the first field in trouble, so keyboard and screen-reader users land on the message
          const first = RANGE_FILTERS.find((r) => found[r.key]);
          e.currentTarget.querySelector<HTMLInputElement>(`#range-${first!.min}`)?.focus();
          return;
        }
        const model = String(f.get("nullModel") ?? "");
        next.nullModel = model === DEFAULT_NULL_MODEL ? "" : model;
        onApply(next);
      }}
    >
      <NullModelChoice params={params} facets={facets} />
      {RANGE_FILTERS.map((r) => {
        const facet = facets?.[r.key];
        const hint = facet && facet.min !== null ? `${+facet.min.toFixed(3)} – ${+facet.max!.toFixed(3)} among matches` : "no values among matches";
        const problem = shown[r.key];
        const errId = `range-${r.key}-error`;
        const look = `w-24 rounded border px-2 py-1 text-sm ${problem ? "border-red-700 ring-1 ring-red-700" : "border-stone-400"}`;
        return (
          <fieldset key={r.key}>
            <legend className="text-sm font-bold text-stone-800">{r.label}</legend>
            <p className="text-xs text-stone-600">{hint}</p>
            <div className="mt-1 flex items-center gap-2">
              <label className="sr-only" htmlFor={`range-${r.min}`}>
                {r.label}: at least
              </label>
              <input
                id={`range-${r.min}`}
                name={r.min}
                type="number"
                step={r.step}
                placeholder="min"
                defaultValue={params.get(r.min) ?? ""}
                aria-invalid={problem ? true : undefined}
                aria-describedby={problem ? errId : undefined}
                className={look}
              />
              <span aria-hidden="true">–</span>
              <label className="sr-only" htmlFor={`range-${r.max}`}>
                {r.label}: at most
              </label>
              <input
                id={`range-${r.max}`}
                name={r.max}
                type="number"
                step={r.step}
                placeholder="max"
                defaultValue={params.get(r.max) ?? ""}
                aria-invalid={problem ? true : undefined}
                aria-describedby={problem ? errId : undefined}
                className={look}
              />
            </div>
            {problem && (
              <p id={errId} className="mt-1 text-xs font-semibold text-red-800">
                {problem}
              </p>
            )}
          </fieldset>
        );
      })}
      <Button className="w-full px-3 py-1.5 text-sm" variant="secondary">
        Apply ranges
      </Button>
    </form>
  );
}

const col = createColumnHelper<CatalogueRow>();

/** The catalogue's null model when the URL names none (the API's default, the primary null of every kind). */
const DEFAULT_NULL_MODEL = "curveball";

/** Which null model the z and p columns and the z/p filters use: one for every row, never a mix. */
function NullModelChoice({ params, facets }: { params: URLSearchParams; facets: CatalogueFacets | undefined }) {
  const chosen = params.get("nullModel") ?? DEFAULT_NULL_MODEL;
  const available = facets?.nullModels ?? [];
  const options = available.some((f) => f.value === chosen) ? available : [{ value: chosen, count: 0 }, ...available];
  return (
    <div>
      <label htmlFor="catalogue-null-model" className="block text-sm font-bold text-stone-800">
        Null model of z and p
      </label>
      <select
        id="catalogue-null-model"
        name="nullModel"
        defaultValue={chosen}
        key={chosen}
        className="mt-1 block w-full rounded border border-stone-400 bg-white px-2 py-1 text-sm"
      >
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {nullLabel(o.value)}
            {isLiberal(o.value) ? ", liberal" : ""} — {o.count} networks
          </option>
        ))}
      </select>
      <p className="mt-1 text-xs text-stone-600">
        One model for every row and filter. {nullInfo(chosen) ? `Keeps ${nullInfo(chosen)!.keeps}.` : ""}
        {isLiberal(chosen) && nullInfo(chosen) ? ` Liberal: ${nullInfo(chosen)!.caution}.` : ""}
      </p>
    </div>
  );
}

export function CataloguePage({ actions }: { actions?: (ctx: CatalogueActionsContext) => ReactNode }) {
  const [params, setParams] = useSearchParams();
  const search = params.toString();
  const catalogue = useCatalogue(search);
  const { selected, toggle, setMany, clear } = useSelection();
  const page = Math.max(1, Number(params.get("page")) || 1);
  const pageSize = Number(params.get("pageSize")) || PAGE_SIZE;
  const total = catalogue.data?.meta.total ?? 0;
  const nullModel = params.get("nullModel") ?? DEFAULT_NULL_MODEL;
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const rows = useMemo(() => catalogue.data?.data ?? [], [catalogue.data]);
  const sort = params.get("sort");
  const sorting: SortingState = sort && COLUMN_OF_SORT[sort] ? [{ id: COLUMN_OF_SORT[sort], desc: params.get("order") === "desc" }] : [];
  const pageRefs = rows.map((r) => r.ref);
  const allOnPage = pageRefs.length > 0 && pageRefs.every((r) => selected.includes(r));

  const update = (p: URLSearchParams) => setParams(p, { replace: false });
  const [filtersOpen, setFiltersOpen] = useState(false);

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
        header: () => (
          <>
            z <span className="font-normal text-stone-600" title={nullLabel(nullModel)}>· {nullModel}</span>
          </>
        ),
        cell: (c) => <span className="whitespace-nowrap">{c.row.original.z === null ? "—" : fmtZ(c.getValue(), c.row.original.zSe)}</span>,
      }),
      col.accessor("p", {
        header: () => (
          <>
            p <span className="font-normal text-stone-600" title={nullLabel(nullModel)}>· {nullModel}</span>
          </>
        ),
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
    onSortingChange: (updater) => {
      const next = typeof updater === "function" ? updater(sorting) : updater;
      const s = next[0];
      update(withParams(params, { sort: s ? SORT_OF_COLUMN[s.id] : undefined, order: s ? (s.desc ? "desc" : "asc") : undefined, page: undefined }));
    },
    getRowId: (r) => r.ref,
  });

  const facets = catalogue.data?.meta.facets;
  const apiProblems = catalogue.error instanceof ApiClientError ? rangeProblemsFromApi(catalogue.error.details) : {};
  const rangeTrouble = Object.keys(apiProblems).length > 0;
  const activeFilters = [...filterOnly(params).keys()].filter((k) => k !== "q" && k !== "nullModel").length;
  const stale = catalogue.isPlaceholderData;
  const setPageSize = (n: number) => {
    // keep the first row of this page on screen
    const first = (page - 1) * pageSize;
    const nextPage = Math.floor(first / n) + 1;
    update(withParams(params, { pageSize: n === PAGE_SIZE ? undefined : String(n), page: nextPage > 1 ? String(nextPage) : undefined }));
  };
  const pageSizeChoice = (where: string) => (
    <label className="flex items-center gap-1.5 text-sm text-stone-700">
      <span>Rows per page</span>
      <select
        aria-label={where === "top" ? "Rows per page" : "Rows per page (below the table)"}
        value={pageSize}
        onChange={(e) => setPageSize(Number(e.target.value))}
        className="rounded border border-stone-400 bg-white px-1.5 py-1 text-sm"
      >
        {[...new Set([...CATALOGUE_PAGE_SIZES, pageSize])].sort((a, b) => a - b).map((n) => (
          <option key={n} value={n}>
            {n}
          </option>
        ))}
      </select>
    </label>
  );
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-2xl font-bold text-moss-700">Catalogue</h1>
          <p className="mt-1 max-w-3xl text-stone-700">
            Every published interaction network, one row each, with its current metrics. Search, filter, select across pages, then bundle or compare. Scripts can use the same filters through the{" "}
            <Link className="font-semibold text-moss-700 underline" to="/api-docs">
              API
            </Link>
            .
          </p>
        </div>
      </div>

      <form
        role="search"
        aria-label="Search the catalogue"
        className="flex flex-wrap items-end gap-3 rounded-lg bg-white p-4 ring-1 ring-stone-200"
        onSubmit={(e) => {
          e.preventDefault();
          const q = String(new FormData(e.currentTarget).get("q") ?? "").trim();
          update(withParams(params, { q, page: undefined, sort: q ? undefined : params.get("sort"), order: q ? undefined : params.get("order") }));
        }}
      >
        <div className="min-w-0 flex-1 basis-56">
          <label htmlFor="catalogue-q" className="block text-sm font-semibold text-stone-800">
            Search titles, descriptions, keywords, creators, places and taxon names
          </label>
          <input
            id="catalogue-q"
            key={params.get("q") ?? ""}
            name="q"
            type="search"
            defaultValue={params.get("q") ?? ""}
            placeholder={`e.g. ${SEARCH_EXAMPLE}`}
            className="mt-1 block w-full rounded border border-stone-400 bg-white px-3 py-2 text-stone-900 focus:border-moss-600 focus:outline-none focus:ring-2 focus:ring-moss-200"
          />
        </div>
        <Button>Search</Button>
        {hasFilters(params) && (
          <Button type="button" variant="secondary" onClick={() => update(new URLSearchParams())}>
            Clear all
          </Button>
        )}
      </form>

      <div className="rounded border-l-4 border-lichen-600 bg-lichen-300/30 p-3 text-sm text-stone-900">
        <p>
          <strong>What the figures control for.</strong> z and p in the table are against one null model, chosen under Filters: now{" "}
          <strong>{nullLabel(nullModel)}</strong>. Networks without figures of that model show “—”.
        </p>
        <FigureCautions modules className="mt-1" />
      </div>

      <div className="grid gap-4 lg:grid-cols-[16rem_1fr]">
        <aside aria-label="Filters" className="self-start rounded-lg bg-white p-4 ring-1 ring-stone-200" aria-busy={stale || undefined}>
          <div className="flex items-center justify-between gap-2">
            <h2 className="text-lg font-bold text-moss-700">Filters</h2>
            <button
              type="button"
              className="rounded border border-moss-700 px-2 py-1 text-sm font-semibold text-moss-700 lg:hidden"
              aria-expanded={filtersOpen || rangeTrouble}
              aria-controls="catalogue-filters"
              onClick={() => setFiltersOpen(!filtersOpen)}
            >
              {filtersOpen || rangeTrouble ? "Hide filters" : `Show filters${activeFilters ? ` (${activeFilters} in use)` : ""}`}
            </button>
          </div>
          <div id="catalogue-filters" className={`mt-3 space-y-3 ${filtersOpen || rangeTrouble ? "" : "hidden"} lg:block`}>
            <p className="text-xs text-stone-600">
              Numbers: networks each value would give with the other filters applied.{stale ? " Updating…" : ""}
            </p>
            {LIST_FILTERS.map((name) => (
              <FacetGroup key={name} name={name} values={facets?.[name] ?? []} chosen={listValues(params, name)} stale={stale} onToggle={(v) => update(toggleValue(params, name, v))} />
            ))}
            <RangeFilters params={params} facets={facets} apiProblems={apiProblems} onApply={(next) => update(withParams(params, { ...next, page: undefined }))} />
            <div className="border-t border-stone-200 pt-3 text-sm" data-testid="area-filter">
              <h3 className="font-bold text-stone-800">Area on the map</h3>
              {params.get("bbox") ? (
                <>
                  <p className="mt-1 text-stone-800">
                    West, south, east, north: <span className="font-mono">{params.get("bbox")!.split(",").join(", ")}</span>
                  </p>
                  <button type="button" className="mt-1 font-semibold text-stone-700 underline" onClick={() => update(withParams(params, { bbox: undefined, page: undefined }))}>
                    Clear area
                  </button>
                </>
              ) : (
                <p className="mt-1 text-xs text-stone-600">None chosen. Continents come from the country code (one continent per country).</p>
              )}
              <Link className="mt-1 block font-semibold text-moss-700 underline" to={`${paths.coverageMap.href()}${filterOnly(params).toString() ? `?${filterOnly(params).toString()}` : ""}`}>
                {params.get("bbox") ? "Change the area on the map" : "Choose an area on the map"}
              </Link>
            </div>
            {facets && facets.notRecorded.length > 0 && (
              <div className="text-sm">
                <h3 className="font-semibold text-stone-800">Not recorded</h3>
                <p className="text-xs text-stone-600">Matching networks whose depositor marked a field unknown (left out of range filters).</p>
                <ul className="mt-1">
                  {facets.notRecorded.map((f) => (
                    <li key={f.value} className="flex justify-between">
                      <span>{NOT_RECORDED_LABELS[f.value as NotRecordedField] ?? f.value}</span>
                      <span className="tabular-nums text-stone-700">{f.count}</span>
                    </li>
                  ))}
                </ul>
              </div>
            )}
          </div>
        </aside>

        <section aria-labelledby="results-heading" className="min-w-0 space-y-3">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <h2 id="results-heading" className="text-lg font-bold text-stone-900" aria-live="polite">
              {catalogue.isError ? "No results" : catalogue.isPending ? "Loading…" : `${total.toLocaleString("en")} network${total === 1 ? "" : "s"}`}
            </h2>
            {pageSizeChoice("top")}
          </div>
          {catalogue.data?.meta.searchMatch === "prefix" && (
            <p className="text-sm text-stone-700" data-testid="search-prefix-note">
              No network has every word of “{params.get("q")}” as a whole word, so these match words that <em>begin</em> with
              yours (e.g. “pollin” finds “pollinator”).
            </p>
          )}
          <div className="flex flex-wrap items-center gap-3 rounded-lg bg-moss-50 p-3 ring-1 ring-moss-200" aria-label="Selection">
            <p className="font-semibold text-moss-900" aria-live="polite" data-testid="selection-count">
              {selected.length} selected
            </p>
            {selected.length > 0 && (
              <>
                <Link className="font-semibold text-moss-700 underline" to={paths.compare.href(selected.slice(0, MAX_COMPARE))}>
                  {selected.length > MAX_COMPARE ? `Compare the first ${MAX_COMPARE} selected` : "Compare selected"}
                </Link>
                <button type="button" className="text-sm font-semibold text-stone-700 underline" onClick={clear}>
                  Clear selection
                </button>
              </>
            )}
            {actions?.({ selected, filter: filterOnly(params), total, clearSelection: clear, dropFromSelection: (refs) => setMany(refs, false) })}
          </div>
          {catalogue.error &&
            (rangeTrouble ? (
              <Alert tone="error" title="These ranges cannot be searched">
                {Object.entries(apiProblems).map(([k, m]) => (
                  <span key={k} className="block">
                    {RANGE_FILTERS.find((r) => r.key === k)!.label}: {m}
                  </span>
                ))}
                <span className="block">Fix them under Filters and apply again.</span>
              </Alert>
            ) : (
              <Alert tone="error">{catalogue.error.message}</Alert>
            ))}
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
                {catalogue.data && rows.length === 0 && (
                  <tr>
                    <td colSpan={columns.length} className="px-4 py-6 text-center text-stone-700">
                      No published network matches. Remove a filter or search for other words.
                    </td>
                  </tr>
                )}
              </tbody>
            </table>
          </div>
          <nav aria-label="Pages of networks" className="flex flex-wrap items-center justify-between gap-2 text-sm text-stone-700">
            <p>
              Page {page} of {pages}
            </p>
            {pageSizeChoice("bottom")}
            <div className="flex gap-2">
              <Button type="button" variant="secondary" className="px-3 py-1.5 text-sm" disabled={page <= 1} onClick={() => update(withParams(params, { page: page - 1 > 1 ? String(page - 1) : undefined }))}>
                Previous page
              </Button>
              <Button type="button" variant="secondary" className="px-3 py-1.5 text-sm" disabled={page >= pages} onClick={() => update(withParams(params, { page: String(page + 1) }))}>
                Next page
              </Button>
            </div>
          </nav>
        </section>
      </div>
    </div>
  );
}
