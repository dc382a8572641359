/**
 * Reading catalogue rows from the database: one row per network of the latest published version of each
 * dataset (withdrawn versions never; an older published version stays listed when a newer one is
 * withdrawn, as the dataset page shows it), with the
 * network's current metrics: the successful run of the current pipeline settings (at most one per network and
 * settings hash; if several, the latest).
 */
import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "../../db/sequelize";
import { publicCoordinates } from "./catalogue.coordinates";
import type { NullFigureSummary } from "@shared/types/dataset";
import { NOT_RECORDED, notRecordedList, notRecordedText, type NotRecordedField } from "@shared/validation/not-recorded";
import { getPipelineSettings, settingsHash } from "../../pipeline/settings";
import { readNullFigures } from "../../pipeline/null-figures";

/** One null model's figures of a catalogue network: the part of the dataset page's figures a row carries. */
export type CatalogueNullFigures = Pick<NullFigureSummary, "n" | "mean" | "sd" | "z" | "zSe" | "qRel" | "deltaQ" | "p" | "pAtFloor">;

export interface CatalogueEntry {
  networkId: number;
  datasetId: number;
  versionId: number;
  accession: string;
  version: number;
  position: number;
  /** e.g. "TB-000042/v2/3" */
  ref: string;
  name: string;
  title: string;
  licence: string;
  interactionType: string | null;
  kind: "bipartite" | "unipartite";
  directed: boolean;
  weighted: boolean;
  weightMeaning: string | null;
  rowLevel: string | null;
  colLevel: string | null;
  /** The habitat, or "not recorded" when the depositor marked it so. */
  habitat: string | null;
  /** Fields marked not recorded (coordinates, elevation, dates, habitat, samplingEffort). */
  notRecorded: NotRecordedField[];
  /** "Habitat: reason; Sampling dates: reason" for tables. */
  notRecordedText: string;
  countryCode: string | null;
  placeName: string | null;
  /** Public (generalised) coordinates. */
  latitude: number | null;
  longitude: number | null;
  generalisation: string | null;
  elevation: number | null;
  startDate: string | null;
  endDate: string | null;
  startYear: number | null;
  endYear: number | null;
  samplingProtocol: string | null;
  samplingEffortValue: number | null;
  samplingEffortUnit: string | null;
  taxonomicResolution: string | null;
  nNodes: number;
  nRows: number | null;
  nCols: number | null;
  nLinks: number;
  totalWeight: number;
  connectance: number | null;
  publishedAt: string | null;
  runId: number | null;
  settingsHash: string | null;
  objective: string | null;
  q: number | null;
  modules: number | null;
  /** True when the figures come from the current settings (false: the last good run of older settings). */
  currentSettings: boolean;
  nodf: number | null;
  algorithmName: string | null;
  algorithmVersion: string | null;
  seed: number | null;
  /** The primary null model of the run. */
  primaryNull: string | null;
  /** Figures per null model (model name → figures). */
  nulls: Record<string, CatalogueNullFigures>;
}

/** Text fields for the search index (not kept in the catalogue rows to save memory). */
export interface SearchDocument {
  networkId: number;
  datasetId: number;
  title: string;
  description: string;
  keywords: string;
  creators: string;
  locality: string;
  nodes: string;
  name: string;
  accession: string;
}

/**
 * The current pipeline settings hash (the pipeline's settings in app_settings, hashed with the engine
 * version: server/src/pipeline/settings.ts), so "current metrics" here means the same as on dataset pages.
 */
export async function currentSettingsHash(transaction?: Transaction): Promise<string> {
  return settingsHash(await getPipelineSettings(transaction));
}

interface Filter {
  datasetIds?: number[];
  networkIds?: number[];
  /** Any published version, not only the latest (bundles of explicit references). */
  anyPublishedVersion?: boolean;
}

/** SQL selecting the latest published version of each dataset (aliased v) joined with d. */
const publishedVersions = (f: Filter) => f.anyPublishedVersion ? `
  FROM datasets d
  JOIN dataset_versions v ON v.dataset_id = d.id AND v.state = 'published'
  JOIN networks n ON n.version_id = v.id` : `
  FROM datasets d
  JOIN LATERAL (
    SELECT lv.* FROM dataset_versions lv
    WHERE lv.dataset_id = d.id AND lv.state = 'published'
    ORDER BY lv.number DESC LIMIT 1
  ) v ON true
  JOIN networks n ON n.version_id = v.id`;

