/**
 * The metrics of networks, as pages, the API and the compare view show them. A failed or newer run never
 * hides good figures:
 *   1. the latest successful run of the CURRENT pipeline settings (at most one per network and hash),
 *   2. else the latest successful run of any older settings (`currentSettings: false`),
 *   3. else the waiting or running run of the current settings (a running run may already carry its
 *      observed figures: the job writes Q, modules and NODF before the null replicates), else the last
 *      failure, else "none".
 * When a run newer than the figures shown failed, waits or runs, `newer` says so ("a newer computation
 * failed; figures shown are from run N"); its error text is only given to curators and admins
 * (`showErrors`). Every significance figure comes with its null model: `nulls` lists each model's figures
 * (metric_run_nulls), primary first, and the top-level z, Q_rel, ΔQ and p are the primary's (`nullModel`).
 */
import { QueryTypes } from "sequelize";
import type { MetricsStatus, NetworkMetricsSummary, NullFigureSummary } from "@shared/types/dataset";
import { sequelize } from "../db/sequelize";
import { readNullFigures } from "./null-figures";
import { getPipelineSettings, settingsHash } from "./settings";

interface RunRow {
  id: number;
  network_id: number;
  settings_hash: string;
  status: MetricsStatus;
  objective: string | null;
  q: number | null;
  modules: number | null;
  null_model: string | null;
  null_mean: number | null;
  null_sd: number | null;
  z: number | null;
  q_rel: number | null;
  p: number | null;
  nodf: number | null;
  seed: string | number | null;
  algorithm_name: string | null;
  algorithm_version: string | null;
  started_at: Date | null;
  finished_at: Date | null;
  created_at: Date;
  duration_ms: number | null;
  error: string | null;
  error_kind: "configuration" | "computation" | null;
  null_part: { model?: string; n?: number; deltaQ?: number | null; unstable?: boolean; zSe?: number | null; pSe?: number | null; pAtFloor?: boolean } | null;
  isolated_nodes: number | null;
  parameters: Record<string, unknown> | null;
}

export interface MetricsReadOptions {
  /** Curators and admins: include the error text of failed runs. */
  showErrors?: boolean;
}

export function summarizeRun(r: RunRow, nulls: NullFigureSummary[] | undefined, opts: MetricsReadOptions & { currentHash?: string } = {}): NetworkMetricsSummary {
  const primary = nulls?.find((f) => f.primary) ?? null;
  const out: NetworkMetricsSummary = {
    status: r.status,
    runId: r.id,
    settingsHash: r.settings_hash.trim(),
    objective: (r.objective as NetworkMetricsSummary["objective"]) ?? undefined,
    Q: r.q,
    modules: r.modules,
    isolatedNodes: r.isolated_nodes,
    nullModel: primary?.model ?? r.null_model ?? r.null_part?.model ?? null,
    nullN: primary?.n ?? r.null_part?.n ?? null,
    nullMean: r.null_mean,
    nullSd: r.null_sd,
    z: r.z,
    zSe: primary?.zSe ?? r.null_part?.zSe ?? null,
    qRel: r.q_rel,
    deltaQ: primary?.deltaQ ?? r.null_part?.deltaQ ?? null,
    p: r.p,
    pSe: primary?.pSe ?? r.null_part?.pSe ?? null,
    pAtFloor: primary?.pAtFloor ?? r.null_part?.pAtFloor ?? undefined,
    zUnstable: primary?.unstable ?? r.null_part?.unstable ?? undefined,
    nulls: nulls ?? [],
    nodf: r.nodf,
    startedAt: r.started_at ? new Date(r.started_at).toISOString() : null,
    finishedAt: r.finished_at ? new Date(r.finished_at).toISOString() : null,
    durationMs: r.duration_ms,
    error: opts.showErrors ? r.error : r.error ? "the computation failed" : null,
  };
  if (opts.currentHash) out.currentSettings = r.settings_hash.trim() === opts.currentHash;
  if (r.algorithm_name && r.algorithm_version) {
    out.algorithm = {
      name: r.algorithm_name,
      version: r.algorithm_version,
      seed: Number(r.seed ?? 0),
      ...(r.parameters ? { parameters: r.parameters } : {}),
    };
  }
  if (out.objective === undefined) delete out.objective;
  if (out.zUnstable === undefined) delete out.zUnstable;
  if (out.pAtFloor === undefined) delete out.pAtFloor;
  return out;
}

