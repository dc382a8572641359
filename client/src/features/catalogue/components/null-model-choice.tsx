/** Which null model the z and p columns and the z/p filters use: one for every row, never a mix. */
import { isLiberal, nullInfo, nullLabel } from "../../../components/figures/significance";
import type { CatalogueFacets } from "../api/get-catalogue";
import { DEFAULT_NULL_MODEL } from "../utils/use-catalogue-url";

export function NullModelChoice({ params, facets }: { params: URLSearchParams; facets: CatalogueFacets | undefined }) {
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
