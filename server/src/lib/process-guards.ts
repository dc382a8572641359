/**
 * Process-level guards for the server and the metrics worker processes.
 *
 * A database outage must not end the process: every pool has an 'error' listener, but one library we use
 * (pg-boss 10) records a finished job's completion without awaiting it, so while PostgreSQL is away that
 * promise rejects with nobody to catch it, and Node ends the process on an unhandled rejection. Such
 * rejections — and only those that say the database is unreachable — are logged and the process goes on:
 * the job stays active and the metrics sweeper gives it back to the queue once the database answers.
 * Any other unhandled rejection or exception is a bug: it is logged and the process exits with status 1,
 * and `npm start` (scripts/start.sh) starts the server again.
 */
import { isDatabaseUnavailable } from "./db-errors";
import { logger } from "./logger";

let installed = false;

export function installProcessGuards(name: string): void {
  if (installed) return;
  installed = true;
  process.on("unhandledRejection", (reason) => {
    if (isDatabaseUnavailable(reason)) {
      logger.warn({ err: { message: (reason as Error)?.message, code: (reason as { code?: unknown })?.code } }, `${name}: a database call failed while the database was unreachable; going on`);
      return;
    }
    logger.fatal({ err: reason }, `${name}: unhandled rejection; stopping`);
    process.exitCode = 1;
    setImmediate(() => process.exit(1));
  });
  process.on("uncaughtException", (err) => {
    if (isDatabaseUnavailable(err)) {
      logger.warn({ err: { message: err.message, code: (err as { code?: unknown }).code } }, `${name}: a database connection failed; going on`);
      return;
    }
    logger.fatal({ err }, `${name}: uncaught exception; stopping`);
    process.exitCode = 1;
    setImmediate(() => process.exit(1));
  });
}
