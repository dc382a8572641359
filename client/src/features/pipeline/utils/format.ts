/** Display helpers of the metrics pipeline page. */

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
