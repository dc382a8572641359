/** Paging of the catalogue's results: rows per page (above and below the table) and previous/next. */
import { Button } from "../../../components/ui/form";
import { CATALOGUE_PAGE_SIZES } from "../utils/catalogue-params";

export function PageSizeChoice({ where, pageSize, onChange }: { where: "top" | "bottom"; pageSize: number; onChange: (n: number) => void }) {
  return (
    <label className="flex items-center gap-1.5 text-sm text-stone-700">
      <span>Rows per page</span>
      <select
        aria-label={where === "top" ? "Rows per page" : "Rows per page (below the table)"}
        value={pageSize}
        onChange={(e) => onChange(Number(e.target.value))}
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
}

export function ResultsPager({ page, pages, pageSize, setPage, setPageSize }: { page: number; pages: number; pageSize: number; setPage: (n: number) => void; setPageSize: (n: number) => void }) {
  return (
    <nav aria-label="Pages of networks" className="flex flex-wrap items-center justify-between gap-2 text-sm text-stone-700">
      <p>
        Page {page} of {pages}
      </p>
      <PageSizeChoice where="bottom" pageSize={pageSize} onChange={setPageSize} />
      <div className="flex gap-2">
        <Button type="button" variant="secondary" className="px-3 py-1.5 text-sm" disabled={page <= 1} onClick={() => setPage(page - 1)}>
          Previous page
        </Button>
        <Button type="button" variant="secondary" className="px-3 py-1.5 text-sm" disabled={page >= pages} onClick={() => setPage(page + 1)}>
          Next page
        </Button>
      </div>
    </nav>
  );
}
