/**
 * The network view: one network's cells, labels, partition, module table, null Q values, node roles and
 * provenance, read from `networks.canonical` and the run that `getCurrentMetrics` names as current.
 *
 * The run's `results` hold the engine's `analyzeNetwork` output under `analysis` (older rows: at the top
 * level); null Q values under `nullQs` (or `analysis.nullQs`) when the pipeline kept them.
 */
import { doisOfDataset } from "../../dois/dois";
import type { CanonicalNetworkJson } from "@shared/network/parse/serialize";
import type { AnalysisResult } from "@shared/network/analyze";
import type { NetworkMetadata, NetworkMetricsSummary, StudyMetadata } from "@shared/types/dataset";
import type { ModuleRow, NetworkView, RoleRow, RunHistoryRow } from "@shared/types/network-view";
import { QueryTypes } from "sequelize";
import { sequelize } from "../../db/sequelize";
import { getCurrentMetrics } from "../../pipeline/metrics-read";
import { ApiError } from "../../lib/api-error";
import { MetricRun, Network, networkShape, StoredFile } from "../../models";
import type { AuthUser } from "../../types";
import { resolveVersion } from "../datasets/datasets.access";
import { publicLocality } from "../../lib/public-locality";
import { csvText } from "@shared/csv";

interface RunResults {
  analysis?: AnalysisResult;
  nullQs?: unknown;
  nullQsByModel?: unknown;
}

const numberList = (raw: unknown): number[] | null => (Array.isArray(raw) && raw.every((q) => typeof q === "number") ? (raw as number[]) : null);

function analysisOf(results: Record<string, unknown> | null | undefined): { analysis: AnalysisResult | null; nullQs: number[] | null; nullQsByModel: Record<string, number[]> | null } {
  if (!results) return { analysis: null, nullQs: null, nullQsByModel: null };
  const r = results as RunResults & Partial<AnalysisResult>;
  const analysis = (r.analysis ?? (r.modularity ? (r as AnalysisResult) : null)) as AnalysisResult | null;
  const nullQs = numberList(r.nullQs ?? (analysis as (AnalysisResult & { nullQs?: unknown }) | null)?.nullQs);
  let byModel: Record<string, number[]> | null = null;
  if (r.nullQsByModel && typeof r.nullQsByModel === "object") {
    byModel = {};
    for (const [model, qs] of Object.entries(r.nullQsByModel as Record<string, unknown>)) {
      const list = numberList(qs);
      if (list) byModel[model] = list;
    }
  } else if (nullQs && analysis?.null?.model) {
    // Runs from before null-model sets kept the one model's values under nullQs.
    byModel = { [analysis.null.model]: nullQs };
  }
  return { analysis, nullQs, nullQsByModel: byModel };
}

const isStaff = (user: AuthUser | undefined) => user?.role === "curator" || user?.role === "admin";

/** Every run of a network, newest first: settings, null models, engine version, when; errors for staff only. */
export async function runHistory(networkId: number, shownRunId: number | null, staff: boolean): Promise<RunHistoryRow[]> {
  const rows = await sequelize().query<{
    id: number;
    status: RunHistoryRow["status"];
    settings: Record<string, unknown>;
    algorithm_version: string | null;
    created_at: Date;
    finished_at: Date | null;
    error: string | null;
    error_kind: "configuration" | "computation" | null;
    models: string[] | null;
    q: number | null;
  }>(
    `SELECT r.id, r.status, r.settings, r.algorithm_version, r.created_at, r.finished_at, r.error, r.error_kind, r.q,
            (SELECT array_agg(n.model ORDER BY n.is_primary DESC, n.model) FROM metric_run_nulls n WHERE n.run_id = r.id) AS models
       FROM metric_runs r WHERE r.network_id = :networkId ORDER BY r.id DESC LIMIT 100`,
    { replacements: { networkId }, type: QueryTypes.SELECT },
  );
  return rows.map((r) => {
    const s = r.settings ?? {};
    const nullModels = s.nullModels ?? (s.nullModel === "auto" ? "standard" : s.nullModel ? [s.nullModel] : "standard");
    return {
      runId: r.id,
      status: r.status,
      shown: r.id === shownRunId,
      createdAt: new Date(r.created_at).toISOString(),
      finishedAt: r.finished_at ? new Date(r.finished_at).toISOString() : null,
      engineVersion: r.algorithm_version,
      settings: {
        objective: String(s.objective ?? ""),
        restarts: Number(s.restarts ?? 0),
        nulls: Number(s.nulls ?? 0),
        seed: Number(s.seed ?? 0),
        nullModels: nullModels as RunHistoryRow["settings"]["nullModels"],
      },
      nullModelsComputed: r.models ?? [],
      Q: r.q,
      errorKind: r.status === "failed" ? (r.error_kind ?? "computation") : null,
      ...(staff && r.status === "failed" ? { error: r.error } : {}),
    };
  });
}

