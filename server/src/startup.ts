/**
 * Tasks run by `npm start` after the server listens (e.g. seeding the demo scenario, starting a metrics
 * worker) and before it stops. Features register theirs here, one line each.
 */
export type StartupTask = (ctx: { log: (msg: string) => void }) => Promise<void>;
export type ShutdownTask = () => Promise<void>;

export const startupTasks: StartupTask[] = [];
export const shutdownTasks: ShutdownTask[] = [];

import { startMetricsWorkerTask, stopMetricsWorkerTask } from "./jobs/startup";
startupTasks.push(startMetricsWorkerTask);
shutdownTasks.unshift(stopMetricsWorkerTask);
import { startCatalogueTask, stopCatalogueTask } from "./api/catalogue/catalogue.startup";
startupTasks.push(startCatalogueTask);
shutdownTasks.unshift(stopCatalogueTask);
import { startDoiWorkerTask, stopDoiWorkerTask } from "./jobs/dois.startup";
startupTasks.push(startDoiWorkerTask);
shutdownTasks.unshift(stopDoiWorkerTask);
import { seedDemoScenarioTask } from "./db/seeders/demo-scenario";
startupTasks.push(seedDemoScenarioTask);
