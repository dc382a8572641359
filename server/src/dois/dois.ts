/**
 * DOI registration through the job queue. Publishing reserves the DOI names in its own transaction
 * (`reserveDois`: rows in `dataset_dois`, state `pending`) and, once committed, sends one "doi-sync" job
 * for the dataset; withdrawal (and anything else that changes what DataCite should hold) calls
 * `requestDoiSync`. Nothing here can block or roll back publishing: DataCite is only called by the job.
 *
 * The job (`syncDatasetDois`) is idempotent: for each DOI of the dataset it builds the DataCite metadata
 * from the database (lib/datacite/metadata.ts), and
 *   - a DOI DataCite does not know yet is created (findable at once),
 *   - a DOI DataCite knows (a retried job, or a job that failed after DataCite stored it) is updated only
 *     when its metadata differs from what DataCite holds (`sent_hash`),
 * so a DOI is registered once however often the job runs. A failure (DataCite down, a refused payload)
 * throws, and the queue retries with exponential backoff (TB_DOI_RETRY_LIMIT, TB_DOI_RETRY_DELAY_SECONDS);
 * the sweeper re-sends jobs for DOIs still out of date (e.g. after the retries ran out, or a restart).
 * Queue policy "stately" with the dataset as singleton key: at most one job waits and one runs per dataset.
 */
import { QueryTypes, type Transaction } from "sequelize";
import type PgBoss from "pg-boss";
import { config, jobSettings } from "../config/env";
import { sequelize } from "../db/sequelize";
import { logger } from "../lib/logger";
import { DataciteClient } from "../lib/datacite/client";
import { attributesHash, conceptDoiAttributes, conceptDoiName, versionDoiAttributes, versionDoiName, type DoiDatasetInput } from "../lib/datacite/metadata";
import type { StudyMetadata } from "@shared/types/dataset";
import { doiUrl } from "@shared/citation";
import { getBoss } from "../pipeline/queue";

export const DOI_QUEUE = "doi-sync";

function doiJobOptions() {
  const s = jobSettings();
  return { retryLimit: s.doiRetryLimit, retryDelay: s.doiRetryDelaySeconds, retryBackoff: true, expireInSeconds: 300 };
}

// the queue is created once per pg-boss instance (the metrics queue module owns the instance and may
// restart it)
const withQueue = new WeakMap<PgBoss, Promise<void>>();
async function doiBoss(): Promise<PgBoss> {
  const b = await getBoss();
  let ready = withQueue.get(b);
  if (!ready) {
    // one creation per instance even when a publication and the worker's start ask at the same moment
    ready = (async () => {
      if (!(await b.getQueue(DOI_QUEUE))) await b.createQueue(DOI_QUEUE, { name: DOI_QUEUE, policy: "stately", ...doiJobOptions() });
    })();
    withQueue.set(b, ready);
    ready.catch(() => withQueue.delete(b));
  }
  await ready;
  return b;
}

/** Queues a sync of the dataset's DOIs (a duplicate of a waiting job is dropped by the queue). */
export async function sendDoiJob(datasetId: number): Promise<void> {
  if (!config().datacite.enabled) return;
  const b = await doiBoss();
  await b.send(DOI_QUEUE, { datasetId }, { ...doiJobOptions(), singletonKey: `dataset:${datasetId}` });
  for (const id of workerIds) b.notifyWorker(id);
}

function sendLater(datasetId: number): void {
  sendDoiJob(datasetId).catch((err: unknown) => logger.warn({ err, datasetId }, "DOI job not sent now; the sweeper will send it"));
}

/**
 * In the publishing transaction: reserves the concept DOI (first publication) and the version's DOI, marks
 * every DOI of the dataset out of date, and sends the job after the commit. Never throws: DOIs must not
 * stop a publication (the sweeper catches up).
 */
export async function reserveDois(datasetId: number, accession: string, versionId: number, versionNumber: number, t: Transaction): Promise<void> {
  const { enabled, prefix } = config().datacite;
  if (!enabled) return;
  try {
    await sequelize().transaction({ transaction: t }, async (sp) => {
      await sequelize().query(
        `INSERT INTO dataset_dois (doi, dataset_id, version_id) VALUES (:concept, :datasetId, NULL), (:version, :datasetId, :versionId)
         ON CONFLICT DO NOTHING`,
        { replacements: { concept: conceptDoiName(prefix, accession), version: versionDoiName(prefix, accession, versionNumber), datasetId, versionId }, transaction: sp },
      );
      await markOutOfDate(datasetId, sp);
    });
    t.afterCommit(() => sendLater(datasetId));
  } catch (err) {
    logger.error({ err, datasetId }, "could not reserve DOIs for a publication");
  }
}

