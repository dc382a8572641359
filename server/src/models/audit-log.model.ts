import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** One row per state change or curator edit. */
export class AuditLog extends Model<InferAttributes<AuditLog>, InferCreationAttributes<AuditLog>> {
  declare id: CreationOptional<number>;
  declare actorId: number | null;
  declare action: string;
  declare entityType: string;
  declare entityId: string;
  declare datasetId: CreationOptional<number | null>;
  declare details: CreationOptional<Record<string, unknown>>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initAuditLog(sequelize: Sequelize): void {
  AuditLog.init(
    {
      id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
      actorId: { type: DataTypes.INTEGER },
      action: { type: DataTypes.TEXT, allowNull: false },
      entityType: { type: DataTypes.TEXT, allowNull: false },
      entityId: { type: DataTypes.TEXT, allowNull: false },
      datasetId: { type: DataTypes.INTEGER },
      details: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "audit_log", modelName: "AuditLog" },
  );
}
