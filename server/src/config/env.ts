/**
 * Configuration, read once from the environment and validated at start. A bad value stops the process
 * with a message naming the variable.
 */
export interface Config {
  nodeEnv: "development" | "test" | "production";
  port: number;
  host: string;
  /** The public base URL used in e-mailed links, e.g. http://127.0.0.1:3000 */
  publicUrl: string;
  databaseUrl: string;
  sessionSecret: string;
  smtp: { host: string; port: number; secure: boolean; user?: string; pass?: string; from: string };
  /** Local mail catcher (development and tests): SMTP port it listens on. */
  mailCatcherPort: number;
  uploadMaxBytes: number;
  uploadMaxFiles: number;
  logLevel: string;
  /** Rate limits (requests per window) */
  authRateLimit: number;
  apiRateLimit: number;
}

function int(name: string, fallback: number, min = 0, max = Number.MAX_SAFE_INTEGER): number {
  const raw = process.env[name];
  if (raw === undefined || raw === "") return fallback;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < min || n > max) {
    throw new Error(`Invalid environment variable ${name}=${JSON.stringify(raw)}: expected an integer in [${min}, ${max}]`);
  }
  return n;
}

function str(name: string, fallback: string): string {
  const raw = process.env[name];
  return raw === undefined || raw === "" ? fallback : raw;
}

export function loadConfig(): Config {
  const nodeEnvRaw = str("NODE_ENV", "development");
  if (!["development", "test", "production"].includes(nodeEnvRaw)) {
    throw new Error(`Invalid environment variable NODE_ENV=${nodeEnvRaw}: expected development, test or production`);
  }
  const nodeEnv = nodeEnvRaw as Config["nodeEnv"];
  const port = int("PORT", 3000, 0, 65535);
  const host = str("HOST", "127.0.0.1");
  const dbPort = int("TB_DB_PORT", 54329, 1, 65535);
  const databaseUrl = str("DATABASE_URL", `postgres://postgres@127.0.0.1:${dbPort}/tanglebank`);
  if (!/^postgres(ql)?:\/\//.test(databaseUrl)) throw new Error(`Invalid DATABASE_URL: must start with postgres://`);
  const mailCatcherPort = int("TB_MAIL_PORT", 2525, 0, 65535);
  const sessionSecret = str("SESSION_SECRET", nodeEnv === "production" ? "" : "tanglebank-development-secret-change-me");
  if (nodeEnv === "production" && sessionSecret.length < 32) {
    throw new Error("SESSION_SECRET must be set to at least 32 characters in production");
  }
  const cfg: Config = {
    nodeEnv,
    port,
    host,
    publicUrl: str("PUBLIC_URL", `http://${host}:${port}`).replace(/\/$/, ""),
    databaseUrl,
    sessionSecret,
    smtp: {
      host: str("SMTP_HOST", "127.0.0.1"),
      port: int("SMTP_PORT", mailCatcherPort, 0, 65535),
      secure: str("SMTP_SECURE", "false") === "true",
      user: process.env.SMTP_USER || undefined,
      pass: process.env.SMTP_PASS || undefined,
      from: str("MAIL_FROM", "Tanglebank <no-reply@tanglebank.test>"),
    },
    mailCatcherPort,
    uploadMaxBytes: int("TB_UPLOAD_MAX_BYTES", 100 * 1024 * 1024, 1024),
    uploadMaxFiles: int("TB_UPLOAD_MAX_FILES", 50, 1, 1000),
    logLevel: str("LOG_LEVEL", nodeEnv === "test" ? "silent" : "info"),
    authRateLimit: int("TB_AUTH_RATE_LIMIT", 20, 1),
    apiRateLimit: int("TB_API_RATE_LIMIT", 600, 1),
  };
  return cfg;
}

let cached: Config | undefined;
/** The process-wide configuration (loaded on first use). */
export function config(): Config {
  cached ??= loadConfig();
  return cached;
}
/** Tests change the environment and call this to re-read it. */
export function resetConfig(): void {
  cached = undefined;
}
