/**
 * The server process of a deployment (README: "Deploying"): `npm run build`, then
 * `NODE_ENV=production node dist/server/main.js`. Waits for the database, applies pending migrations,
 * starts the web server (API and built client on one port) and the background work registered in
 * startup.ts (metrics worker, catalogue index, DOI registration), and stops cleanly on SIGINT/SIGTERM.
 * Unlike `npm start` it runs no local stand-ins (mail catcher, DataCite, ORCID) and seeds no demo data.
 *
 * Exit status: 0 after a clean stop; 1 when the database could not be reached (a supervisor may start it
 * again); 78 for a failure a restart cannot cure (a bad setting, a port in use, a failed migration).
 */
import { config } from "./config/env";
import { EXIT_CANNOT_RESTART, runUntilSignalled } from "./lib/process-run";

const say = (msg: string) => console.log(`[tanglebank] ${msg}`);
const fail = (err: unknown) => `The server could not start: ${err instanceof Error ? err.message : String(err)}`;

// Settings first, before any module that reads them at import time (the logger does).
try {
  config();
} catch (err) {
  console.error(`[tanglebank] ${fail(err)}`);
  process.exit(EXIT_CANNOT_RESTART);
}

async function main(): Promise<() => Promise<void>> {
  const { installProcessGuards } = await import("./lib/process-guards");
  const { waitForDatabase } = await import("./db/sequelize");
  const { migrateUp } = await import("./db/migrator");
  const { initModels } = await import("./models");
  const { startServer, shutdownServerResources } = await import("./index");
  const { startupTasks, shutdownTasks } = await import("./startup");

  const cfg = config();
  installProcessGuards("server");
  await waitForDatabase(cfg.databaseUrl, { log: say });
  const applied = await migrateUp(cfg.databaseUrl);
  say(applied.length ? `Applied migrations: ${applied.join(", ")}` : "Database schema is up to date.");
  initModels();
  const { url, close } = await startServer();
  for (const task of startupTasks) await task({ log: say });
  say(`Tanglebank (${cfg.nodeEnv}) listening on ${url}; public address ${cfg.publicUrl}`);
  return async () => {
    for (const task of shutdownTasks) await task().catch(() => undefined);
    await close();
    await shutdownServerResources();
  };
}

await runUntilSignalled(main, say, (err) => console.error(`[tanglebank] ${fail(err)}`));
