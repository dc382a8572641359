/**
 * The contract of `GET /api/v1/network-views/:accession/:version/:position`: exactly what the network view
 * plots (matrix ordered by module, null distribution, roles) plus the metrics summary and provenance.
 */
import type { DoiSummary, NetworkMetadata, NetworkMetricsSummary, NetworkShape, VersionState } from "./dataset";

export interface ModuleRow {
  module: number;
  /** Bipartite: row nodes in the module; one-mode: nodes in the module. */
  rows: number;
  /** Bipartite: column nodes in the module; one-mode: null. */
  cols: number | null;
  /** Links (non-zero cells) with both ends in the module; an undirected one-mode link counts once. */
  linksInside: number;
  /** Sum of their weights. */
  weightInside: number;
}

export interface RoleRow {
  label: string;
  level: "row" | "col" | null;
  module: number;
  degree: number;
  z: number | null;
  P: number | null;
  role: "peripheral" | "connector" | "module-hub" | "network-hub" | null;
}

export interface NetworkView extends NetworkShape {
  /** e.g. "TB-000042/v2/3" */
  ref: string;
  accession: string;
  version: number;
  /** The version's DOI (pending until DataCite has registered it). */
  doi: DoiSummary | null;
  versionState: VersionState;
  latestPublishedVersion: number | null;
  position: number;
  datasetTitle: string;
  licence: string;
  metadata: NetworkMetadata;
  rowLabels: string[];
  /** One-mode networks: the same as rowLabels. */
  colLabels: string[];
  /** Non-zero cells in compressed sparse rows (the engine's canonical form): row i holds idx/w[ptr[i]..ptr[i+1]). */
  cells: { ptr: number[]; idx: number[]; w: number[] | null };
  metrics: NetworkMetricsSummary;
  /** Node label → module (the engine's labels: a bipartite column sharing a row's label is "label (column)"). */
  partition: Record<string, number> | null;
  /** Module of every row and column, in label order (null without a partition). */
  rowModules: number[] | null;
  colModules: number[] | null;
  modules: ModuleRow[];
  /** Q of each null replicate of the primary null model, when the pipeline kept them. */
  nullQs: number[] | null;
  /** Q of each null replicate per null model (model name → values). */
  nullQsByModel: Record<string, number[]> | null;
  /** Every metrics run of this network, newest first. */
  runHistory: RunHistoryRow[];
  roles: RoleRow[] | null;
  roleThresholds: { z: number; p: number } | null;
  provenance: {
    runId: number | null;
    settingsHash: string | null;
    algorithm: { name: string; version: string; seed: number; parameters?: Record<string, unknown> } | null;
    restarts: { n: number; min: number | null; median: number | null; max: number | null; bestShare: number | null } | null;
    startedAt: string | null;
    finishedAt: string | null;
    durationMs: number | null;
    file: { name: string; sha256: string; size: number; format: "matrix" | "edgelist" };
  };
}

/** One metrics run of a network (the network page's run history). */
export interface RunHistoryRow {
  runId: number;
  status: "queued" | "running" | "succeeded" | "failed" | "superseded";
  /** The run whose figures the page shows. */
  shown: boolean;
  createdAt: string;
  finishedAt: string | null;
  engineVersion: string | null;
  settings: { objective: string; restarts: number; nulls: number; seed: number; nullModels: "standard" | string[] };
  /** The null models this run stored figures for, primary first. */
  nullModelsComputed: string[];
  Q: number | null;
  errorKind: "configuration" | "computation" | null;
  /** Curators and admins only. */
  error?: string | null;
}

/** The compare view plots at most this many networks at once (the API refuses more). */
export const MAX_COMPARE = 60;

/** One light row per network for the compare view: `GET /api/v1/network-views/summaries?refs=…`. */
export interface NetworkCompareRow extends Omit<NetworkShape, "totalWeight"> {
  ref: string;
  datasetTitle: string;
  name: string;
  interactionType: string;
  metrics: NetworkMetricsSummary;
}

/**
 * A reference the compare view cannot plot, said beside the chart while the others are plotted:
 * `malformed` (not written like TB-000042/v2/3), `unknown` (no such published network, or a draft the
 * reader may not see), `withdrawn` (with the version's tombstone).
 */
export interface CompareUnavailable {
  ref: string;
  reason: "malformed" | "unknown" | "withdrawn";
  message: string;
  tombstone?: Tombstone;
}

/** `GET /api/v1/network-views/summaries?refs=…`: rows in the order asked, and the references left out. */
export interface CompareRowsResponse {
  data: NetworkCompareRow[];
  meta: { requested: number; unavailable: CompareUnavailable[] };
}

/** `GET /api/v1/network-views/history/:accession` (curators). */
export interface AuditEntry {
  id: number;
  at: string;
  action: string;
  entityType: string;
  entityId: string;
  actor: { id: number; displayName: string } | null;
  details: Record<string, unknown>;
}

/** A withdrawn version: the body of every 410 answer of the read API (datasets, networks, network views, files). */
export interface Tombstone {
  accession: string;
  version: number;
  citation: string;
  reason: string;
  withdrawnAt: string;
  /** The version's registered DOI: it still resolves, to this tombstone. */
  doi?: string | null;
}

/** One catalogue network on the coverage map: `GET /api/v1/network-views/map?<catalogue filters>`. */
export interface MapPointRow {
  ref: string;
  name: string;
  title: string;
  interactionType: string;
  placeName: string | null;
  countryCode: string | null;
  /** public (generalised) coordinates */
  latitude: number;
  longitude: number;
  nNodes: number;
}
