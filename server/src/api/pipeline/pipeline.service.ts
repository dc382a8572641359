/**
 * Admin rules of the metrics pipeline: current settings, batches ("recompute all published networks"),
 * their progress, failures and retries, and the run history of a network.
 *
 * Starting a batch makes its settings the current settings (the catalogue shows the successful run of the
 * current settings), then queues one run per published network: a network that already has a success for
 * these settings is skipped unless forced; one whose run of these settings is already waiting or running
 * is attached to the batch instead of queued twice.
 */
import { QueryTypes } from "sequelize";
import { ENGINE_VERSION } from "@shared/network/version";
import type { BatchPreview, BatchProgress, NetworkRunRow, PipelineSettings, PipelineSettingsResponse, QueuePhaseCounts, QueueProgress, RunFailure } from "@shared/types/pipeline";
import type { NetworkMetricsSummary } from "@shared/types/dataset";
import { sequelize } from "../../db/sequelize";
import { ApiError } from "../../lib/api-error";
import { audit } from "../../lib/audit";
import { logger } from "../../lib/logger";
import { getCurrentMetrics } from "../../pipeline/metrics-read";
import { finishBatchIfDone } from "../../pipeline/metrics-worker";
import { sendRunJobs } from "../../pipeline/queue";
import { createQueuedRuns, type QueuedRun } from "../../pipeline/runs";
import { DEFAULT_PIPELINE_SETTINGS, getPipelineSettings, normalizeSettings, setPipelineSettings, settingsHash } from "../../pipeline/settings";
import { assertSettingsFitPublished } from "../../pipeline/settings-compat";

export async function readSettings(): Promise<PipelineSettingsResponse> {
  const settings = await getPipelineSettings();
  return { settings, settingsHash: settingsHash(settings), engineVersion: ENGINE_VERSION, defaults: { ...DEFAULT_PIPELINE_SETTINGS } };
}

export async function updateSettings(actorId: number, settings: PipelineSettings): Promise<PipelineSettingsResponse> {
  await assertSettingsFitPublished(settings);
  await sequelize().transaction(async (transaction) => {
    await setPipelineSettings(settings, transaction);
    await audit({ actorId, action: "pipeline.settings.update", entityType: "pipeline", entityId: "settings", details: { settings: normalizeSettings(settings) } }, transaction);
  });
  return readSettings();
}

interface BatchRow {
  id: number;
  status: BatchProgress["status"];
  settings: PipelineSettings;
  settings_hash: string;
  force: boolean;
  total: number;
  skipped: number;
  started_by: number | null;
  started_by_name: string | null;
  created_at: Date;
  finished_at: Date | null;
  done: number;
  failed: number;
  running: number;
  queued: number;
  last_finished: Date | null;
}

const BATCH_SELECT = `
  SELECT b.id, b.status, b.settings, b.settings_hash, b.force, b.total, b.skipped, b.started_by,
         u.display_name AS started_by_name, b.created_at, b.finished_at,
         count(r.id) FILTER (WHERE r.status IN ('succeeded', 'superseded'))::int AS done,
         count(r.id) FILTER (WHERE r.status = 'failed')::int AS failed,
         count(r.id) FILTER (WHERE r.status = 'running')::int AS running,
         count(r.id) FILTER (WHERE r.status = 'queued')::int AS queued,
         max(r.finished_at) AS last_finished
    FROM metric_batches b
    LEFT JOIN users u ON u.id = b.started_by
    LEFT JOIN metric_runs r ON r.batch_id = b.id`;

function toProgress(b: BatchRow, now = Date.now()): BatchProgress {
  const finishedCount = b.done + b.failed;
  const start = new Date(b.created_at).getTime();
  const end = b.finished_at ? new Date(b.finished_at).getTime() : b.status === "running" ? now : new Date(b.last_finished ?? b.created_at).getTime();
  const minutes = Math.max((end - start) / 60_000, 1 / 600);
  const ratePerMinute = finishedCount > 0 ? finishedCount / minutes : null;
  const left = Math.max(0, b.total - finishedCount);
  return {
    id: b.id,
    status: b.status,
    settings: b.settings,
    settingsHash: b.settings_hash.trim(),
    force: b.force,
    startedBy: b.started_by ? { id: b.started_by, displayName: b.started_by_name ?? "" } : null,
    createdAt: new Date(b.created_at).toISOString(),
    finishedAt: b.finished_at ? new Date(b.finished_at).toISOString() : null,
    total: b.total,
    skipped: b.skipped,
    done: b.done,
    failed: b.failed,
    running: b.running,
    queued: b.queued,
    ratePerMinute: ratePerMinute === null ? null : Math.round(ratePerMinute * 100) / 100,
    etaSeconds: b.status !== "running" ? 0 : ratePerMinute ? Math.round((left / ratePerMinute) * 60) : null,
  };
}

