/**
 * The Catalogue: full-text search, filters with counts per value, range filters, a sortable paginated
 * table (every setting in the URL, so a link reproduces the view), and a selection kept across pages.
 * Actions on the selection or on everything matching (bundles) are passed in by the route.
 */
import { useMemo, type ReactNode } from "react";
import { Link } from "react-router-dom";
import { FigureCautions, nullLabel } from "../../../components/figures/significance";
import { Alert } from "../../../components/ui/form";
import { ApiClientError } from "../../../lib/api-client";
import { useCatalogue } from "../api/get-catalogue";
import { RANGE_FILTERS, filterOnly, rangeProblemsFromApi } from "../utils/catalogue-params";
import { useSelection } from "../utils/selection";
import { useCatalogueUrl } from "../utils/use-catalogue-url";
import { FilterPanel } from "./filter-panel";
import { PageSizeChoice, ResultsPager } from "./results-pager";
import { ResultsTable } from "./results-table";
import { SearchForm } from "./search-form";
import { SearchPrefixNote } from "./search-match-note";
import { SelectionBar, type CatalogueActionsContext } from "./selection-bar";

export type { CatalogueActionsContext } from "./selection-bar";

export function CataloguePage({ actions }: { actions?: (ctx: CatalogueActionsContext) => ReactNode }) {
  const url = useCatalogueUrl();
  const { params, page, pageSize, nullModel, update } = url;
  const catalogue = useCatalogue(params.toString());
  const { selected, toggle, setMany, clear } = useSelection();
  const total = catalogue.data?.meta.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const rows = useMemo(() => catalogue.data?.data ?? [], [catalogue.data]);
  const facets = catalogue.data?.meta.facets;
  const apiProblems = catalogue.error instanceof ApiClientError ? rangeProblemsFromApi(catalogue.error.details) : {};
  const rangeTrouble = Object.keys(apiProblems).length > 0;
  const stale = catalogue.isPlaceholderData;
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

      <SearchForm params={params} update={update} />

      <div className="rounded border-l-4 border-lichen-600 bg-lichen-300/30 p-3 text-sm text-stone-900">
        <p>
          <strong>What the figures control for.</strong> z and p in the table are against one null model, chosen under Filters: now{" "}
          <strong>{nullLabel(nullModel)}</strong>. Networks without figures of that model show “—”.
        </p>
        <FigureCautions modules className="mt-1" />
      </div>

      <div className="grid gap-4 lg:grid-cols-[16rem_1fr]">
        <FilterPanel params={params} facets={facets} stale={stale} apiProblems={apiProblems} update={update} />

        <section aria-labelledby="results-heading" className="min-w-0 space-y-3">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <h2 id="results-heading" className="text-lg font-bold text-stone-900" aria-live="polite">
              {catalogue.isError ? "No results" : catalogue.isPending ? "Loading…" : `${total.toLocaleString("en")} network${total === 1 ? "" : "s"}`}
            </h2>
            <PageSizeChoice where="top" pageSize={pageSize} onChange={url.setPageSize} />
          </div>
          {catalogue.data?.meta.searchMatch === "prefix" && <SearchPrefixNote q={params.get("q") ?? ""} />}
          <SelectionBar context={{ selected, filter: filterOnly(params), total, clearSelection: clear, dropFromSelection: (refs) => setMany(refs, false) }} actions={actions} />
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
          <ResultsTable
            rows={rows}
            loaded={!!catalogue.data}
            selected={selected}
            toggle={toggle}
            setMany={setMany}
            nullModel={nullModel}
            sorting={url.sorting}
            setSorting={url.setSorting}
            page={page}
            pages={pages}
          />
          <ResultsPager page={page} pages={pages} pageSize={pageSize} setPage={url.setPage} setPageSize={url.setPageSize} />
        </section>
      </div>
    </div>
  );
}