async function markOutOfDate(datasetId: number, t?: Transaction): Promise<void> {
  await sequelize().query(`UPDATE dataset_dois SET requested_at = clock_timestamp(), updated_at = now() WHERE dataset_id = :datasetId`, { replacements: { datasetId }, transaction: t });
}

/** The metadata DataCite should hold changed (withdrawal, correction): sync the dataset's DOIs after the commit. */
export async function requestDoiSync(datasetId: number, t?: Transaction): Promise<void> {
  if (!config().datacite.enabled) return;
  await markOutOfDate(datasetId, t);
  if (t) t.afterCommit(() => sendLater(datasetId));
  else sendLater(datasetId);
}

interface DoiRow {
  id: number;
  doi: string;
  version_id: number | null;
  state: "pending" | "registered";
  sent_hash: string | null;
  requested_at: Date;
}

/** Everything the metadata builder needs about one dataset, read fresh. */
async function loadDataset(datasetId: number): Promise<{ input: DoiDatasetInput; rows: DoiRow[]; versionNumbers: Map<number, number> } | null> {
  const [ds] = await sequelize().query<{ accession: string | null }>(`SELECT accession FROM datasets WHERE id = :datasetId`, { replacements: { datasetId }, type: QueryTypes.SELECT });
  if (!ds?.accession) return null;
  const rows = await sequelize().query<DoiRow>(`SELECT id, doi, version_id, state, sent_hash, requested_at FROM dataset_dois WHERE dataset_id = :datasetId ORDER BY id`, {
    replacements: { datasetId },
    type: QueryTypes.SELECT,
  });
  const versions = await sequelize().query<{ id: number; number: number; state: "published" | "withdrawn"; metadata: Partial<StudyMetadata>; published_at: Date | null; withdrawn_at: Date | null; withdrawal_reason: string | null }>(
    `SELECT id, number, state, metadata, published_at, withdrawn_at, withdrawal_reason FROM dataset_versions
      WHERE dataset_id = :datasetId AND state IN ('published', 'withdrawn') ORDER BY number`,
    { replacements: { datasetId }, type: QueryTypes.SELECT },
  );
  const doiOfVersion = new Map(rows.filter((r) => r.version_id !== null).map((r) => [r.version_id!, r.doi]));
  return {
    rows,
    versionNumbers: new Map(versions.map((v) => [v.id, v.number])),
    input: {
      accession: ds.accession,
      conceptDoi: rows.find((r) => r.version_id === null)?.doi ?? null,
      publicUrl: config().publicUrl,
      versions: versions.map((v) => ({
        number: v.number,
        state: v.state,
        metadata: v.metadata ?? {},
        publishedAt: v.published_at ? new Date(v.published_at) : null,
        withdrawnAt: v.withdrawn_at ? new Date(v.withdrawn_at) : null,
        withdrawalReason: v.withdrawal_reason,
        doi: doiOfVersion.get(v.id) ?? null,
      })),
    },
  };
}

export function dataciteClient(): DataciteClient {
  const c = config().datacite;
  return new DataciteClient({ apiUrl: c.apiUrl, repositoryId: c.repositoryId, password: c.password });
}

export interface SyncResult {
  created: string[];
  updated: string[];
  unchanged: string[];
}

/** Brings DataCite up to date with every DOI of the dataset (the job's handler; safe to run again). */
export async function syncDatasetDois(datasetId: number, client = dataciteClient()): Promise<SyncResult> {
  const out: SyncResult = { created: [], updated: [], unchanged: [] };
  const loaded = await loadDataset(datasetId);
  if (!loaded || !loaded.input.versions.length) return out;
  const { input, rows, versionNumbers } = loaded;
  // Versions first, then the concept DOI that lists them.
  const ordered = [...rows.filter((r) => r.version_id !== null), ...rows.filter((r) => r.version_id === null)];
  for (const row of ordered) {
    const number = row.version_id === null ? null : versionNumbers.get(row.version_id);
    if (number === undefined) continue; // a version no longer published or withdrawn (cannot happen today)
    const attrs = number === null ? conceptDoiAttributes(input) : versionDoiAttributes(input, number);
    const hash = attributesHash(attrs);
    try {
      if (row.state === "registered" && row.sent_hash === hash) {
        out.unchanged.push(row.doi);
      } else {
        const known = await client.get(row.doi);
        if (!known) {
          await client.create(attrs);
          out.created.push(row.doi);
        } else if (row.sent_hash !== hash || known.attributes.state !== "findable") {
          // DataCite has it (an earlier attempt stored it before failing, or the metadata changed)
          await client.update(row.doi, attrs);
          out.updated.push(row.doi);
        } else out.unchanged.push(row.doi);
      }
      await sequelize().query(
        `UPDATE dataset_dois SET state = 'registered', sent_hash = :hash, registered_at = coalesce(registered_at, now()), last_error = NULL,
                attempts = attempts + 1, synced_at = GREATEST(coalesce(synced_at, :requested), :requested), updated_at = now()
          WHERE id = :id`,
        { replacements: { id: row.id, hash, requested: row.requested_at } },
      );
    } catch (err) {
      await sequelize().query(`UPDATE dataset_dois SET attempts = attempts + 1, last_error = :error, updated_at = now() WHERE id = :id`, {
        replacements: { id: row.id, error: err instanceof Error ? err.message.slice(0, 1000) : String(err) },
      });
      throw err;
    }
  }
  return out;
}