export async function getBatch(id: number): Promise<BatchProgress> {
  const rows = await sequelize().query<BatchRow>(`${BATCH_SELECT} WHERE b.id = :id GROUP BY b.id, u.display_name`, {
    replacements: { id },
    type: QueryTypes.SELECT,
  });
  if (!rows[0]) throw ApiError.notFound("No such batch.");
  return toProgress(rows[0]);
}

export async function listBatches(page: number, pageSize: number): Promise<{ data: BatchProgress[]; meta: { total: number; page: number; pageSize: number } }> {
  const [{ n }] = await sequelize().query<{ n: number }>(`SELECT count(*)::int AS n FROM metric_batches`, { type: QueryTypes.SELECT });
  const rows = await sequelize().query<BatchRow>(
    `${BATCH_SELECT} GROUP BY b.id, u.display_name ORDER BY b.id DESC LIMIT :limit OFFSET :offset`,
    { replacements: { limit: pageSize, offset: (page - 1) * pageSize }, type: QueryTypes.SELECT },
  );
  return { data: rows.map((r) => toProgress(r)), meta: { total: n, page, pageSize } };
}

/** The running batch, else the latest one (null when there was none). */
export async function currentBatch(): Promise<BatchProgress | null> {
  const [row] = await sequelize().query<{ id: number }>(
    `SELECT id FROM metric_batches ORDER BY (status = 'running') DESC, id DESC LIMIT 1`,
    { type: QueryTypes.SELECT },
  );
  return row ? getBatch(row.id) : null;
}

function afterCommitSend(runs: QueuedRun[]) {
  sendRunJobs(runs).catch((err: unknown) => logger.warn({ err }, "metrics jobs not sent now; the worker's sweeper will send them"));
}

export async function startBatch(actorId: number, settings: PipelineSettings, force: boolean): Promise<BatchProgress> {
  const s = normalizeSettings(settings);
  await assertSettingsFitPublished(s);
  const hash = settingsHash(s);
  const { batchId, runs } = await sequelize().transaction(async (transaction) => {
    await setPipelineSettings(s, transaction);
    const [batch] = await sequelize().query<{ id: number }>(
      `INSERT INTO metric_batches (settings, settings_hash, status, total, force, started_by, created_at, updated_at)
       VALUES (CAST(:settings AS jsonb), :hash, 'running', 0, :force, :actorId, now(), now()) RETURNING id`,
      { replacements: { settings: JSON.stringify(s), hash, force, actorId }, type: QueryTypes.SELECT, transaction },
    );
    const nets = await sequelize().query<{ id: number }>(
      `SELECT n.id FROM networks n JOIN dataset_versions v ON v.id = n.version_id WHERE v.state = 'published' ORDER BY n.id`,
      { type: QueryTypes.SELECT, transaction },
    );
    const res = await createQueuedRuns(
      nets.map((n) => n.id),
      { settings: s, force, batchId: batch.id, transaction },
    );
    const total = res.created.length + res.reused.length;
    await sequelize().query(
      `UPDATE metric_batches SET total = :total, skipped = :skipped,
              status = CASE WHEN :total = 0 THEN 'finished' ELSE status END,
              finished_at = CASE WHEN :total = 0 THEN now() ELSE NULL END, updated_at = now()
        WHERE id = :id`,
      { replacements: { total, skipped: res.skipped.length, id: batch.id }, transaction },
    );
    await audit({ actorId, action: "pipeline.batch.start", entityType: "metric_batch", entityId: batch.id, details: { settings: s, force, total, skipped: res.skipped.length } }, transaction);
    return { batchId: batch.id, runs: res.created };
  });
  afterCommitSend(runs);
  return getBatch(batchId);
}

