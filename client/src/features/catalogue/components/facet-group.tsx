/** One list filter of the catalogue (a facet): its values with the count each would give. */
import { useState } from "react";
import type { FacetValue } from "../api/get-catalogue";
import { valueLabel, type ListFilter } from "../utils/catalogue-params";

const FILTER_TITLES: Record<ListFilter, string> = {
  interactionType: "Interaction type",
  kind: "Kind",
  weighted: "Weights",
  habitat: "Habitat",
  country: "Country",
  licence: "Licence",
  continent: "Continent",
};

/**
 * One facet's values. A tick shows at once (optimistic): the click is kept locally until the URL (and the
 * next answer) agree, while the counts beside the values are dimmed until fresh counts arrive.
 */
export function FacetGroup({ name, values, chosen, onToggle, stale }: { name: ListFilter; values: FacetValue[]; chosen: string[]; onToggle: (v: string) => void; stale: boolean }) {
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
