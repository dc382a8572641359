/** The metrics pipeline's state of a published version now (not at publication), in one sentence. */
export function figuresState(networks: Array<{ metrics: { status: string } | null }>): string {
  const n = networks.length;
  const count = (st: string) => networks.filter((x) => x.metrics?.status === st).length;
  const done = count("succeeded");
  const failed = count("failed");
  const waiting = n - done - failed;
  if (done === n) return `Figures computed for all ${n} network${n === 1 ? "" : "s"}.`;
  return `Figures: ${done} of ${n} computed${waiting ? `, ${waiting} queued or running` : ""}${failed ? `, ${failed} failed (see the metrics pipeline)` : ""}.`;
}