function whereClause(f: Filter): string {
  const parts = ["d.accession IS NOT NULL"];
  if (f.datasetIds) parts.push(f.datasetIds.length ? "d.id IN (:datasetIds)" : "false");
  if (f.networkIds) parts.push(f.networkIds.length ? "n.id IN (:networkIds)" : "false");
  return parts.join(" AND ");
}

const num = (v: unknown): number | null => (v === null || v === undefined || v === "" ? null : Number.isFinite(Number(v)) ? Number(v) : null);
const str = (v: unknown): string | null => (typeof v === "string" && v !== "" ? v : null);
const yearOf = (d: string | null): number | null => (d && /^\d{4}/.test(d) ? Number(d.slice(0, 4)) : null);

interface RawRow {
  network_id: number;
  dataset_id: number;
  version_id: number;
  accession: string;
  number: number;
  position: number;
  study: Record<string, unknown>;
  meta: Record<string, unknown>;
  kind: "bipartite" | "unipartite";
  directed: boolean;
  weighted: boolean;
  n_nodes: number;
  n_rows: number | null;
  n_cols: number | null;
  n_links: number;
  total_weight: number;
  connectance: number | null;
  published_at: Date | null;
  run_id: number | null;
  settings_hash: string | null;
  objective: string | null;
  q: number | null;
  modules: number | null;
  current_settings: boolean | null;
  nodf: number | null;
  algorithm_name: string | null;
  algorithm_version: string | null;
  seed: string | number | null;
  null_model: string | null;
}

function toEntry(r: RawRow): CatalogueEntry {
  const m = r.meta ?? {};
  const s = r.study ?? {};
  const loc = (m.locality ?? {}) as Record<string, unknown>;
  const effort = (m.samplingEffort ?? null) as Record<string, unknown> | null;
  const coords = publicCoordinates(loc);
  const startDate = str(m.startDate);
  const notRecorded = notRecordedList(m).map((x) => x.field);
  const endDate = str(m.endDate);
  return {
    networkId: r.network_id,
    datasetId: r.dataset_id,
    versionId: r.version_id,
    accession: r.accession,
    version: r.number,
    position: r.position,
    ref: `${r.accession}/v${r.number}/${r.position}`,
    name: str(m.name) ?? `Network ${r.position}`,
    title: str(s.title) ?? r.accession,
    licence: str(s.licence) ?? "unknown",
    interactionType: str(m.interactionType),
    kind: r.kind,
    directed: r.directed,
    weighted: r.weighted,
    weightMeaning: str(m.weightMeaning),
    rowLevel: str(m.rowLevel),
    colLevel: str(m.colLevel),
    habitat: str(m.habitat) ?? (notRecorded.includes("habitat") ? NOT_RECORDED : null),
    notRecorded,
    notRecordedText: notRecordedText(m),
    countryCode: str(loc.countryCode)?.toUpperCase() ?? null,
    placeName: str(loc.placeName),
    latitude: coords.latitude,
    longitude: coords.longitude,
    generalisation: coords.latitude !== null || coords.longitude !== null ? (coords.generalisation ?? null) : str(loc.generalisation),
    elevation: coords.elevation,
    startDate,
    endDate,
    startYear: yearOf(startDate),
    endYear: yearOf(endDate) ?? yearOf(startDate),
    samplingProtocol: str(m.samplingProtocol),
    samplingEffortValue: effort ? num(effort.value) : null,
    samplingEffortUnit: effort ? str(effort.unit) : null,
    taxonomicResolution: str(m.taxonomicResolution),
    nNodes: r.n_nodes,
    nRows: r.n_rows,
    nCols: r.n_cols,
    nLinks: r.n_links,
    totalWeight: Number(r.total_weight),
    connectance: num(r.connectance),
    publishedAt: r.published_at ? new Date(r.published_at).toISOString() : null,
    runId: r.run_id,
    settingsHash: r.settings_hash ? r.settings_hash.trim() : null,
    objective: r.objective,
    q: num(r.q),
    modules: num(r.modules),
    currentSettings: r.current_settings === true,
    nodf: num(r.nodf),
    algorithmName: r.algorithm_name,
    algorithmVersion: r.algorithm_version,
    seed: num(r.seed),
    primaryNull: r.null_model,
    nulls: {},
  };
}

