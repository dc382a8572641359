/**
 * The contract of the metrics pipeline between the server and the admin page: pipeline settings, batches
 * and their progress, failures.
 */

/** "auto": the engine's default for the network (Barber for bipartite, Leicht–Newman for directed, Newman–Girvan otherwise). */
export type PipelineObjective = "auto" | "newman" | "newman-directed" | "barber";
/** "auto": Patefield for integer-weighted bipartite/directed data, Erdős–Rényi otherwise (the engine's default). */
export type PipelineNullModel = "auto" | "er" | "curveball" | "patefield";

export interface PipelineSettings {
  objective: PipelineObjective;
  /** Seeded optimizer restarts per network (and per null replicate). */
  restarts: number;
  nullModel: PipelineNullModel;
  /** Null replicates per network (0 = no significance test). */
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
