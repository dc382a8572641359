/**
 * The contract between the server and the client for datasets, versions, networks and their metrics.
 * Field names of the metadata follow the JSON Schemas in /schemas (study.schema.json, network.schema.json),
 * which say for each property which open-standard term it follows (DataCite, Darwin Core, schema.org).
 */
import type { NullSummary } from "../network/significance";

export type VersionState = "draft" | "submitted" | "changes_requested" | "published" | "declined" | "withdrawn";
export type Licence = "CC0-1.0" | "CC-BY-4.0";
export type InteractionType = "pollination" | "seed-dispersal" | "host-parasitoid" | "predator-prey" | "herbivory" | "other";
export type WeightMeaning = "binary" | "visit-count" | "interaction-frequency" | "biomass" | "other";
/** How far public coordinates are generalised (degrees), for sensitive sites. */
export type CoordinateGeneralisation = "exact" | "0.01" | "0.1" | "1";

export interface Creator {
  name: string;
  orcid?: string;
  affiliation?: string;
}

/** Study-level metadata (one per version). `contactEmail` is never shown publicly. */
export interface StudyMetadata {
  title: string;
  description: string;
  creators: Creator[];
  publication?: { citation: string; doi?: string };
  licence: Licence;
  keywords: string[];
  funding?: string;
  contactEmail: string;
}

export interface Locality {
  placeName: string;
  /** ISO 3166-1 alpha-2 */
  countryCode: string;
  /** WGS84 decimal degrees (Darwin Core decimalLatitude / decimalLongitude); absent when not recorded. */
  decimalLatitude?: number | null;
  decimalLongitude?: number | null;
  /** Darwin Core coordinatePrecision, decimal degrees. */
  coordinatePrecision?: number;
  /** metres above sea level */
  elevation?: number;
  generalisation?: CoordinateGeneralisation;
}

/** Network-level metadata. */
export interface NetworkMetadata {
  name: string;
  interactionType: InteractionType;
  weightMeaning: WeightMeaning;
  /** Bipartite: names of the two levels, e.g. "plants" (rows) / "pollinators" (columns). */
  rowLevel?: string;
  colLevel?: string;
  /** Directed one-mode networks: what a link from row to column means, e.g. "row eats column". */
  directionMeaning?: string;
  locality: Locality;
  /** Absent when not recorded (see notRecorded). */
  habitat?: string;
  /** ISO dates YYYY-MM-DD; absent when not recorded. */
  startDate?: string;
  endDate?: string;
  samplingProtocol: string;
  samplingEffort?: { value: number; unit: string };
  taxonomicResolution?: string;
  /** Fields not known, each with the reason (coordinates, elevation, dates, habitat, samplingEffort). */
  notRecorded?: Partial<Record<"coordinates" | "elevation" | "dates" | "habitat" | "samplingEffort", string>>;
  /** How cells without a number were read (set from the file at upload; see network.schema.json). */
  missingValues?: MissingValuesRecord;
}

export type CellMeaning = "no-interaction" | "not-observed";

export interface MissingValuesRecord {
  markers?: string[];
  markerCells?: number;
  markerMeaning?: CellMeaning;
  blankCells: number;
  blankMeaning: CellMeaning;
}

export type MetricsStatus = "none" | "queued" | "running" | "succeeded" | "failed";

/**
 * The significance figures of one null model (every z, Q_rel, ΔQ and p travels with its model's name): the
 * engine's summary of the null replicates (n, mean, sd, z and its Monte Carlo error, Q_rel, ΔQ, p and its
 * error, whether p is at its floor 1/(n + 1), instability) with the model and the NODF of the same nulls.
 */
export interface NullFigureSummary extends NullSummary {
  /** Engine name of the null model (shared/network/null-models: NULL_MODEL_INFO has its title and what it keeps). */
  model: string;
  /** The primary null of the network's kind (the figure shown first). */
  primary: boolean;
  /** NODF of the same null networks: their mean, the observed NODF's z and p (nulls at least as nested). */
  nodfMean: number | null;
  nodfZ: number | null;
  nodfP: number | null;
}

