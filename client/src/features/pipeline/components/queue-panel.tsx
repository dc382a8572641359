import { useEffect, useRef } from "react";
import { Alert } from "../../../components/ui/form";
import { useQueue } from "../api/get-queue";
import { formatRate, percentOf, queueSummary } from "../utils/format";

function Bar({ label, done, total, failed }: { label: string; done: number; total: number; failed: number }) {
  const pct = percentOf(done, total);
  return (
    <div>
      <div className="flex justify-between text-sm text-stone-700">
        <span>{label}</span>
        <span>
          {done} of {total}
        </span>
      </div>
      <div
        role="progressbar"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={pct}
        aria-valuetext={`${done} of ${total} networks`}
        className="mt-1 h-3 w-full overflow-hidden rounded-full bg-stone-200"
      >
        <div className="flex h-full">
          <div className="h-full bg-moss-700 transition-all" style={{ width: `${total ? (done / total) * 100 : 100}%` }} />
          <div className="h-full bg-red-700 transition-all" style={{ width: `${total ? (failed / total) * 100 : 0}%` }} />
        </div>
      </div>
    </div>
  );
}

function Count({ label, value, tone }: { label: string; value: number | string; tone?: "bad" }) {
  return (
    <div className="rounded bg-stone-50 px-3 py-2 ring-1 ring-stone-200">
      <dt className="text-xs font-semibold uppercase tracking-wide text-stone-600">{label}</dt>
      <dd className={`text-lg font-bold ${tone === "bad" ? "text-red-800" : "text-stone-900"}`}>{value}</dd>
    </div>
  );
}

/**
 * Networks queued by publishing (not by a batch), e.g. the demo catalogue on the first start: how many have
 * their observed figures (S, L, C, Q) and how many their null-model figures (z, Q_rel, p) already.
 */
export function QueuePanel({ batchRunning = false }: { batchRunning?: boolean }) {
  const queue = useQueue(batchRunning);
  const { refetch } = queue;
  // A batch started or finished: its runs change the overall counts at once.
  const seen = useRef(batchRunning);
  useEffect(() => {
    if (seen.current === batchRunning) return;
    seen.current = batchRunning;
    void refetch();
  }, [batchRunning, refetch]);
  const q = queue.data;
  const u = q?.unbatched;
  const busy = !!u && u.queued + u.running + u.nullsPending > 0;
  return (
    <section aria-labelledby="queue-heading" className="rounded-lg bg-white p-6 shadow-sm ring-1 ring-stone-200">
      <h2 id="queue-heading" className="text-lg font-bold text-moss-700">
        Queue
      </h2>
      {queue.error && <Alert tone="error">{queue.error.message}</Alert>}
      {q && u && (
        <>
          <p className="mt-1 text-stone-800" aria-live="polite">
            {queueSummary(q)}
          </p>
          {busy && (
            <>
              <div className="mt-4 space-y-3">
                <Bar label="Observed figures (S, L, C, Q, NODF)" done={u.observedDone} total={u.total} failed={u.failed} />
                <Bar label="Null-model figures (z, Q_rel, p)" done={u.done} total={u.total} failed={u.failed} />
              </div>
              <dl className="mt-4 grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-6">
                <Count label="Waiting" value={u.queued} />
                <Count label="Computing" value={u.running} />
                <Count label="Nulls pending" value={u.nullsPending} />
                <Count label="Done" value={u.done} />
                <Count label="Failed" value={u.failed} tone={u.failed ? "bad" : undefined} />
                <Count label="Rate" value={formatRate(u.ratePerMinute)} />
              </dl>
            </>
          )}
          <p className="mt-3 text-sm text-stone-600">
            All runs of the current settings, batches included: {q.overall.queued} waiting, {q.overall.running} computing observed figures,{" "}
            {q.overall.nullsPending} with null replicates pending, {q.overall.done} done, {q.overall.failed} failed.
          </p>
        </>
      )}
    </section>
  );
}
