/**
 * A standalone metrics worker (`npm run worker`): connects to the database in DATABASE_URL and works the
 * metrics queue with a worker-thread pool sized to this machine's cores. Start as many as you like, on any
 * machine that reaches the database. SIGINT/SIGTERM: finish the running jobs (up to 15 s; unfinished ones go back to the queue), then exit.
 */
import { config } from "./config/env";
import { migrateUp } from "./db/migrator";
import { closeSequelize, waitForDatabase } from "./db/sequelize";
import { installProcessGuards } from "./lib/process-guards";
import { startMetricsWorker, stopMetricsWorker } from "./pipeline/metrics-worker";
import { poolThreads } from "./pipeline/pool";
import { initModels } from "./models";

installProcessGuards("metrics worker");
await waitForDatabase(config().databaseUrl, { log: (m) => console.log(m) });
await migrateUp(config().databaseUrl);
initModels();
await startMetricsWorker();
console.log(`Tanglebank metrics worker started (pid ${process.pid}, ${poolThreads()} threads)`);

let stopping = false;
async function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  console.log(`${signal}: finishing running metrics jobs…`);
  await stopMetricsWorker({ timeoutMs: 15_000 }).catch((err: unknown) => console.error(err));
  await closeSequelize();
  process.exit(0);
}
process.on("SIGINT", () => void stop("SIGINT"));
process.on("SIGTERM", () => void stop("SIGTERM"));