/** The engine's node labels (analyze.ts): a bipartite column sharing a row's label is "label (column)". */
function engineLabels(rows: string[], cols: string[] | null): { rowKeys: string[]; colKeys: string[] } {
  if (!cols) return { rowKeys: rows, colKeys: rows };
  const rowSet = new Set(rows);
  return { rowKeys: rows, colKeys: cols.map((l) => (rowSet.has(l) ? `${l} (column)` : l)) };
}

export function moduleTable(c: CanonicalNetworkJson, rowModules: number[], colModules: number[]): ModuleRow[] {
  const bip = c.kind === "bipartite";
  const byModule = new Map<number, ModuleRow>();
  const get = (m: number): ModuleRow => {
    let r = byModule.get(m);
    if (!r) byModule.set(m, (r = { module: m, rows: 0, cols: bip ? 0 : null, linksInside: 0, weightInside: 0 }));
    return r;
  };
  rowModules.forEach((m) => get(m).rows++);
  if (bip) colModules.forEach((m) => (get(m).cols = (get(m).cols ?? 0) + 1));
  const undirectedOneMode = !bip && !c.directed;
  for (let i = 0; i < c.rows.length; i++) {
    for (let p = c.ptr[i]; p < c.ptr[i + 1]; p++) {
      const j = c.idx[p];
      // an undirected link is stored in both directions: count it once (j ≥ i)
      if (undirectedOneMode && j < i) continue;
      if (rowModules[i] !== colModules[j]) continue;
      const row = get(rowModules[i]);
      row.linksInside++;
      row.weightInside += c.w ? c.w[p] : 1;
    }
  }
  return [...byModule.values()].sort((a, b) => a.module - b.module);
}

function rolesOf(analysis: AnalysisResult | null): { roles: RoleRow[] | null; thresholds: { z: number; p: number } | null } {
  if (!analysis?.roles) return { roles: null, thresholds: null };
  return {
    roles: analysis.roles.nodes.map((n) => ({ label: n.label, level: n.level, module: n.module, degree: n.degree, z: n.z, P: n.participation, role: n.role })),
    thresholds: analysis.roles.thresholds,
  };
}

async function currentRun(networkId: number, staff: boolean): Promise<{ summary: NetworkMetricsSummary; run: MetricRun | null }> {
  const summary = (await getCurrentMetrics([networkId], { showErrors: staff })).get(networkId) ?? { status: "none" as const };
  const run = summary.runId ? await MetricRun.findByPk(summary.runId) : null;
  return { summary, run };
}

