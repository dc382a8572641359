/** `npm start` registers DOIs in the server process (startup.ts registers these). */
import { config } from "../config/env";
import type { ShutdownTask, StartupTask } from "../startup";
import { startDoiWorker, stopDoiWorker } from "./dois";

export const startDoiWorkerTask: StartupTask = async ({ log }) => {
  const c = config().datacite;
  if (!c.enabled) return log("DOIs are off (TB_DOI=off).");
  await startDoiWorker();
  log(`DOI registration with DataCite at ${c.apiUrl} (prefix ${c.prefix}).`);
};

export const stopDoiWorkerTask: ShutdownTask = () => stopDoiWorker();
