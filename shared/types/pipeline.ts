/**
 * The contract of the metrics pipeline between the server and the admin page: pipeline settings, batches
 * and their progress, failures.
 */

/** "auto": the engine's default for the network (Barber for bipartite, Leicht–Newman for directed, Newman–Girvan otherwise). */
export type PipelineObjective = "auto" | "newman" | "newman-directed" | "barber";
/** A null model of the engine (shared/network/null-models). */
export type PipelineNullModelName = "curveball" | "probabilistic" | "er" | "totals-connectance" | "patefield" | "weight-shuffle";
/**
 * "standard": each network gets the standard set of its kind of data, fixed degrees (curveball) first as
 * the primary; a list: these models for every network, the first one primary (refused with 422 when one
 * does not fit a published network).
 */
export type PipelineNullModels = "standard" | PipelineNullModelName[];

export interface PipelineSettings {
  objective: PipelineObjective;
  /** Seeded optimizer restarts per network (and per null replicate). */
  restarts: number;
  nullModels: PipelineNullModels;
  /** Null replicates per network and null model (0 = no significance test). */
  nulls: number;
  seed: number;
  annealing: "auto" | "on" | "off";
}

export interface PipelineSettingsResponse {
  settings: PipelineSettings;
  /** sha256 of the canonical settings plus the engine version. */
  settingsHash: string;
  engineVersion: string;
  defaults: PipelineSettings;
}

export interface BatchProgress {
  id: number;
  status: "running" | "finished" | "cancelled";
  settings: PipelineSettings;
  settingsHash: string;
  force: boolean;
  startedBy: { id: number; displayName: string } | null;
  createdAt: string;
  finishedAt: string | null;
  /** Networks queued in this batch. */
  total: number;
  /** Networks left out because a successful run with the same settings existed. */
  skipped: number;
  done: number;
  failed: number;
  running: number;
  queued: number;
  /** Networks finished per minute since the batch started (null before the first). */
  ratePerMinute: number | null;
  /** Seconds left at the current rate (null when unknown). */
  etaSeconds: number | null;
}

/** What "recompute all published networks" would do (shown for confirmation before it starts). */
export interface BatchPreview {
  settings: PipelineSettings;
  settingsHash: string;
  force: boolean;
  /** Published networks. */
  networks: number;
  /** Networks that would be queued (or attached when already waiting). */
  toCompute: number;
  /** Networks already computed with these settings (left out unless forced). */
  skipped: number;
  /** Networks whose run of these settings is already waiting or running. */
  alreadyQueued: number;
  /** Networks that have figures now and would get new ones. */
  figuresChange: number;
  /** Networks without any figures yet. */
  firstFigures: number;
}

export interface RunFailure {
  runId: number;
  networkId: number;
  /** e.g. "TB-000042/v2/3" */
  ref: string | null;
  networkName: string;
  error: string;
  attempts: number;
  finishedAt: string | null;
}

export interface NetworkRunRow {
  runId: number;
  networkId: number;
  ref: string | null;
  networkName: string;
  status: "queued" | "running" | "succeeded" | "failed" | "superseded";
  batchId: number | null;
  settingsHash: string;
  q: number | null;
  z: number | null;
  durationMs: number | null;
  error: string | null;
  createdAt: string;
}

/** Metric runs of the current settings by phase (a run computes observed figures first, then null replicates). */
export interface QueuePhaseCounts {
  /** Waiting for a worker, nothing computed yet. */
  queued: number;
  /** A worker is computing the observed figures. */
  running: number;
  /** Observed figures (S, L, C, Q, NODF) stored; null replicates waiting or being computed. */
  nullsPending: number;
  /** Finished with every figure (including runs found already computed: superseded). */
  done: number;
  failed: number;
  /** All runs counted here. */
  total: number;
  /** Runs with observed figures (nullsPending + done). */
  observedDone: number;
}

export interface QueueProgress {
  settingsHash: string;
  /**
   * Work outside any batch (queued by publishing), from the latest moment the queue of such work was
   * empty: the current wave of newly published networks, or the last one when idle.
   */
  unbatched: QueuePhaseCounts & {
    /** When the current (or last) wave of unbatched work started; null when there was none. */
    since: string | null;
    /** Runs finished per minute over the last few minutes (null before the first). */
    ratePerMinute: number | null;
    /** Seconds until every waiting run is finished at that rate (0 when idle, null when unknown). */
    etaSeconds: number | null;
  };
  /** Every run of the current settings, in batches or not. */
  overall: QueuePhaseCounts;
  /** True while any run of the current settings is waiting or running. */
  active: boolean;
}
