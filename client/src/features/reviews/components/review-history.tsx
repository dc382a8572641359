/** The submission's history on the review page: every recorded step, oldest first, with its actor and comment. */
import type { HistoryEntry } from "../api/types";
import { historyLabel } from "../utils/history-label";

export function ReviewHistory({ history }: { history: HistoryEntry[] }) {
  return (
    <section aria-labelledby="history-h" className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-stone-200">
      <h2 id="history-h" className="text-xl font-bold text-moss-700">
        History
      </h2>
      <ol className="mt-3 grid gap-1 text-sm">
        {history.map((h) => (
          <li key={h.id}>
            <time dateTime={h.at} className="text-stone-700">{new Date(h.at).toLocaleString()}</time> · {historyLabel(h)}
            {h.actor ? ` by ${h.actor}` : ""}
            {typeof h.details.comment === "string" && h.details.comment ? `: “${h.details.comment}”` : ""}
          </li>
        ))}
      </ol>
    </section>
  );
}
