/**
 * Tasks run after the server listens (e.g. starting a metrics worker) and before it stops, by `npm start`
 * (scripts/run.ts) and by the deployed server (main.ts). Features register theirs here, one line each.
 * Seeding the invented demo scenario is `npm start`'s own step (scripts/run.ts), never a deployment's.
 */
export type StartupTask = (ctx: { log: (msg: string) => void }) => Promise<void>;
export type ShutdownTask = () => Promise<void>;

export const startupTasks: StartupTask[] = [];
export const shutdownTasks: ShutdownTask[] = [];

import { startMetricsWorkerTask, stopMetricsWorkerTask } from "./pipeline/startup";
startupTasks.push(startMetricsWorkerTask);
shutdownTasks.unshift(stopMetricsWorkerTask);
import { startCatalogueTask, stopCatalogueTask } from "./api/catalogue/catalogue.startup";
startupTasks.push(startCatalogueTask);
shutdownTasks.unshift(stopCatalogueTask);
import { startDoiWorkerTask, stopDoiWorkerTask } from "./dois/dois.startup";
startupTasks.push(startDoiWorkerTask);
shutdownTasks.unshift(stopDoiWorkerTask);
