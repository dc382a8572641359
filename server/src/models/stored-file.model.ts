import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** An uploaded file, byte for byte, content-addressed by SHA-256. Load `bytes` only when needed. */
export class StoredFile extends Model<InferAttributes<StoredFile>, InferCreationAttributes<StoredFile>> {
  declare id: CreationOptional<number>;
  declare sha256: string;
  declare size: number;
  declare bytes: Buffer;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initStoredFile(sequelize: Sequelize): void {
  StoredFile.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      sha256: { type: DataTypes.CHAR(64), allowNull: false },
      size: { type: DataTypes.BIGINT, allowNull: false, get() { return Number(this.getDataValue("size")); } },
      bytes: { type: DataTypes.BLOB, allowNull: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "stored_files", modelName: "StoredFile", defaultScope: { attributes: { exclude: ["bytes"] } } },
  );
}