const RUN_COLUMNS = `id, network_id, settings_hash, status, objective, q, modules, null_model, null_mean, null_sd, z, q_rel, p,
  nodf, seed, algorithm_name, algorithm_version, started_at, finished_at, created_at, duration_ms, error, error_kind,
  results->'analysis'->'null' AS null_part, (results #>> '{analysis,modularity,isolatedNodes}')::int AS isolated_nodes,
  results->'analysis'->'algorithm'->'parameters' AS parameters`;

/**
 * Metrics for each network id (every id gets an entry; "none" when nothing was ever computed or queued).
 * A constant number of queries for all ids.
 */
export async function getCurrentMetrics(networkIds: number[], opts: MetricsReadOptions = {}): Promise<Map<number, NetworkMetricsSummary>> {
  const out = new Map<number, NetworkMetricsSummary>();
  const ids = [...new Set(networkIds)].filter((id) => Number.isInteger(id));
  if (!ids.length) return out;
  const hash = settingsHash(await getPipelineSettings());
  const picks = await sequelize().query<{ nid: number; shown: number | null; active: number | null; other: number | null }>(
    `SELECT x.id AS nid,
            (SELECT mr.id FROM metric_runs mr WHERE mr.network_id = x.id AND mr.status = 'succeeded'
              ORDER BY (mr.settings_hash = :hash) DESC, mr.finished_at DESC NULLS LAST, mr.id DESC LIMIT 1) AS shown,
            (SELECT mr.id FROM metric_runs mr WHERE mr.network_id = x.id AND mr.settings_hash = :hash AND mr.status IN ('queued', 'running')
              ORDER BY mr.id DESC LIMIT 1) AS active,
            (SELECT mr.id FROM metric_runs mr WHERE mr.network_id = x.id AND mr.status IN ('failed', 'queued', 'running')
              ORDER BY mr.id DESC LIMIT 1) AS other
       FROM unnest(ARRAY[:ids]::int[]) AS x(id)`,
    { replacements: { ids, hash }, type: QueryTypes.SELECT },
  );
  const runIds = picks.flatMap((p) => [p.shown, p.active, p.other]).filter((v): v is number => v !== null);
  const rows = runIds.length
    ? await sequelize().query<RunRow>(`SELECT ${RUN_COLUMNS} FROM metric_runs WHERE id IN (:runIds)`, { replacements: { runIds }, type: QueryTypes.SELECT })
    : [];
  const byId = new Map(rows.map((r) => [r.id, r]));
  const figures = await readNullFigures(picks.map((p) => p.shown).filter((v): v is number => v !== null));
  for (const p of picks) {
    const shown = p.shown !== null ? byId.get(p.shown) : undefined;
    const other = p.other !== null ? byId.get(p.other) : undefined;
    if (shown) {
      const s = summarizeRun(shown, figures.get(shown.id), { ...opts, currentHash: hash });
      s.newer = other && other.id > shown.id ? newerNote(other, opts) : null;
      out.set(p.nid, s);
      continue;
    }
    const active = p.active !== null ? byId.get(p.active) : undefined;
    const fallback = active ?? other;
    out.set(p.nid, fallback ? { ...summarizeRun(fallback, undefined, { ...opts, currentHash: hash }), newer: null } : { status: "none" });
  }
  for (const id of ids) if (!out.has(id)) out.set(id, { status: "none" });
  return out;
}

function newerNote(r: RunRow, opts: MetricsReadOptions): NetworkMetricsSummary["newer"] {
  const status = r.status as "failed" | "queued" | "running";
  const at = r.finished_at ?? r.started_at ?? r.created_at;
  const note: NonNullable<NetworkMetricsSummary["newer"]> = { runId: r.id, status, at: at ? new Date(at).toISOString() : null };
  if (status === "failed") {
    note.errorKind = r.error_kind;
    if (opts.showErrors) note.error = r.error;
  }
  return note;
}
