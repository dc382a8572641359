import { Sequelize } from "sequelize";
import { config } from "../config/env";

let instance: Sequelize | undefined;

/** Creates a Sequelize instance for a database URL (no model registration). */
/**
 * Connections that drop (PostgreSQL restarting, a terminated backend) are destroyed by Sequelize's pool and
 * replaced on the next query; while the database is away each query fails fast (connection refused, or the
 * 5 s connect timeout) and the error handler answers 503.
 */
export function createSequelize(url: string, opts: { pool?: number } = {}): Sequelize {
  return new Sequelize(url, {
    dialect: "postgres",
    logging: false,
    dialectOptions: { connectionTimeoutMillis: 5_000, keepAlive: true, application_name: "tanglebank" },
    pool: { max: opts.pool ?? 10, min: 0, idle: 10_000, acquire: 30_000 },
    define: { underscored: true, timestamps: true },
  });
}

/** The application's shared instance. Models are registered on it by `models/index.ts`. */
export function sequelize(): Sequelize {
  instance ??= createSequelize(config().databaseUrl);
  return instance;
}

export async function closeSequelize(): Promise<void> {
  if (instance) {
    const s = instance;
    instance = undefined;
    await s.close();
  }
}

/**
 * Waits until the database at `url` answers (a process started while PostgreSQL restarts, or started by a
 * supervisor before it), trying every second and saying so every ten; throws after `timeoutMs`.
 */
export async function waitForDatabase(url: string, opts: { timeoutMs?: number; log?: (msg: string) => void } = {}): Promise<void> {
  const deadline = Date.now() + (opts.timeoutMs ?? 120_000);
  for (let attempt = 0; ; attempt++) {
    const seq = createSequelize(url, { pool: 1 });
    try {
      await seq.query("SELECT 1");
      return;
    } catch (err) {
      if (Date.now() > deadline) throw err;
      if (attempt % 10 === 0) opts.log?.("Waiting for the database to answer…");
    } finally {
      await seq.close().catch(() => undefined);
    }
    await new Promise((r) => setTimeout(r, 1000));
  }
}
