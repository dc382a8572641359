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
import { config } from "../config/env";
import { sequelize } from "../db/sequelize";
import { catalogueStore } from "../api/catalogue/catalogue.store";
import { logger } from "./logger";

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

/** Starts listening (idempotent); reconnects after a lost connection. */
export async function startCatalogueListener(): Promise<void> {
  stopping = false;
  if (client) return;
  const c = new pg.Client({ connectionString: config().databaseUrl });
  client = c;
  const reconnect = () => {
    if (client === c) client = null;
    c.end().catch(() => undefined);
    if (!stopping) retry = setTimeout(() => void startCatalogueListener().catch(() => undefined), 2000);
  };
  c.on("error", (err) => {
    logger.warn({ err }, "catalogue listener connection lost; reconnecting");
    reconnect();
  });
  c.on("notification", (msg) => {
    if (msg.channel !== CATALOGUE_CHANNEL) return;
    void handleCatalogueNotification(msg.payload).catch((err) => logger.error({ err }, "catalogue refresh failed"));
  });
  try {
    await c.connect();
    await c.query(`LISTEN ${CATALOGUE_CHANNEL}`);
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
