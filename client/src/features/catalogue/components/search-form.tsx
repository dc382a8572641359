/** The catalogue's full-text search box; a new search goes back to page 1 and to ranking by relevance. */
import { SEARCH_EXAMPLE } from "@shared/types/catalogue";
import { Button } from "../../../components/ui/form";
import { hasFilters, withParams } from "../utils/catalogue-params";

export function SearchForm({ params, update }: { params: URLSearchParams; update: (p: URLSearchParams) => void }) {
  return (
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
  );
}
