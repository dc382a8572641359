/**
 * The catalogue's range filters (year, size, connectance, Q, z, p, latitude, elevation) and the null model
 * of z and p, applied together. Typed values are checked before they reach the URL; problems the server
 * found in a shared link show beside their fields too.
 */
import { useState } from "react";
import { Button } from "../../../components/ui/form";
import type { CatalogueFacets } from "../api/get-catalogue";
import { RANGE_FILTERS, rangeProblems, type RangeFilter } from "../utils/catalogue-params";
import { DEFAULT_NULL_MODEL } from "../utils/use-catalogue-url";
import { NullModelChoice } from "./null-model-choice";

export function RangeFilters({
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
        return (
          <fieldset key={r.key}>
            <legend className="text-sm font-bold text-stone-800">{r.label}</legend>
            <p className="text-xs text-stone-600">{hint}</p>
            <div className="mt-1 flex items-center gap-2">
              <RangeBound range={r} side="min" params={params} problem={problem} />
              <span aria-hidden="true">–</span>
              <RangeBound range={r} side="max" params={params} problem={problem} />
            </div>
            {problem && (
              <p id={`range-${r.key}-error`} className="mt-1 text-xs font-semibold text-red-800">
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

/** One end of a range: its hidden label and its number field, marked when the range has a problem. */
function RangeBound({ range, side, params, problem }: { range: RangeFilter; side: "min" | "max"; params: URLSearchParams; problem: string | undefined }) {
  const name = range[side];
  return (
    <>
      <label className="sr-only" htmlFor={`range-${name}`}>
        {range.label}: {side === "min" ? "at least" : "at most"}
      </label>
      <input
        id={`range-${name}`}
        name={name}
        type="number"
        step={range.step}
        placeholder={side}
        defaultValue={params.get(name) ?? ""}
        aria-invalid={problem ? true : undefined}
        aria-describedby={problem ? `range-${range.key}-error` : undefined}
        className={`w-24 rounded border px-2 py-1 text-sm ${problem ? "border-red-700 ring-1 ring-red-700" : "border-stone-400"}`}
      />
    </>
  );
}
