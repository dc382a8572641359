import { useState } from "react";
import { Button } from "../../../components/ui/form";
import { BATCH_PAGE_SIZE, useBatches } from "../api/get-batches";
import { formatDateTime, formatRate, nullModelsShort } from "../utils/format";

/** Every batch, newest first, with its settings and outcome. */
export function BatchHistory({ polling }: { polling: boolean }) {
  const [page, setPage] = useState(1);
  const batches = useBatches(page, polling);
  const total = batches.data?.meta.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / BATCH_PAGE_SIZE));
  return (
    <section aria-labelledby="history-heading" className="rounded-lg bg-white p-6 shadow-sm ring-1 ring-stone-200">
      <h2 id="history-heading" className="text-lg font-bold text-moss-700">
        History of batches
      </h2>
      <div className="mt-3 overflow-x-auto">
        <table className="min-w-full text-left text-sm">
          <caption className="sr-only">Batches, newest first</caption>
          <thead className="border-b border-stone-200 bg-stone-50 text-stone-700">
            <tr>
              <th scope="col" className="px-3 py-2 font-semibold">Batch</th>
              <th scope="col" className="px-3 py-2 font-semibold">Started</th>
              <th scope="col" className="px-3 py-2 font-semibold">Settings</th>
              <th scope="col" className="px-3 py-2 font-semibold">Status</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">Done</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">Failed</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">Total</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">Skipped</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">Rate</th>
            </tr>
          </thead>
          <tbody>
            {batches.data?.data.map((b) => (
              <tr key={b.id} className="border-b border-stone-100 last:border-0">
                <td className="px-3 py-2 font-semibold text-stone-900">#{b.id}</td>
                <td className="px-3 py-2 text-stone-800">
                  {formatDateTime(b.createdAt)}
                  {b.startedBy && <span className="block text-xs text-stone-600">{b.startedBy.displayName}</span>}
                </td>
                <td className="px-3 py-2 text-stone-800">
                  {b.settings.objective}, {b.settings.restarts} restarts, {nullModelsShort(b.settings.nullModels, (b.settings as { nullModel?: string }).nullModel)} × {b.settings.nulls}, seed {b.settings.seed}
                  {b.force ? ", forced" : ""}
                </td>
                <td className="px-3 py-2 text-stone-800">{b.status}</td>
                <td className="px-3 py-2 text-right tabular-nums">{b.done}</td>
                <td className={`px-3 py-2 text-right tabular-nums ${b.failed ? "font-semibold text-red-800" : ""}`}>{b.failed}</td>
                <td className="px-3 py-2 text-right tabular-nums">{b.total}</td>
                <td className="px-3 py-2 text-right tabular-nums">{b.skipped}</td>
                <td className="px-3 py-2 text-right tabular-nums">{formatRate(b.ratePerMinute)}</td>
              </tr>
            ))}
            {batches.data && batches.data.data.length === 0 && (
              <tr>
                <td colSpan={9} className="px-3 py-6 text-center text-stone-700">No batch has been started yet. Networks are computed as they are published.</td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      {pages > 1 && (
        <nav aria-label="Pages of batches" className="mt-3 flex items-center justify-between text-sm text-stone-700">
          <p>
            Page {page} of {pages}
          </p>
          <div className="flex gap-2">
            <Button type="button" variant="secondary" className="px-3 py-1.5 text-sm" disabled={page <= 1} onClick={() => setPage(page - 1)}>
              Previous
            </Button>
            <Button type="button" variant="secondary" className="px-3 py-1.5 text-sm" disabled={page >= pages} onClick={() => setPage(page + 1)}>
              Next
            </Button>
          </div>
        </nav>
      )}
    </section>
  );
}
