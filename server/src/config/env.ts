/**
 * Configuration, read once from the environment and validated at start. A bad value stops the process
 * with a message naming the variable. Every setting the server reads is read here (README: "Address,
 * ports and settings" lists them); no other server module reads process.env.
 */
import { availableParallelism, tmpdir } from "node:os";
import { join } from "node:path";

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
  /** All files of one upload request together (counted while the body streams in). */
  uploadMaxRequestBytes: number;
  /** Folder for the temporary files of uploads in progress (removed when the request ends). */
  uploadTmpDir: string;
  /** Seconds for a request's headers to arrive (TB_HEADERS_TIMEOUT_SECONDS; default 20). */
  headersTimeoutSeconds: number;
  /** Seconds for a whole request, body included, to arrive (TB_REQUEST_TIMEOUT_SECONDS; default 600). */
  requestTimeoutSeconds: number;
  /** Seconds a connection may stay silent mid-request before it is answered 408 and closed (TB_IDLE_TIMEOUT_SECONDS; default 60). */
  idleTimeoutSeconds: number;
  /** Reading one uploaded file in a parse process: time limit (ms) and heap limit of the process (MB). */
  parseTimeoutMs: number;
  parseMaxMemoryMb: number;
  /** Child processes that read uploaded files (at most this many files are parsed at once). */
  parseThreads: number;
  logLevel: LogLevel;
  /** The metrics and DOI background jobs (validated at start; read again on each use by jobSettings()). */
  jobs: JobSettings;
  /** Rate limits (requests per window) */
  authRateLimit: number;
  apiRateLimit: number;
  /** DOIs through DataCite's REST API (README: "DOIs and ORCID"). */
  datacite: {
    enabled: boolean;
    /** The REST API base, e.g. https://api.datacite.org; by default the local stand-in on `standInPort`. */
    apiUrl: string;
    /** Port of the local DataCite stand-in that `npm start` runs (0: any free port). */
    standInPort: number;
    /** Whether apiUrl is the local stand-in (started by `npm start`) rather than a configured service. */
    standIn: boolean;
    repositoryId: string;
    password: string;
    /** DOI prefix, e.g. 10.5072 (DataCite's test prefix: such DOIs never resolve). */
    prefix: string;
  };
  /** Sign-in with ORCID through OpenID Connect. */
  orcid: {
    enabled: boolean;
    /** Issuer of the OpenID provider, e.g. https://orcid.org; by default the local stand-in on `standInPort`. */
    issuer: string;
    standInPort: number;
    standIn: boolean;
    clientId: string;
    clientSecret: string;
  };
}

export const LOG_LEVELS = ["fatal", "error", "warn", "info", "debug", "trace", "silent"] as const;
export type LogLevel = (typeof LOG_LEVELS)[number];