/** Catalogue rows (optionally only some datasets or networks), ordered by accession and position. */
export async function loadCatalogueRows(f: Filter = {}, transaction?: Transaction): Promise<CatalogueEntry[]> {
  const hash = await currentSettingsHash(transaction);
  const rows = await sequelize().query<RawRow>(
    `SELECT n.id AS network_id, d.id AS dataset_id, v.id AS version_id, d.accession, v.number, n.position,
            v.metadata AS study, n.metadata AS meta, n.kind, n.directed, n.weighted, n.n_nodes, n.n_rows, n.n_cols,
            n.n_links, n.total_weight, n.connectance, v.published_at,
            r.id AS run_id, r.settings_hash, r.objective, r.q, r.modules, r.nodf,
            r.algorithm_name, r.algorithm_version, r.seed, r.null_model, (r.settings_hash = :hash) AS current_settings
     ${publishedVersions(f)}
     LEFT JOIN LATERAL (
       SELECT mr.* FROM metric_runs mr
       WHERE mr.network_id = n.id AND mr.status = 'succeeded'
       ORDER BY (mr.settings_hash = :hash) DESC, mr.finished_at DESC NULLS LAST, mr.id DESC LIMIT 1
     ) r ON true
     WHERE ${whereClause(f)}
     ORDER BY d.accession, n.position`,
    { replacements: { hash, datasetIds: f.datasetIds ?? [], networkIds: f.networkIds ?? [] }, type: QueryTypes.SELECT, transaction },
  );
  const entries = rows.map(toEntry);
  const figures = await readNullFigures(entries.flatMap((e) => (e.runId ? [e.runId] : [])), transaction);
  for (const e of entries) {
    for (const f of (e.runId && figures.get(e.runId)) || []) {
      e.nulls[f.model] = { n: f.n, mean: f.mean, sd: f.sd, z: f.z, zSe: f.zSe, qRel: f.qRel, deltaQ: f.deltaQ, p: f.p, pAtFloor: f.pAtFloor };
    }
  }
  return entries;
}

/** Search documents (titles, descriptions, keywords, creators, localities, node names) for some or all datasets. */
export async function loadSearchDocuments(f: Filter = {}): Promise<SearchDocument[]> {
  const rows = await sequelize().query<{
    network_id: number;
    dataset_id: number;
    accession: string;
    study: Record<string, unknown>;
    meta: Record<string, unknown>;
    rows: string[] | null;
    cols: string[] | null;
  }>(
    `SELECT n.id AS network_id, d.id AS dataset_id, d.accession, v.metadata AS study, n.metadata AS meta,
            n.canonical -> 'rows' AS rows, n.canonical -> 'cols' AS cols
     ${publishedVersions(f)}
     WHERE ${whereClause(f)}`,
    { replacements: { datasetIds: f.datasetIds ?? [], networkIds: f.networkIds ?? [] }, type: QueryTypes.SELECT },
  );
  return rows.map((r) => {
    const s = r.study ?? {};
    const m = r.meta ?? {};
    const loc = (m.locality ?? {}) as Record<string, unknown>;
    const creators = Array.isArray(s.creators) ? (s.creators as Array<Record<string, unknown>>) : [];
    const keywords = Array.isArray(s.keywords) ? (s.keywords as unknown[]) : [];
    return {
      networkId: r.network_id,
      datasetId: r.dataset_id,
      accession: r.accession,
      title: String(s.title ?? ""),
      description: String(s.description ?? ""),
      keywords: keywords.map(String).join(" "),
      creators: creators.map((c) => [c.name, c.affiliation].filter(Boolean).join(" ")).join(" "),
      locality: [loc.placeName, loc.countryCode, m.habitat].filter(Boolean).join(" "),
      nodes: [...(r.rows ?? []), ...(r.cols ?? [])].join(" "),
      name: String(m.name ?? ""),
    };
  });
}

/** Cheap fingerprints of everything the catalogue depends on (checked at most every few seconds). */
export async function catalogueFingerprint(): Promise<{ versions: string; runs: string; settings: string }> {
  const [row] = await sequelize().query<{ v: string; r: string; s: string }>(
    `SELECT
       (SELECT count(*) || '|' || coalesce(max(updated_at)::text, '') FROM dataset_versions WHERE state IN ('published', 'withdrawn')) AS v,
       (SELECT coalesce(max(id), 0) || '|' || coalesce(max(updated_at)::text, '') FROM metric_runs) AS r,
       (SELECT coalesce(max(updated_at)::text, '') FROM app_settings) AS s`,
    { type: QueryTypes.SELECT },
  );
  return { versions: row.v, runs: row.r, settings: row.s };
}
