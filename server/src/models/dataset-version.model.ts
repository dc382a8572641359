import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export type VersionState = "draft" | "submitted" | "changes_requested" | "published" | "declined" | "withdrawn";
export const VERSION_STATES: readonly VersionState[] = ["draft", "submitted", "changes_requested", "published", "declined", "withdrawn"];

/** v1, v2, …; a published version is immutable. `metadata` holds the study-level metadata (JSON Schema). */
export class DatasetVersion extends Model<InferAttributes<DatasetVersion>, InferCreationAttributes<DatasetVersion>> {
  declare id: CreationOptional<number>;
  declare datasetId: number;
  declare number: number;
  declare state: CreationOptional<VersionState>;
  declare metadata: CreationOptional<Record<string, unknown>>;
  declare submittedAt: CreationOptional<Date | null>;
  declare publishedAt: CreationOptional<Date | null>;
  declare withdrawnAt: CreationOptional<Date | null>;
  declare withdrawalReason: CreationOptional<string | null>;
  declare lockVersion: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initDatasetVersion(sequelize: Sequelize): void {
  DatasetVersion.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      datasetId: { type: DataTypes.INTEGER, allowNull: false },
      number: { type: DataTypes.INTEGER, allowNull: false },
      state: { type: DataTypes.ENUM(...VERSION_STATES), allowNull: false, defaultValue: "draft" },
      metadata: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
      submittedAt: { type: DataTypes.DATE },
      publishedAt: { type: DataTypes.DATE },
      withdrawnAt: { type: DataTypes.DATE },
      withdrawalReason: { type: DataTypes.TEXT },
      lockVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "dataset_versions", modelName: "DatasetVersion" },
  );
}
