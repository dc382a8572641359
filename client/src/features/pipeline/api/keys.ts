/** Query keys of the metrics pipeline feature, general to specific. */
export const pipelineKeys = {
  all: ["pipeline"] as const,
  settings: () => [...pipelineKeys.all, "settings"] as const,
  queue: () => [...pipelineKeys.all, "queue"] as const,
  batches: () => [...pipelineKeys.all, "batches"] as const,
  batchList: (page: number) => [...pipelineKeys.batches(), "list", page] as const,
  currentBatch: () => [...pipelineKeys.batches(), "current"] as const,
  failures: (batchId: number) => [...pipelineKeys.batches(), batchId, "failures"] as const,
};

/** While a batch runs, its progress is polled this often. */
export const PROGRESS_POLL_MS = 2000;
/** While nothing waits, the queue is still looked at now and then (networks may be published meanwhile). */
export const QUEUE_IDLE_POLL_MS = 30_000;
