/**
 * The catalogue's view as it stands in the URL (a link reproduces it): page, page size, sorting and the
 * null model of z and p, with the setters that write them back as new history entries.
 */
import { useSearchParams } from "react-router-dom";
import type { SortingState } from "@tanstack/react-table";
import { PAGE_SIZE, withParams } from "./catalogue-params";

/** The catalogue's null model when the URL names none (the API's default, the primary null of every kind). */
export const DEFAULT_NULL_MODEL = "curveball";

/** The API's `sort` value of each sortable table column. */
export const SORT_OF_COLUMN: Record<string, string> = { ref: "accession", title: "title", interactionType: "type", S: "S", C: "C", Q: "Q", z: "z", year: "year" };
const COLUMN_OF_SORT = Object.fromEntries(Object.entries(SORT_OF_COLUMN).map(([c, s]) => [s, c]));

export function useCatalogueUrl() {
  const [params, setParams] = useSearchParams();
  const page = Math.max(1, Number(params.get("page")) || 1);
  const pageSize = Number(params.get("pageSize")) || PAGE_SIZE;
  const nullModel = params.get("nullModel") ?? DEFAULT_NULL_MODEL;
  const sort = params.get("sort");
  const sorting: SortingState = sort && COLUMN_OF_SORT[sort] ? [{ id: COLUMN_OF_SORT[sort], desc: params.get("order") === "desc" }] : [];

  const update = (p: URLSearchParams) => setParams(p, { replace: false });
  const setSorting = (next: SortingState) => {
    const s = next[0];
    update(withParams(params, { sort: s ? SORT_OF_COLUMN[s.id] : undefined, order: s ? (s.desc ? "desc" : "asc") : undefined, page: undefined }));
  };
  const setPage = (n: number) => update(withParams(params, { page: n > 1 ? String(n) : undefined }));
  const setPageSize = (n: number) => {
    // keep the first row of this page on screen
    const first = (page - 1) * pageSize;
    const nextPage = Math.floor(first / n) + 1;
    update(withParams(params, { pageSize: n === PAGE_SIZE ? undefined : String(n), page: nextPage > 1 ? String(nextPage) : undefined }));
  };
  return { params, page, pageSize, nullModel, sorting, update, setSorting, setPage, setPageSize };
}
