/** Display helpers of the metrics pipeline page. */
import type { QueueProgress } from "@shared/types/pipeline";

/** "45 s", "3 min 20 s", "2 h 05 min". */
export function formatDuration(seconds: number | null): string {
  if (seconds === null || !Number.isFinite(seconds)) return "unknown";
  const s = Math.max(0, Math.round(seconds));
  if (s < 60) return `${s} s`;
  if (s < 3600) return `${Math.floor(s / 60)} min ${String(s % 60).padStart(2, "0")} s`;
  return `${Math.floor(s / 3600)} h ${String(Math.floor((s % 3600) / 60)).padStart(2, "0")} min`;
}

export function formatRate(perMinute: number | null): string {
  if (perMinute === null) return "—";
  return perMinute >= 10 ? `${Math.round(perMinute)} / min` : `${perMinute.toFixed(1)} / min`;
}

export function formatDateTime(iso: string | null): string {
  if (!iso) return "—";
  return new Date(iso).toISOString().slice(0, 16).replace("T", " ") + " UTC";
}

/** Share of a batch's networks that are finished (done or failed), 0–100. */
export function percentFinished(done: number, failed: number, total: number): number {
  if (total <= 0) return 100;
  return Math.min(100, Math.round(((done + failed) / total) * 100));
}

/** Share of `part` in `total`, 0–100 (100 when there is nothing to do). */
export function percentOf(part: number, total: number): number {
  if (total <= 0) return 100;
  return Math.min(100, Math.round((part / total) * 100));
}

/** "about 40 s left", "estimating the time left" (no run finished yet), "" when nothing is left. */
export function timeLeftPhrase(etaSeconds: number | null): string {
  if (etaSeconds === 0) return "";
  if (etaSeconds === null) return "estimating the time left";
  return `about ${formatDuration(etaSeconds)} left`;
}

/** One sentence for the newly published networks: progress while they compute, the plain state when idle. */
export function queueSummary(q: QueueProgress): string {
  const u = q.unbatched;
  const waiting = u.queued + u.running + u.nullsPending;
  const failed = u.failed ? ` ${u.failed} failed.` : "";
  if (waiting > 0) {
    const left = timeLeftPhrase(u.etaSeconds);
    return `Newly published networks: ${u.observedDone} of ${u.total} with observed figures, ${u.done} of ${u.total} with null-model figures${left ? ` — ${left}` : ""}.${failed}`;
  }
  const what = u.total === 0 ? "" : ` The last ${u.total === 1 ? "newly published network is" : `${u.total} newly published networks are`} finished.${failed}`;
  if (q.active) return `No newly published network is waiting; the batch below is computing.${what}`;
  return `Nothing is waiting: every queued network has been computed with the current settings.${what}`;
}

/** The null-model setting in a few words (batch lists). */
export function nullModelsShort(models: "standard" | string[] | undefined, legacy?: string): string {
  if (models === "standard" || (!models && legacy === "auto")) return "standard null models";
  if (Array.isArray(models)) return `null models ${models.join(", ")}`;
  return legacy ? `null model ${legacy}` : "null models unknown";
}
