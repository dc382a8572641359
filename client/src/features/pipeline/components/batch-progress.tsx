import { Alert, Button } from "../../../components/ui/form";
import type { BatchProgress } from "@shared/types/pipeline";
import { useBatchFailures } from "../api/get-batch-failures";
import { useRetryBatch } from "../api/retry-batch";
import { formatDateTime, formatDuration, formatRate, nullModelsShort, percentFinished } from "../utils/format";

function Stat({ label, value, tone }: { label: string; value: string; tone?: "bad" }) {
  return (
    <div className="rounded bg-stone-50 px-3 py-2 ring-1 ring-stone-200">
      <dt className="text-xs font-semibold uppercase tracking-wide text-stone-600">{label}</dt>
      <dd className={`text-lg font-bold ${tone === "bad" ? "text-red-800" : "text-stone-900"}`}>{value}</dd>
    </div>
  );
}

function Failures({ batch }: { batch: BatchProgress }) {
  const failures = useBatchFailures(batch.id, batch.status === "running");
  const retry = useRetryBatch();
  const rows = failures.data?.data ?? [];
  if (!rows.length && !retry.error) return null;
  return (
    <section aria-labelledby="failures-heading" className="mt-6">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h3 id="failures-heading" className="font-bold text-stone-900">
          Failures ({rows.length})
        </h3>
        <Button type="button" variant="secondary" className="px-3 py-1.5 text-sm" busy={retry.isPending} onClick={() => retry.mutate(batch.id)}>
          Retry failed networks
        </Button>
      </div>
      {retry.error && <Alert tone="error" title="The retry was not started">{retry.error.message}</Alert>}
      <ul className="mt-2 divide-y divide-stone-100 rounded ring-1 ring-stone-200">
        {rows.map((f) => (
          <li key={f.runId} className="px-3 py-2 text-sm">
            <p className="font-semibold text-stone-900">
              {f.networkName} <span className="font-normal text-stone-600">{f.ref ?? `network ${f.networkId}`}</span>
            </p>
            <p className="mt-0.5 break-words font-mono text-xs text-red-900">{f.error}</p>
            <p className="text-xs text-stone-600">
              {f.attempts} attempt{f.attempts === 1 ? "" : "s"} · {formatDateTime(f.finishedAt)}
            </p>
          </li>
        ))}
      </ul>
    </section>
  );
}

/** The current (or latest) batch: progress bar, counts, rate, time left, failures with a retry button. */
export function BatchProgressCard({ batch }: { batch: BatchProgress }) {
  const pct = percentFinished(batch.done, batch.failed, batch.total);
  const running = batch.status === "running";
  const s = batch.settings;
  return (
    <section aria-labelledby="batch-heading" className="rounded-lg bg-white p-6 shadow-sm ring-1 ring-stone-200">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="batch-heading" className="text-lg font-bold text-moss-700">
          {running ? "Current batch" : "Latest batch"} #{batch.id}
        </h2>
        <p className="text-sm text-stone-700">
          {running ? "Running" : batch.status === "finished" ? "Finished" : "Cancelled"} · started {formatDateTime(batch.createdAt)}
          {batch.startedBy ? ` by ${batch.startedBy.displayName}` : ""}
        </p>
      </div>
      <p className="mt-1 text-sm text-stone-700">
        Objective {s.objective}, {s.restarts} restarts, {nullModelsShort(s.nullModels, (s as { nullModel?: string }).nullModel)} × {s.nulls} replicates, seed {s.seed}, annealing {s.annealing}
        {batch.force ? ", forced" : ""}.
      </p>
      <div className="mt-4">
        <div
          role="progressbar"
          aria-label={`Batch ${batch.id} progress`}
          aria-valuemin={0}
          aria-valuemax={100}
          aria-valuenow={pct}
          aria-valuetext={`${batch.done + batch.failed} of ${batch.total} networks finished`}
          className="h-4 w-full overflow-hidden rounded-full bg-stone-200"
        >
          <div className="flex h-full">
            <div className="h-full bg-moss-700 transition-all" style={{ width: `${batch.total ? (batch.done / batch.total) * 100 : 100}%` }} />
            <div className="h-full bg-red-700 transition-all" style={{ width: `${batch.total ? (batch.failed / batch.total) * 100 : 0}%` }} />
          </div>
        </div>
        <p className="mt-1 text-sm text-stone-700" aria-live="polite">
          {batch.done + batch.failed} of {batch.total} networks finished ({pct}%)
          {batch.running ? ` · ${batch.running} computing now` : ""}
        </p>
      </div>
      <dl className="mt-4 grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-6">
        <Stat label="Done" value={String(batch.done)} />
        <Stat label="Failed" value={String(batch.failed)} tone={batch.failed ? "bad" : undefined} />
        <Stat label="Total" value={String(batch.total)} />
        <Stat label="Skipped" value={String(batch.skipped)} />
        <Stat label="Rate" value={formatRate(batch.ratePerMinute)} />
        <Stat label="Time left" value={running ? formatDuration(batch.etaSeconds) : "—"} />
      </dl>
      {batch.skipped > 0 && (
        <p className="mt-2 text-sm text-stone-600">Skipped networks already had a result for these settings and engine version (tick “Recompute” to redo them).</p>
      )}
      <Failures batch={batch} />
    </section>
  );
}
