/** `npm start` runs a metrics worker inside the server process (startup.ts registers these). */
import type { ShutdownTask, StartupTask } from "../startup";
import { startMetricsWorker, stopMetricsWorker } from "./metrics-worker";
import { poolThreads } from "./pool";

export const startMetricsWorkerTask: StartupTask = async ({ log }) => {
  await startMetricsWorker();
  log(`Metrics worker running (${poolThreads()} threads); more with \`npm run worker\`.`);
};

/** Ctrl-C: running jobs get 5 s, then go back to the queue (continued at the next start). */
export const stopMetricsWorkerTask: ShutdownTask = () => stopMetricsWorker({ timeoutMs: 5_000 });