export async function batchFailures(batchId: number): Promise<{ data: RunFailure[]; meta: { total: number } }> {
  await getBatch(batchId);
  const rows = await sequelize().query<{ id: number; network_id: number; ref: string | null; name: string; error: string | null; attempts: number; finished_at: Date | null }>(
    `SELECT r.id, r.network_id, r.error, r.attempts, r.finished_at,
            CASE WHEN d.accession IS NULL THEN NULL ELSE d.accession || '/v' || v.number || '/' || n.position END AS ref,
            COALESCE(n.metadata->>'name', n.original_name) AS name
       FROM metric_runs r JOIN networks n ON n.id = r.network_id
       JOIN dataset_versions v ON v.id = n.version_id JOIN datasets d ON d.id = v.dataset_id
      WHERE r.batch_id = :batchId AND r.status = 'failed' ORDER BY r.id`,
    { replacements: { batchId }, type: QueryTypes.SELECT },
  );
  return {
    data: rows.map((r) => ({
      runId: r.id,
      networkId: r.network_id,
      ref: r.ref,
      networkName: r.name,
      error: r.error ?? "unknown error",
      attempts: r.attempts,
      finishedAt: r.finished_at ? new Date(r.finished_at).toISOString() : null,
    })),
    meta: { total: rows.length },
  };
}

/**
 * What "recompute all published networks" with these settings would do, for the confirmation: networks
 * that would be queued, those already up to date (skipped unless forced), and how many networks would get
 * different figures (their figures shown now come from other settings or would be recomputed) or their
 * first figures.
 */
export async function previewBatch(settings: PipelineSettings, force: boolean): Promise<BatchPreview> {
  const s = normalizeSettings(settings);
  await assertSettingsFitPublished(s);
  const hash = settingsHash(s);
  const [row] = await sequelize().query<{ total: number; up_to_date: number; with_figures: number; active: number }>(
    `SELECT count(*)::int AS total,
            count(*) FILTER (WHERE EXISTS (SELECT 1 FROM metric_runs r WHERE r.network_id = n.id AND r.settings_hash = :hash AND r.status = 'succeeded'))::int AS up_to_date,
            count(*) FILTER (WHERE EXISTS (SELECT 1 FROM metric_runs r WHERE r.network_id = n.id AND r.status = 'succeeded'))::int AS with_figures,
            count(*) FILTER (WHERE EXISTS (SELECT 1 FROM metric_runs r WHERE r.network_id = n.id AND r.settings_hash = :hash AND r.status IN ('queued', 'running')))::int AS active
       FROM networks n JOIN dataset_versions v ON v.id = n.version_id WHERE v.state = 'published'`,
    { replacements: { hash }, type: QueryTypes.SELECT },
  );
  const skipped = force ? 0 : row.up_to_date;
  const toCompute = row.total - skipped;
  const firstFigures = row.total - row.with_figures;
  return {
    settings: s,
    settingsHash: hash,
    force,
    networks: row.total,
    toCompute,
    skipped,
    alreadyQueued: row.active,
    figuresChange: Math.max(0, toCompute - firstFigures),
    firstFigures,
  };
}

/** Puts the failed runs of a batch back in the queue (attempts start again from 0). */
export async function retryFailed(actorId: number, batchId: number): Promise<BatchProgress> {
  await getBatch(batchId);
  const runs = await sequelize().transaction(async (transaction) => {
    const rows = await sequelize().query<{ id: number; network_id: number; settings_hash: string }>(
      `UPDATE metric_runs SET status = 'queued', attempts = 0, error = NULL, started_at = NULL, finished_at = NULL,
              duration_ms = NULL, results = NULL, q = NULL, modules = NULL, nodf = NULL, error_kind = NULL, updated_at = now()
        WHERE batch_id = :batchId AND status = 'failed' RETURNING id, network_id, settings_hash`,
      { replacements: { batchId }, type: QueryTypes.SELECT, transaction },
    );
    if (rows.length) {
      await sequelize().query(`UPDATE metric_batches SET status = 'running', finished_at = NULL, updated_at = now() WHERE id = :batchId`, {
        replacements: { batchId },
        transaction,
      });
    }
    await audit({ actorId, action: "pipeline.batch.retry", entityType: "metric_batch", entityId: batchId, details: { runs: rows.length } }, transaction);
    return rows.map((r) => ({ id: r.id, networkId: r.network_id, settingsHash: r.settings_hash }));
  });
  afterCommitSend(runs);
  await finishBatchIfDone(batchId);
  return getBatch(batchId);
}

