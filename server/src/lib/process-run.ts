/**
 * How a long-running process of ours (the deployed server, `npm start`) starts and stops: run `start`, which
 * returns the process's stop function, then stop once on SIGINT or SIGTERM and exit 0. A failed start exits
 * 1 when the database could not be reached (a supervisor may start it again) and 78 for a failure a restart
 * cannot cure (a bad setting, a port in use, a failed migration). Imports nothing that reads the settings, so
 * a process may load it before its settings are checked.
 */
import { isDatabaseUnavailable } from "./db-errors";

/** Exit status of a failure a restart cannot cure. */
export const EXIT_CANNOT_RESTART = 78;

export async function runUntilSignalled(
  start: () => Promise<() => Promise<void>>,
  say: (msg: string) => void,
  reportFailure: (err: unknown) => void,
): Promise<void> {
  let stopping = false;
  let shutdown: (() => Promise<void>) | undefined;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    say(`${signal}: stopping…`);
    await shutdown?.();
    process.exit(0);
  };
  process.on("SIGINT", () => void stop("SIGINT"));
  process.on("SIGTERM", () => void stop("SIGTERM"));
  try {
    shutdown = await start();
  } catch (err) {
    reportFailure(err);
    process.exit(isDatabaseUnavailable(err) ? 1 : EXIT_CANNOT_RESTART);
  }
}
