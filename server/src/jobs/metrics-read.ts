/**
 * The current metrics of networks, as the catalogue and dataset pages show them: the successful run of the
 * CURRENT pipeline settings (at most one per network and settings hash), else the queued or running run of
 * those settings (a running run may already carry its observed figures: the job writes Q, modules and NODF
 * before it starts on the null replicates), else the last failure, else "none".
 */
import { QueryTypes } from "sequelize";
import type { MetricsStatus, NetworkMetricsSummary } from "../../../shared/types/dataset";
import { sequelize } from "../db/sequelize";
import { getPipelineSettings, settingsHash } from "./settings";

interface RunRow {
  id: number;
  network_id: number;
  settings_hash: string;
  status: MetricsStatus;
  objective: string | null;
  q: number | null;
  modules: number | null;
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
  duration_ms: number | null;
  error: string | null;
  null_part: { model?: string; n?: number; deltaQ?: number | null; unstable?: boolean } | null;
  parameters: Record<string, unknown> | null;
}

const RANK: Record<string, number> = { succeeded: 3, running: 2, queued: 2, failed: 1 };

export function summarizeRun(r: RunRow): NetworkMetricsSummary {
  const out: NetworkMetricsSummary = {
    status: r.status,
    runId: r.id,
    settingsHash: r.settings_hash.trim(),
    objective: (r.objective as NetworkMetricsSummary["objective"]) ?? undefined,
    Q: r.q,
    modules: r.modules,
    nullModel: r.null_part?.model ?? null,
    nullN: r.null_part?.n ?? null,
    nullMean: r.null_mean,
    nullSd: r.null_sd,
    z: r.z,
    qRel: r.q_rel,
    deltaQ: r.null_part?.deltaQ ?? null,
    p: r.p,
    zUnstable: r.null_part?.unstable ?? undefined,
    nodf: r.nodf,
    startedAt: r.started_at ? new Date(r.started_at).toISOString() : null,
    finishedAt: r.finished_at ? new Date(r.finished_at).toISOString() : null,
    durationMs: r.duration_ms,
    error: r.error,
  };
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
  return out;
}

/**
 * Current metrics for each network id (every id gets an entry; "none" when nothing was ever queued with
 * the current settings). One query for all ids.
 */
export async function getCurrentMetrics(networkIds: number[]): Promise<Map<number, NetworkMetricsSummary>> {
  const out = new Map<number, NetworkMetricsSummary>();
  const ids = [...new Set(networkIds)].filter((id) => Number.isInteger(id));
  if (!ids.length) return out;
  const hash = settingsHash(await getPipelineSettings());
  const rows = await sequelize().query<RunRow>(
    `SELECT DISTINCT ON (network_id, status) id, network_id, settings_hash, status, objective, q, modules, null_mean,
            null_sd, z, q_rel, p, nodf, seed, algorithm_name, algorithm_version, started_at, finished_at,
            duration_ms, error, results->'analysis'->'null' AS null_part,
            results->'analysis'->'algorithm'->'parameters' AS parameters
       FROM metric_runs
      WHERE network_id IN (:ids) AND settings_hash = :hash AND status IN ('succeeded', 'running', 'queued', 'failed')
      ORDER BY network_id, status, id DESC`,
    { replacements: { ids, hash }, type: QueryTypes.SELECT },
  );
  const best = new Map<number, RunRow>();
  for (const r of rows) {
    const cur = best.get(r.network_id);
    // Succeeded beats an active run, which beats a failure; among equals the newest run wins.
    if (!cur || RANK[r.status] > RANK[cur.status] || (RANK[r.status] === RANK[cur.status] && r.id > cur.id)) {
      best.set(r.network_id, r);
    }
  }
  for (const id of ids) {
    const r = best.get(id);
    out.set(id, r ? summarizeRun(r) : { status: "none" });
  }
  return out;
}
