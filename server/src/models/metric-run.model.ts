import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** "superseded": an older success replaced by a forced recompute with the same settings (kept for the record). */
export type MetricRunStatus = "queued" | "running" | "succeeded" | "failed" | "superseded";

/** One computation over one network, with full provenance; headline results are copied into columns. */
export class MetricRun extends Model<InferAttributes<MetricRun>, InferCreationAttributes<MetricRun>> {
  declare id: CreationOptional<number>;
  declare networkId: number;
  declare batchId: CreationOptional<number | null>;
  declare settings: Record<string, unknown>;
  declare settingsHash: string;
  declare status: MetricRunStatus;
  declare algorithmName: CreationOptional<string | null>;
  declare algorithmVersion: CreationOptional<string | null>;
  declare seed: CreationOptional<number | null>;
  declare attempts: CreationOptional<number>;
  /** Recompute even when a successful run with the same settings exists. */
  declare force: CreationOptional<boolean>;
  declare startedAt: CreationOptional<Date | null>;
  declare finishedAt: CreationOptional<Date | null>;
  declare durationMs: CreationOptional<number | null>;
  declare error: CreationOptional<string | null>;
  declare results: CreationOptional<Record<string, unknown> | null>;
  declare objective: CreationOptional<string | null>;
  declare q: CreationOptional<number | null>;
  declare modules: CreationOptional<number | null>;
  /** The primary null model (z, qRel and p are its figures; metric_run_nulls holds every model's). */
  declare nullModel: CreationOptional<string | null>;
  declare errorKind: CreationOptional<"configuration" | "computation" | null>;
  declare nullMean: CreationOptional<number | null>;
  declare nullSd: CreationOptional<number | null>;
  declare z: CreationOptional<number | null>;
  declare qRel: CreationOptional<number | null>;
  declare p: CreationOptional<number | null>;
  declare nodf: CreationOptional<number | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initMetricRun(sequelize: Sequelize): void {
  MetricRun.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      networkId: { type: DataTypes.INTEGER, allowNull: false },
      batchId: { type: DataTypes.INTEGER },
      settings: { type: DataTypes.JSONB, allowNull: false },
      settingsHash: { type: DataTypes.CHAR(64), allowNull: false },
      status: { type: DataTypes.TEXT, allowNull: false },
      algorithmName: { type: DataTypes.TEXT },
      algorithmVersion: { type: DataTypes.TEXT },
      seed: { type: DataTypes.BIGINT, get() { const v = this.getDataValue("seed"); return v === null || v === undefined ? null : Number(v); } },
      attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      force: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      startedAt: { type: DataTypes.DATE },
      finishedAt: { type: DataTypes.DATE },
      durationMs: { type: DataTypes.INTEGER },
      error: { type: DataTypes.TEXT },
      results: { type: DataTypes.JSONB },
      objective: { type: DataTypes.TEXT },
      q: { type: DataTypes.DOUBLE },
      modules: { type: DataTypes.INTEGER },
      nullModel: { type: DataTypes.TEXT },
      errorKind: { type: DataTypes.TEXT },
      nullMean: { type: DataTypes.DOUBLE },
      nullSd: { type: DataTypes.DOUBLE },
      z: { type: DataTypes.DOUBLE },
      qRel: { type: DataTypes.DOUBLE },
      p: { type: DataTypes.DOUBLE },
      nodf: { type: DataTypes.DOUBLE },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "metric_runs", modelName: "MetricRun" },
  );
}
