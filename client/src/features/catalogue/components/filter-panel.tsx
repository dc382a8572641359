/**
 * The catalogue's Filters panel: list filters with counts, range filters, the map area and the fields
 * depositors marked not recorded. Folded away on narrow screens unless a range needs fixing.
 */
import { useState } from "react";
import { Link } from "react-router-dom";
import { paths } from "../../../config/paths";
import { NOT_RECORDED_LABELS, type NotRecordedField } from "@shared/validation/not-recorded";
import type { CatalogueFacets } from "../api/get-catalogue";
import { LIST_FILTERS, filterOnly, listValues, toggleValue, withParams } from "../utils/catalogue-params";
import { FacetGroup } from "./facet-group";
import { RangeFilters } from "./range-filters";

export function FilterPanel({
  params,
  facets,
  stale,
  apiProblems,
  update,
}: {
  params: URLSearchParams;
  facets: CatalogueFacets | undefined;
  /** The counts shown are the previous answer's while the next one loads. */
  stale: boolean;
  /** Problems the server found in the URL's ranges, per range key. */
  apiProblems: Record<string, string>;
  update: (p: URLSearchParams) => void;
}) {
  const [filtersOpen, setFiltersOpen] = useState(false);
  const rangeTrouble = Object.keys(apiProblems).length > 0;
  const activeFilters = [...filterOnly(params).keys()].filter((k) => k !== "q" && k !== "nullModel").length;
  return (
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
        <AreaFilter params={params} update={update} />
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
  );
}

/** The area chosen on the coverage map (a bounding box), with the way there and back. */
function AreaFilter({ params, update }: { params: URLSearchParams; update: (p: URLSearchParams) => void }) {
  const bbox = params.get("bbox");
  const filter = filterOnly(params).toString();
  return (
    <div className="border-t border-stone-200 pt-3 text-sm" data-testid="area-filter">
      <h3 className="font-bold text-stone-800">Area on the map</h3>
      {bbox ? (
        <>
          <p className="mt-1 text-stone-800">
            West, south, east, north: <span className="font-mono">{bbox.split(",").join(", ")}</span>
          </p>
          <button type="button" className="mt-1 font-semibold text-stone-700 underline" onClick={() => update(withParams(params, { bbox: undefined, page: undefined }))}>
            Clear area
          </button>
        </>
      ) : (
        <p className="mt-1 text-xs text-stone-600">None chosen. Continents come from the country code (one continent per country).</p>
      )}
      <Link className="mt-1 block font-semibold text-moss-700 underline" to={`${paths.coverageMap.href()}${filter ? `?${filter}` : ""}`}>
        {bbox ? "Change the area on the map" : "Choose an area on the map"}
      </Link>
    </div>
  );
}