interface RunListRow {
  id: number;
  network_id: number;
  ref: string | null;
  name: string;
  status: NetworkRunRow["status"];
  batch_id: number | null;
  settings_hash: string;
  q: number | null;
  z: number | null;
  duration_ms: number | null;
  error: string | null;
  created_at: Date;
}

function toRunRow(r: RunListRow): NetworkRunRow {
  return {
    runId: r.id,
    networkId: r.network_id,
    ref: r.ref,
    networkName: r.name,
    status: r.status,
    batchId: r.batch_id,
    settingsHash: r.settings_hash.trim(),
    q: r.q,
    z: r.z,
    durationMs: r.duration_ms,
    error: r.error,
    createdAt: new Date(r.created_at).toISOString(),
  };
}

const RUN_SELECT = `
  SELECT r.id, r.network_id, r.status, r.batch_id, r.settings_hash, r.q, r.z, r.duration_ms, r.error, r.created_at,
         CASE WHEN d.accession IS NULL THEN NULL ELSE d.accession || '/v' || v.number || '/' || n.position END AS ref,
         COALESCE(n.metadata->>'name', n.original_name) AS name
    FROM metric_runs r JOIN networks n ON n.id = r.network_id
    JOIN dataset_versions v ON v.id = n.version_id JOIN datasets d ON d.id = v.dataset_id`;

/** Runs, newest first, optionally of one status or one batch. */
export async function listRuns(q: { status?: string; batchId?: number; page: number; pageSize: number }): Promise<{ data: NetworkRunRow[]; meta: { total: number; page: number; pageSize: number } }> {
  const where: string[] = [];
  if (q.status) where.push("r.status = :status");
  if (q.batchId) where.push("r.batch_id = :batchId");
  const w = where.length ? `WHERE ${where.join(" AND ")}` : "";
  const replacements = { status: q.status, batchId: q.batchId, limit: q.pageSize, offset: (q.page - 1) * q.pageSize };
  const [{ n }] = await sequelize().query<{ n: number }>(`SELECT count(*)::int AS n FROM metric_runs r ${w}`, { replacements, type: QueryTypes.SELECT });
  const rows = await sequelize().query<RunListRow>(`${RUN_SELECT} ${w} ORDER BY r.id DESC LIMIT :limit OFFSET :offset`, { replacements, type: QueryTypes.SELECT });
  return { data: rows.map(toRunRow), meta: { total: n, page: q.page, pageSize: q.pageSize } };
}

/** A network's current metrics and every run it has had (the provenance trail). */
export async function networkMetrics(networkId: number): Promise<{ current: NetworkMetricsSummary; runs: NetworkRunRow[] }> {
  const [exists] = await sequelize().query(`SELECT id FROM networks WHERE id = :networkId`, { replacements: { networkId }, type: QueryTypes.SELECT });
  if (!exists) throw ApiError.notFound("No such network.");
  const current = (await getCurrentMetrics([networkId], { showErrors: true })).get(networkId)!;
  const rows = await sequelize().query<RunListRow>(`${RUN_SELECT} WHERE r.network_id = :networkId ORDER BY r.id DESC`, {
    replacements: { networkId },
    type: QueryTypes.SELECT,
  });
  return { current, runs: rows.map(toRunRow) };
}

interface QueueCountsRow {
  queued: number;
  running: number;
  nulls_pending: number;
  done: number;
  failed: number;
  total: number;
}

function toPhaseCounts(r: QueueCountsRow): QueuePhaseCounts {
  return {
    queued: r.queued,
    running: r.running,
    nullsPending: r.nulls_pending,
    done: r.done,
    failed: r.failed,
    total: r.total,
    observedDone: r.nulls_pending + r.done,
  };
}

