/**
 * Keeping every server process's catalogue and search index current. Publishing and withdrawal call
 * `notifyCatalogueChanged(datasetId, transaction)`: a PostgreSQL NOTIFY on the channel
 * `tanglebank_catalogue`, delivered to every listening process when the transaction commits (never for a
 * rolled-back one). Each process listens on a dedicated `pg` client and re-reads that dataset.
 * The catalogue store also checks cheap fingerprints lazily, so a missed notification only delays a
 * change by a few seconds.
 */
import pg from "pg";
import type { Transaction } from "sequelize";
import { config } from "../../config/env";
import { sequelize } from "../../db/sequelize";
import { catalogueStore } from "./catalogue.store";
import { logger } from "../../lib/logger";

export const CATALOGUE_CHANNEL = "tanglebank_catalogue";

/** Tells every server process that a dataset's published state changed (on commit, when in a transaction). */
export async function notifyCatalogueChanged(datasetId: number, transaction?: Transaction): Promise<void> {
  await sequelize().query(`SELECT pg_notify(:channel, :payload)`, {
    replacements: { channel: CATALOGUE_CHANNEL, payload: JSON.stringify({ datasetId }) },
    transaction,
  });
  if (!transaction) catalogueStore.invalidate();
  else transaction.afterCommit(() => catalogueStore.invalidate());
}

let client: pg.Client | null = null;
let stopping = false;
let retry: NodeJS.Timeout | null = null;
let failures = 0;

/** Applies one notification payload to this process's catalogue and search index. */
export async function handleCatalogueNotification(payload: string | undefined): Promise<void> {
  let datasetId: number | undefined;
  try {
    datasetId = Number((JSON.parse(payload ?? "{}") as { datasetId?: unknown }).datasetId);
  } catch {
    datasetId = undefined;
  }
  if (!datasetId || !Number.isInteger(datasetId)) {
    catalogueStore.invalidate();
    return;
  }
  await catalogueStore.refreshDataset(datasetId);
}

/**
 * Starts listening (idempotent). A lost connection (an error, or the server closing it on a restart) is
 * replaced: reconnection is tried every 2 s, then less often (up to every 30 s) while the database stays
 * away. Whatever was published meanwhile is caught by the store's lazy check once it answers again.
 */
export async function startCatalogueListener(): Promise<void> {
  stopping = false;
  if (client) return;
  const c = new pg.Client({ connectionString: config().databaseUrl, connectionTimeoutMillis: 5_000, keepAlive: true, application_name: "tanglebank-catalogue-listener" });
  client = c;
  let lost = false;
  const reconnect = () => {
    if (lost) return;
    lost = true;
    if (client === c) client = null;
    c.end().catch(() => undefined);
    if (stopping) return;
    const delay = Math.min(30_000, 2000 * 2 ** Math.min(failures, 4));
    failures++;
    retry = setTimeout(() => void startCatalogueListener().catch(() => undefined), delay);
    retry.unref();
  };
  c.on("error", (err) => {
    logger.warn({ err: { message: err.message, code: (err as { code?: string }).code } }, "catalogue listener: connection lost; reconnecting");
    reconnect();
  });
  c.on("end", reconnect);
  c.on("notification", (msg) => {
    if (msg.channel !== CATALOGUE_CHANNEL) return;
    void handleCatalogueNotification(msg.payload).catch((err) => logger.error({ err }, "catalogue refresh failed"));
  });
  try {
    await c.connect();
    await c.query(`LISTEN ${CATALOGUE_CHANNEL}`);
    if (failures > 0) logger.info("catalogue listener: listening again");
    failures = 0;
    // Anything published while we were not listening is caught by the lazy check.
    catalogueStore.invalidate();
  } catch (err) {
    reconnect();
    throw err;
  }
}

export async function stopCatalogueListener(): Promise<void> {
  stopping = true;
  if (retry) clearTimeout(retry);
  const c = client;
  client = null;
  await c?.end().catch(() => undefined);
}
