import { Sequelize } from "sequelize";
import { config } from "../config/env";

let instance: Sequelize | undefined;

/** Creates a Sequelize instance for a database URL (no model registration). */
export function createSequelize(url: string, opts: { pool?: number } = {}): Sequelize {
  return new Sequelize(url, {
    dialect: "postgres",
    logging: false,
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
