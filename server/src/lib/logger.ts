import { pino, type DestinationStream, type Logger } from "pino";
import { config } from "../config/env";

/**
 * Credentials never reach the logs: pino-http's request serializer writes every header, so the API token
 * (Authorization), the session cookie and a new session's Set-Cookie are replaced by "[Redacted]".
 */
export const LOG_REDACT_PATHS = ["req.headers.authorization", "req.headers.cookie", 'req.headers["x-csrf-token"]', 'res.headers["set-cookie"]'];

export function createLogger(opts: { level?: string; destination?: DestinationStream } = {}): Logger {
  const options = { level: opts.level ?? config().logLevel, base: undefined, redact: LOG_REDACT_PATHS };
  return opts.destination ? pino(options, opts.destination) : pino(options);
}

export const logger = createLogger();