/** Settings of the background jobs (the metrics pipeline in server/src/pipeline/, DOI registration in server/src/dois/). */
export interface JobSettings {
  /** Worker threads of a process's metrics pool (TB_METRICS_THREADS; default: the cores). */
  metricsThreads: number;
  /** Nice value each metrics thread lowers itself by (TB_METRICS_THREAD_NICE, 0–19; default 5). */
  metricsThreadNice: number;
  /** Metrics jobs one process works at a time (TB_METRICS_CONCURRENCY; default 2). */
  metricsConcurrency: number;
  /** Seconds between queue polls of an idle metrics worker (TB_METRICS_POLL_SECONDS, ≥ 0.5; default 1). */
  metricsPollSeconds: number;
  /** Seconds before a failed metrics job is retried (TB_METRICS_RETRY_DELAY_SECONDS; default 5). */
  metricsRetryDelaySeconds: number;
  /** Seconds after which a running metrics job counts as lost (TB_METRICS_JOB_EXPIRE_SECONDS; default 3600). */
  metricsJobExpireSeconds: number;
  /** Seconds between the queue's maintenance runs (TB_METRICS_MAINTENANCE_SECONDS; default 60). */
  metricsMaintenanceSeconds: number;
  /** Seconds between a metrics worker's heartbeats on the runs it computes (TB_METRICS_HEARTBEAT_SECONDS; default 15). */
  metricsHeartbeatSeconds: number;
  /** Seconds without a heartbeat after which a run's worker counts as dead and its job is taken back (TB_METRICS_WORKER_STALE_SECONDS; default 60). */
  metricsWorkerStaleSeconds: number;
  /** Seconds between runs of the metrics sweeper (TB_METRICS_SWEEP_SECONDS; default 30). */
  metricsSweepSeconds: number;
  /** Retries of a failed DOI registration (TB_DOI_RETRY_LIMIT; default 10). */
  doiRetryLimit: number;
  /** Seconds before the first retry, doubling each time (TB_DOI_RETRY_DELAY_SECONDS; default 10). */
  doiRetryDelaySeconds: number;
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

function num(name: string, fallback: number, min: number, max = Number.MAX_SAFE_INTEGER): number {
  const raw = process.env[name];
  if (raw === undefined || raw === "") return fallback;
  const n = Number(raw);
  if (!Number.isFinite(n) || n < min || n > max) {
    throw new Error(`Invalid environment variable ${name}=${JSON.stringify(raw)}: expected a number in [${min}, ${max}]`);
  }
  return n;
}

function str(name: string, fallback: string): string {
  const raw = process.env[name];
  return raw === undefined || raw === "" ? fallback : raw;
}

function onOff(name: string, fallback: boolean): boolean {
  const raw = str(name, fallback ? "on" : "off").toLowerCase();
  if (!["on", "off"].includes(raw)) throw new Error(`Invalid environment variable ${name}=${JSON.stringify(raw)}: expected on or off`);
  return raw === "on";
}

function trueFalse(name: string, fallback: boolean): boolean {
  const raw = str(name, String(fallback)).toLowerCase();
  if (!["true", "false"].includes(raw)) throw new Error(`Invalid environment variable ${name}=${JSON.stringify(raw)}: expected true or false`);
  return raw === "true";
}

function oneOf<T extends string>(name: string, values: readonly T[], fallback: T): T {
  const raw = str(name, fallback);
  if (!(values as readonly string[]).includes(raw)) throw new Error(`Invalid environment variable ${name}=${JSON.stringify(raw)}: expected one of ${values.join(", ")}`);
  return raw as T;
}

/**
 * The background jobs' settings, read and validated on every call: loadConfig() reads them at start (so a
 * bad value stops the process there), and the jobs call this when they start a pool, a queue or a job,
 * so tests may change them between runs.
 */
export function jobSettings(): JobSettings {
  return {
    metricsThreads: int("TB_METRICS_THREADS", availableParallelism(), 1, 256),
    metricsThreadNice: int("TB_METRICS_THREAD_NICE", 5, 0, 19),
    metricsConcurrency: int("TB_METRICS_CONCURRENCY", 2, 1, 64),
    metricsPollSeconds: num("TB_METRICS_POLL_SECONDS", 1, 0.5, 3600),
    metricsRetryDelaySeconds: int("TB_METRICS_RETRY_DELAY_SECONDS", 5, 1),
    metricsJobExpireSeconds: int("TB_METRICS_JOB_EXPIRE_SECONDS", 3600, 1),
    metricsMaintenanceSeconds: int("TB_METRICS_MAINTENANCE_SECONDS", 60, 1),
    metricsHeartbeatSeconds: int("TB_METRICS_HEARTBEAT_SECONDS", 15, 1, 3600),
    metricsWorkerStaleSeconds: int("TB_METRICS_WORKER_STALE_SECONDS", 60, 2, 86_400),
    metricsSweepSeconds: int("TB_METRICS_SWEEP_SECONDS", 30, 1, 3600),
    doiRetryLimit: int("TB_DOI_RETRY_LIMIT", 10, 0, 1000),
    doiRetryDelaySeconds: int("TB_DOI_RETRY_DELAY_SECONDS", 10, 0),
  };
}

function httpUrl(name: string, value: string): string {
  let u: URL;
  try {
    u = new URL(value);
  } catch {
    throw new Error(`Invalid environment variable ${name}=${JSON.stringify(value)}: expected an http(s) URL`);
  }
  if (u.protocol !== "http:" && u.protocol !== "https:") throw new Error(`Invalid environment variable ${name}=${JSON.stringify(value)}: expected an http(s) URL`);
  return value.replace(/\/+$/, "");
}

/** Development values of the local stand-ins; refused in production. */
export const STAND_IN_SECRETS = { dataCitePassword: "northmoor-datacite-demo", orcidClientSecret: "northmoor-orcid-demo-secret" } as const;

function dataciteConfig(nodeEnv: Config["nodeEnv"]): Config["datacite"] {
  const enabled = onOff("TB_DOI", true);
  const standInPort = int("TB_DATACITE_PORT", 2626, 0, 65535);
  const configured = process.env.TB_DATACITE_API_URL;
  const standIn = !configured;
  const apiUrl = httpUrl("TB_DATACITE_API_URL", configured || `http://127.0.0.1:${standInPort}`);
  const prefix = str("TB_DOI_PREFIX", "10.5072");
  if (!/^10\.\d{4,9}$/.test(prefix)) throw new Error(`Invalid environment variable TB_DOI_PREFIX=${JSON.stringify(prefix)}: expected a DOI prefix such as 10.5072`);
  const repositoryId = str("TB_DATACITE_REPOSITORY_ID", "NORTHMOOR.TANGLEBANK");
  const password = str("TB_DATACITE_PASSWORD", nodeEnv === "production" ? "" : STAND_IN_SECRETS.dataCitePassword);
  if (nodeEnv === "production" && enabled) {
    if (standIn) throw new Error("TB_DATACITE_API_URL must be set in production (e.g. https://api.datacite.org), or DOIs turned off with TB_DOI=off");
    if (!process.env.TB_DATACITE_REPOSITORY_ID || !password || password === STAND_IN_SECRETS.dataCitePassword) {
      throw new Error("TB_DATACITE_REPOSITORY_ID and TB_DATACITE_PASSWORD must be set in production (the repository account DataCite gave you)");
    }
  }
  return { enabled, apiUrl, standInPort, standIn, repositoryId, password, prefix };
}

function orcidConfig(nodeEnv: Config["nodeEnv"]): Config["orcid"] {
  const enabled = onOff("TB_ORCID", true);
  const standInPort = int("TB_ORCID_PORT", 2627, 0, 65535);
  const configured = process.env.TB_ORCID_ISSUER;
  const standIn = !configured;
  const issuer = httpUrl("TB_ORCID_ISSUER", configured || `http://127.0.0.1:${standInPort}`);
  const clientId = str("TB_ORCID_CLIENT_ID", "APP-NORTHMOORDEMO01");
  const clientSecret = str("TB_ORCID_CLIENT_SECRET", nodeEnv === "production" ? "" : STAND_IN_SECRETS.orcidClientSecret);
  if (nodeEnv === "production" && enabled) {
    if (standIn) throw new Error("TB_ORCID_ISSUER must be set in production (https://orcid.org), or ORCID sign-in turned off with TB_ORCID=off");
    if (!process.env.TB_ORCID_CLIENT_ID || !clientSecret || clientSecret === STAND_IN_SECRETS.orcidClientSecret) {
      throw new Error("TB_ORCID_CLIENT_ID and TB_ORCID_CLIENT_SECRET must be set in production (the client ORCID registered for you)");
    }
  }
  return { enabled, issuer, standInPort, standIn, clientId, clientSecret };
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
    publicUrl: httpUrl("PUBLIC_URL", str("PUBLIC_URL", `http://${host}:${port}`)),
    databaseUrl,
    sessionSecret,
    smtp: {
      host: str("SMTP_HOST", "127.0.0.1"),
      port: int("SMTP_PORT", mailCatcherPort, 0, 65535),
      secure: trueFalse("SMTP_SECURE", false),
      user: process.env.SMTP_USER || undefined,
      pass: process.env.SMTP_PASS || undefined,
      from: str("MAIL_FROM", "Tanglebank <no-reply@tanglebank.test>"),
    },
    mailCatcherPort,
    uploadMaxBytes: int("TB_UPLOAD_MAX_BYTES", 100 * 1024 * 1024, 1024),
    uploadMaxFiles: int("TB_UPLOAD_MAX_FILES", 50, 1, 1000),
    uploadMaxRequestBytes: int("TB_UPLOAD_MAX_REQUEST_BYTES", 200 * 1024 * 1024, 1024),
    uploadTmpDir: str("TB_UPLOAD_TMP_DIR", join(tmpdir(), "tanglebank-uploads")),
    headersTimeoutSeconds: int("TB_HEADERS_TIMEOUT_SECONDS", 20, 1, 3600),
    requestTimeoutSeconds: int("TB_REQUEST_TIMEOUT_SECONDS", 600, 1, 86_400),
    idleTimeoutSeconds: int("TB_IDLE_TIMEOUT_SECONDS", 60, 1, 3600),
    parseTimeoutMs: int("TB_PARSE_TIMEOUT_MS", 120_000, 10),
    parseMaxMemoryMb: int("TB_PARSE_MAX_MEMORY_MB", 2048, 16),
    parseThreads: int("TB_PARSE_THREADS", 1, 1, 64),
    logLevel: oneOf("LOG_LEVEL", LOG_LEVELS, nodeEnv === "test" ? "silent" : "info"),
    jobs: jobSettings(),
    authRateLimit: int("TB_AUTH_RATE_LIMIT", 20, 1),
    apiRateLimit: int("TB_API_RATE_LIMIT", 600, 1),
    datacite: dataciteConfig(nodeEnv),
    orcid: orcidConfig(nodeEnv),
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
