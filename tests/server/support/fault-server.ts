/**
 * The server as `npm start` runs it (scripts/run.ts) minus the demo data and the mail catcher: process
 * guards, wait for the database, migrations, the web server, the catalogue listener and a metrics worker.
 * Prints "READY <url>" when it answers. Used by the fault tests (scratch-cluster.ts).
 */
import { migrateUp } from "../../../server/src/db/migrator";
import { waitForDatabase } from "../../../server/src/db/sequelize";
import { installProcessGuards } from "../../../server/src/lib/process-guards";
import { initModels } from "../../../server/src/models";
import { startServer } from "../../../server/src/index";
import { startCatalogueTask } from "../../../server/src/api/catalogue/catalogue.startup";
import { startMetricsWorker } from "../../../server/src/pipeline/metrics-worker";
import { config } from "../../../server/src/config/env";

installProcessGuards("server");
const url0 = config().databaseUrl;
await waitForDatabase(url0);
await migrateUp(url0);
initModels();
const { url } = await startServer(0, "127.0.0.1");
await startCatalogueTask({ log: () => undefined });
await startMetricsWorker();
console.log(`READY ${url}`);
process.on("SIGTERM", () => process.exit(0));
