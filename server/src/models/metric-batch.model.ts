import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** A "recompute" request over many networks with one set of pipeline settings. */
export class MetricBatch extends Model<InferAttributes<MetricBatch>, InferCreationAttributes<MetricBatch>> {
  declare id: CreationOptional<number>;
  declare settings: Record<string, unknown>;
  declare settingsHash: string;
  declare status: CreationOptional<"running" | "finished" | "cancelled">;
  declare total: CreationOptional<number>;
  declare force: CreationOptional<boolean>;
  /** Networks left out because a successful run with the same settings existed. */
  declare skipped: CreationOptional<number>;
  declare startedBy: CreationOptional<number | null>;
  declare finishedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initMetricBatch(sequelize: Sequelize): void {
  MetricBatch.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      settings: { type: DataTypes.JSONB, allowNull: false },
      settingsHash: { type: DataTypes.CHAR(64), allowNull: false },
      status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "running" },
      total: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      force: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      skipped: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      startedBy: { type: DataTypes.INTEGER },
      finishedAt: { type: DataTypes.DATE },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "metric_batches", modelName: "MetricBatch" },
  );
}