/** Datasets whose DOIs are out of date (never synced, or changed since): the sweeper sends their jobs. */
export async function datasetsToSync(): Promise<number[]> {
  const rows = await sequelize().query<{ dataset_id: number }>(
    `SELECT DISTINCT dataset_id FROM dataset_dois WHERE synced_at IS NULL OR synced_at < requested_at OR state <> 'registered' ORDER BY dataset_id`,
    { type: QueryTypes.SELECT },
  );
  return rows.map((r) => r.dataset_id);
}

let workerIds: string[] = [];
let workerBoss: PgBoss | undefined;
let sweepTimer: NodeJS.Timeout | undefined;

export async function sweepDois(): Promise<number> {
  const ids = await datasetsToSync();
  for (const id of ids) await sendDoiJob(id);
  return ids.length;
}

/** Starts taking DOI jobs in this process (npm start's server; tests). */
export async function startDoiWorker(opts: { pollingIntervalSeconds?: number; sweepSeconds?: number } = {}): Promise<void> {
  if (!config().datacite.enabled || workerIds.length) return;
  const b = await doiBoss();
  const id = await b.work<{ datasetId: number }>(DOI_QUEUE, { batchSize: 1, pollingIntervalSeconds: opts.pollingIntervalSeconds ?? 2 }, async (jobs) => {
    for (const job of jobs) {
      const r = await syncDatasetDois(job.data.datasetId);
      if (r.created.length || r.updated.length) logger.info({ datasetId: job.data.datasetId, ...r }, "DOIs registered with DataCite");
    }
  });
  workerIds.push(id);
  workerBoss = b;
  const sweep = () => sweepDois().catch((err: unknown) => logger.warn({ err }, "DOI sweeper failed"));
  await sweep();
  sweepTimer = setInterval(() => void sweep(), (opts.sweepSeconds ?? 300) * 1000);
  sweepTimer.unref();
}

export async function stopDoiWorker(): Promise<void> {
  if (sweepTimer) clearInterval(sweepTimer);
  sweepTimer = undefined;
  for (const id of workerIds) await workerBoss?.offWork({ id }).catch(() => undefined);
  workerIds = [];
  workerBoss = undefined;
}

/** A dataset's DOIs as pages and the API show them. */
export interface DoiInfo {
  doi: string;
  state: "pending" | "registered";
  url: string;
}

export async function doisOfDataset(datasetId: number): Promise<{ concept: DoiInfo | null; versions: Map<number, DoiInfo> }> {
  const rows = await sequelize().query<{ doi: string; state: "pending" | "registered"; number: number | null }>(
    `SELECT x.doi, x.state, v.number FROM dataset_dois x LEFT JOIN dataset_versions v ON v.id = x.version_id WHERE x.dataset_id = :datasetId`,
    { replacements: { datasetId }, type: QueryTypes.SELECT },
  );
  const info = (r: (typeof rows)[number]): DoiInfo => ({ doi: r.doi, state: r.state, url: doiUrl(r.doi) });
  const concept = rows.find((r) => r.number === null);
  return { concept: concept ? info(concept) : null, versions: new Map(rows.filter((r) => r.number !== null).map((r) => [r.number!, info(r)])) };
}

/** The registered DOI of a version (null while pending or when it has none). */
export async function registeredVersionDoi(versionId: number): Promise<string | null> {
  const [row] = await sequelize().query<{ doi: string }>(`SELECT doi FROM dataset_dois WHERE version_id = :versionId AND state = 'registered'`, {
    replacements: { versionId },
    type: QueryTypes.SELECT,
  });
  return row?.doi ?? null;
}