/** Finished runs per minute are measured over at most this window (or since the wave started). */
export const QUEUE_RATE_WINDOW_SECONDS = 300;

const PHASE_COUNTS = `
  count(*) FILTER (WHERE status = 'queued' AND NOT observed_only)::int AS queued,
  count(*) FILTER (WHERE status = 'running' AND NOT observed_only)::int AS running,
  count(*) FILTER (WHERE observed_only)::int AS nulls_pending,
  count(*) FILTER (WHERE status IN ('succeeded', 'superseded'))::int AS done,
  count(*) FILTER (WHERE status = 'failed')::int AS failed,
  count(*)::int AS total`;

/**
 * Progress of the metric runs of the current settings, by phase. The worker stores a run's observed
 * figures as results.phase = "observed" while the run is still queued or running (null replicates
 * pending); the full result turns it "succeeded". Work outside batches (queued by publishing) is counted
 * from the start of its current wave: the latest moment no such run was waiting or running, found by
 * walking the runs in creation order (a run starts a wave when every earlier run had finished before it
 * was created).
 */
export async function queueProgress(now = new Date()): Promise<QueueProgress> {
  const hash = settingsHash(await getPipelineSettings());
  const rows = await sequelize().query<QueueCountsRow & { scope: "overall" | "unbatched"; since: Date | null; finished_recent: number; window_start: Date | null }>(
    `WITH r AS (
       SELECT id, batch_id, status, created_at, finished_at,
              (status IN ('queued', 'running') AND results->>'phase' = 'observed') IS TRUE AS observed_only
         FROM metric_runs WHERE settings_hash = :hash
     ), w AS (
       SELECT id, created_at,
              max(COALESCE(finished_at, 'infinity'::timestamptz))
                OVER (ORDER BY created_at, id ROWS BETWEEN UNBOUNDED PRECEDING AND 1 PRECEDING) AS prev_max
         FROM r WHERE batch_id IS NULL
     ), s AS (
       SELECT max(created_at) AS since FROM w WHERE prev_max IS NULL OR created_at > prev_max
     ), win AS (
       SELECT s.since, GREATEST(s.since, CAST(:now AS timestamptz) - make_interval(secs => :window)) AS window_start FROM s
     )
     SELECT 'overall' AS scope, NULL::timestamptz AS since, NULL::timestamptz AS window_start, 0 AS finished_recent, ${PHASE_COUNTS} FROM r
     UNION ALL
     SELECT 'unbatched', win.since, win.window_start,
            count(*) FILTER (WHERE r.finished_at >= win.window_start AND r.status IN ('succeeded', 'superseded', 'failed'))::int,
            ${PHASE_COUNTS}
       FROM win LEFT JOIN r ON r.batch_id IS NULL AND r.created_at >= win.since
      GROUP BY win.since, win.window_start`,
    { replacements: { hash, now: now.toISOString(), window: QUEUE_RATE_WINDOW_SECONDS }, type: QueryTypes.SELECT },
  );
  const overallRow = rows.find((r) => r.scope === "overall")!;
  const u = rows.find((r) => r.scope === "unbatched")!;
  // The LEFT JOIN counts one empty row when there is no unbatched work at all.
  const unbatchedCounts = u.since ? toPhaseCounts(u) : toPhaseCounts({ queued: 0, running: 0, nulls_pending: 0, done: 0, failed: 0, total: 0 });
  const unfinished = unbatchedCounts.queued + unbatchedCounts.running + unbatchedCounts.nullsPending;
  let ratePerMinute: number | null = null;
  if (u.window_start && u.finished_recent > 0) {
    const minutes = Math.max((now.getTime() - new Date(u.window_start).getTime()) / 60_000, 1 / 60);
    ratePerMinute = Math.round((u.finished_recent / minutes) * 100) / 100;
  }
  const overall = toPhaseCounts(overallRow);
  return {
    settingsHash: hash,
    unbatched: {
      ...unbatchedCounts,
      since: u.since ? new Date(u.since).toISOString() : null,
      ratePerMinute,
      etaSeconds: unfinished === 0 ? 0 : ratePerMinute ? Math.round((unfinished / ratePerMinute) * 60) : null,
    },
    overall,
    active: overall.queued + overall.running + overall.nullsPending > 0,
  };
}
