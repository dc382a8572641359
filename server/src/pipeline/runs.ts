/**
 * Creating queued metric runs: one per network for the given settings, unless a successful run with the
 * same settings hash exists (then skipped, unless forced) or a run of these settings is already waiting or
 * running (then reused: it is attached to the batch, if any). Runs are rows first, jobs second: the caller
 * sends the jobs after its transaction commits (queue.ts sendRunJobs), and the sweeper re-sends any
 * queued run whose job never arrived.
 */
import { QueryTypes, type Transaction } from "sequelize";
import type { PipelineSettings } from "@shared/types/pipeline";
import { sequelize } from "../db/sequelize";
import { normalizeSettings, settingsHash } from "./settings";

export interface QueuedRun {
  id: number;
  networkId: number;
  settingsHash: string;
}

export interface QueueRunsResult {
  created: QueuedRun[];
  reused: QueuedRun[];
  skipped: number[];
}

export async function createQueuedRuns(
  networkIds: number[],
  opts: { settings: PipelineSettings; force?: boolean; batchId?: number | null; transaction?: Transaction },
): Promise<QueueRunsResult> {
  const ids = [...new Set(networkIds)];
  const result: QueueRunsResult = { created: [], reused: [], skipped: [] };
  if (!ids.length) return result;
  const settings = normalizeSettings(opts.settings);
  const hash = settingsHash(settings);
  const { transaction } = opts;
  const existing = await sequelize().query<{ id: number; network_id: number; status: string }>(
    `SELECT id, network_id, status FROM metric_runs
      WHERE network_id IN (:ids) AND settings_hash = :hash AND status IN ('succeeded', 'queued', 'running')
      ORDER BY id`,
    { replacements: { ids, hash }, type: QueryTypes.SELECT, transaction },
  );
  const succeeded = new Set(existing.filter((r) => r.status === "succeeded").map((r) => r.network_id));
  const active = new Map(existing.filter((r) => r.status !== "succeeded").map((r) => [r.network_id, r.id]));
  const toCreate: number[] = [];
  for (const id of ids) {
    if (active.has(id)) result.reused.push({ id: active.get(id)!, networkId: id, settingsHash: hash });
    else if (succeeded.has(id) && !opts.force) result.skipped.push(id);
    else toCreate.push(id);
  }
  if (result.reused.length && opts.batchId) {
    await sequelize().query(`UPDATE metric_runs SET batch_id = :batchId, updated_at = now() WHERE id IN (:runIds)`, {
      replacements: { batchId: opts.batchId, runIds: result.reused.map((r) => r.id) },
      transaction,
    });
  }
  if (toCreate.length) {
    const rows = await sequelize().query<{ id: number; network_id: number }>(
      `INSERT INTO metric_runs (network_id, batch_id, settings, settings_hash, status, force, seed, created_at, updated_at)
       SELECT n, :batchId, CAST(:settings AS jsonb), :hash, 'queued', :force, :seed, now(), now()
         FROM unnest(ARRAY[:networkIds]::int[]) AS n
       RETURNING id, network_id`,
      {
        replacements: {
          batchId: opts.batchId ?? null,
          settings: JSON.stringify(settings),
          hash,
          force: !!opts.force,
          seed: settings.seed,
          networkIds: toCreate,
        },
        type: QueryTypes.SELECT,
        transaction,
      },
    );
    result.created = rows.map((r) => ({ id: r.id, networkId: r.network_id, settingsHash: hash }));
  }
  return result;
}