/** A computation newer than the figures shown (failed, waiting or running). */
export interface NewerRunNote {
  runId: number;
  status: "failed" | "queued" | "running";
  at: string | null;
  /** Curators and admins only: why it failed. */
  error?: string | null;
  /** "configuration": a setting does not fit the network (not retried); "computation": the run broke. */
  errorKind?: "configuration" | "computation" | null;
}

/**
 * The metrics of a network: the latest successful run of the current pipeline settings, else the latest
 * successful run of any settings (the last good figures are never hidden by a failed or newer run), else
 * the active or failed run.
 */
export interface NetworkMetricsSummary {
  status: MetricsStatus;
  runId?: number;
  settingsHash?: string;
  objective?: "newman" | "newman-directed" | "barber";
  Q?: number | null;
  modules?: number | null;
  nullModel?: string | null;
  nullN?: number | null;
  nullMean?: number | null;
  nullSd?: number | null;
  z?: number | null;
  qRel?: number | null;
  deltaQ?: number | null;
  p?: number | null;
  zUnstable?: boolean;
  /** The primary null's Monte Carlo errors and floor flag. */
  zSe?: number | null;
  pSe?: number | null;
  pAtFloor?: boolean;
  /** Every null model's figures, primary first. */
  nulls?: NullFigureSummary[];
  /** False when the figures come from a run of older settings (the current settings have no success yet). */
  currentSettings?: boolean;
  /** A newer computation than the figures shown: failed (figures shown are from `runId`), or still going. */
  newer?: NewerRunNote | null;
  /** Modules holding a linked node (isolated nodes are not counted) and the isolated nodes. */
  isolatedNodes?: number | null;
  nodf?: number | null;
  algorithm?: { name: string; version: string; seed: number; parameters?: Record<string, unknown> };
  startedAt?: string | null;
  finishedAt?: string | null;
  durationMs?: number | null;
  error?: string | null;
}

/** What a network is and its size: the parsed counts stored with every network. */
export interface NetworkShape {
  kind: "bipartite" | "unipartite";
  directed: boolean;
  weighted: boolean;
  nNodes: number;
  nRows: number | null;
  nCols: number | null;
  nLinks: number;
  totalWeight: number;
  connectance: number | null;
}

export interface NetworkSummary extends NetworkShape {
  id: number;
  /** e.g. "TB-000042/v2/3" (null before the first publication) */
  ref: string | null;
  position: number;
  originalName: string;
  format: "matrix" | "edgelist";
  sha256: string;
  size: number;
  metadata: NetworkMetadata;
  warnings: Array<{ code: string; message: string; row?: number; column?: number }>;
  metrics: NetworkMetricsSummary | null;
}

export interface VersionSummary {
  number: number;
  state: VersionState;
  submittedAt: string | null;
  publishedAt: string | null;
  withdrawnAt: string | null;
  networkCount: number;
}

/** A DOI as pages show it: "pending" until DataCite has registered it (then `url` resolves). */
export interface DoiSummary {
  doi: string;
  state: "pending" | "registered";
  /** The resolver URL, e.g. https://doi.org/10.5072/tb-000042.v2 */
  url: string;
}

export interface DatasetDetail {
  id: number;
  accession: string | null;
  /** The version shown */
  version: VersionSummary;
  /** The highest published version number, if any */
  latestPublishedVersion: number | null;
  owner: { id: number; displayName: string };
  metadata: StudyMetadata;
  versions: VersionSummary[];
  networks: NetworkSummary[];
  withdrawal: { at: string; reason: string } | null;
  /** DOIs of the shown version and of the dataset as a whole (the concept DOI: always the latest version); null before publication. */
  dois: { version: DoiSummary | null; concept: DoiSummary | null };
  /** Creators' ORCID iDs (bare, upper case) that a Tanglebank account has verified through ORCID's sign-in. */
  verifiedOrcids: string[];
}