export async function getNetworkView(accession: string, versionNumber: number, position: number, user: AuthUser | undefined): Promise<NetworkView> {
  const { dataset, version, latestPublishedVersion } = await resolveVersion(accession, versionNumber, user);
  const net = await Network.unscoped().findOne({ where: { versionId: version.id, position } });
  if (!net) throw ApiError.notFound(`${accession} v${version.number} has no network ${position}.`);
  const file = await StoredFile.findByPk(net.fileId);
  const c = net.canonical as CanonicalNetworkJson;
  const staff = isStaff(user);
  const { summary, run } = await currentRun(net.id, staff);
  const { analysis, nullQs, nullQsByModel } = analysisOf(run?.results);
  const history = await runHistory(net.id, summary.runId ?? null, staff);
  const partition = analysis?.modularity?.partition ?? null;

  const rows = c.rows;
  const cols = c.cols ?? c.rows;
  let rowModules: number[] | null = null;
  let colModules: number[] | null = null;
  let modules: ModuleRow[] = [];
  if (partition) {
    const { rowKeys, colKeys } = engineLabels(c.rows, c.cols);
    rowModules = rowKeys.map((k) => partition[k] ?? -1);
    colModules = c.cols ? colKeys.map((k) => partition[k] ?? -1) : rowModules;
    if (rowModules.includes(-1) || colModules.includes(-1)) {
      // the run does not belong to this canonical form (should not happen): show no partition rather than a wrong one
      rowModules = colModules = null;
    } else {
      modules = moduleTable(c, rowModules, colModules);
    }
  }
  const { roles, thresholds } = rolesOf(analysis);
  const study = version.metadata as unknown as StudyMetadata;
  const md = net.metadata as unknown as NetworkMetadata;
  const doi = (await doisOfDataset(dataset.id)).versions.get(version.number) ?? null;
  return {
    ref: `${accession}/v${version.number}/${position}`,
    accession,
    version: version.number,
    doi,
    versionState: version.state,
    latestPublishedVersion,
    position,
    datasetTitle: study.title,
    licence: study.licence,
    metadata: { ...md, locality: publicLocality(md.locality) },
    ...networkShape(net),
    totalWeight: net.totalWeight,
    rowLabels: rows,
    colLabels: cols,
    cells: { ptr: c.ptr, idx: c.idx, w: c.w },
    metrics: summary,
    partition,
    rowModules,
    colModules,
    modules,
    nullQs,
    nullQsByModel,
    runHistory: history,
    roles,
    roleThresholds: thresholds,
    provenance: {
      runId: run?.id ?? null,
      settingsHash: run?.settingsHash?.trim() ?? null,
      algorithm: analysis?.algorithm ?? summary.algorithm ?? null,
      restarts: analysis?.modularity?.restarts
        ? {
            n: analysis.modularity.restarts.n,
            min: analysis.modularity.restarts.min,
            median: analysis.modularity.restarts.median,
            max: analysis.modularity.restarts.max,
            bestShare: analysis.modularity.restarts.bestShare,
          }
        : null,
      startedAt: run?.startedAt?.toISOString() ?? null,
      finishedAt: run?.finishedAt?.toISOString() ?? null,
      durationMs: run?.durationMs ?? null,
      file: { name: net.originalName, sha256: file?.sha256 ?? "", size: file?.size ?? 0, format: net.format },
    },
  };
}

/** Partition as CSV rows `node,level,module` (bipartite level row/column; one-mode "node"). */
export function partitionCsv(view: NetworkView): string {
  if (!view.rowModules || !view.colModules) throw ApiError.notFound(`${view.ref} has no partition yet (metrics status: ${view.metrics.status}).`);
  const rows: unknown[][] = [["node", "level", "module"]];
  const bip = view.kind === "bipartite";
  view.rowLabels.forEach((l, i) => rows.push([l, bip ? "row" : "node", view.rowModules![i]]));
  if (bip) view.colLabels.forEach((l, j) => rows.push([l, "column", view.colModules![j]]));
  return csvText(rows, { eol: "\r\n" });
}

export function partitionJson(view: NetworkView) {
  if (!view.partition || !view.rowModules || !view.colModules) {
    throw ApiError.notFound(`${view.ref} has no partition yet (metrics status: ${view.metrics.status}).`);
  }
  return {
    ref: view.ref,
    objective: view.metrics.objective ?? null,
    Q: view.metrics.Q ?? null,
    modules: view.metrics.modules ?? null,
    algorithm: view.provenance.algorithm,
    runId: view.provenance.runId,
    rows: view.rowLabels.map((label, i) => ({ label, module: view.rowModules![i] })),
    ...(view.kind === "bipartite" ? { columns: view.colLabels.map((label, j) => ({ label, module: view.colModules![j] })) } : {}),
  };
}
