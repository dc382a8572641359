/**
 * Telling "the database is not reachable" apart from every other error, so that an outage (PostgreSQL
 * restarting, failing over, refusing connections, a backend terminated mid-query) answers 503 with a plain
 * message on every route instead of a 500 carrying the driver's text (which names hosts, ports and users).
 *
 * Errors arrive wrapped in different ways: Sequelize wraps the driver's error in `parent`/`original`
 * (ConnectionError and its subclasses, or DatabaseError for a query cut short), connect-pg-simple and
 * pg-boss pass pg's own errors through, and some carry a `cause`. We look through all of them.
 */

/** SQLSTATE classes and codes that mean the server is going away or not accepting work now. */
const UNAVAILABLE_SQLSTATE = /^(08|57P0[1-4]|53300|3D000)/;
/** Socket-level codes of a connection that could not be made or was cut. */
const UNAVAILABLE_ERRNO = new Set(["ECONNREFUSED", "ECONNRESET", "ETIMEDOUT", "EPIPE", "ENOTFOUND", "EHOSTUNREACH", "ENETUNREACH", "EAI_AGAIN"]);
/** Messages of pg and Sequelize that carry no code. */
const UNAVAILABLE_MESSAGE =
  /Connection terminated|connection (was )?(closed|lost)|Client has encountered a connection error|Client was closed and is not queryable|timeout exceeded when trying to connect|Connection timed out|Cannot use a pool after calling end|the database system is (starting up|shutting down|in recovery mode)/i;
/** Sequelize's names for connection problems (ConnectionError and its subclasses, pool acquire timeout). */
const UNAVAILABLE_NAME = /^Sequelize(Connection\w*Error|ConnectionAcquireTimeoutError|HostNotFoundError|HostNotReachableError|InvalidConnectionError|AccessDeniedError)$/;

interface Inspectable {
  name?: unknown;
  code?: unknown;
  message?: unknown;
  parent?: unknown;
  original?: unknown;
  cause?: unknown;
}

/** True when the error (or one it wraps) says the database cannot be reached or is not serving now. */
export function isDatabaseUnavailable(err: unknown): boolean {
  const seen = new Set<unknown>();
  const stack: unknown[] = [err];
  while (stack.length) {
    const e = stack.pop();
    if (!e || typeof e !== "object" || seen.has(e)) continue;
    seen.add(e);
    const x = e as Inspectable;
    if (typeof x.name === "string" && UNAVAILABLE_NAME.test(x.name)) return true;
    if (typeof x.code === "string" && (UNAVAILABLE_SQLSTATE.test(x.code) || UNAVAILABLE_ERRNO.has(x.code))) return true;
    if (typeof x.message === "string" && UNAVAILABLE_MESSAGE.test(x.message)) return true;
    stack.push(x.parent, x.original, x.cause);
  }
  return false;
}

/** What callers are told during an outage: no host, port, user or driver text. */
export const DATABASE_UNAVAILABLE_MESSAGE = "The database is not reachable right now. Nothing was changed; please try again in a minute.";
