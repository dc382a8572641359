import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** A saved, citable set of networks (exact versions); see migration 20261202-1500. */
export class Collection extends Model<InferAttributes<Collection>, InferCreationAttributes<Collection>> {
  declare id: CreationOptional<number>;
  declare code: string;
  declare ownerId: number;
  declare name: string;
  declare description: CreationOptional<string>;
  declare visibility: CreationOptional<"public" | "private">;
  declare revision: CreationOptional<number>;
  declare savedFrom: CreationOptional<Record<string, unknown> | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/** One network in a collection from `addedRevision` until `removedRevision` (null: still a member). */
export class CollectionMember extends Model<InferAttributes<CollectionMember>, InferCreationAttributes<CollectionMember>> {
  declare id: CreationOptional<number>;
  declare collectionId: number;
  declare networkId: number;
  declare position: number;
  declare addedRevision: number;
  declare removedRevision: CreationOptional<number | null>;
  declare addedAt: CreationOptional<Date>;
  declare removedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initCollection(sequelize: Sequelize): void {
  Collection.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      code: { type: DataTypes.TEXT, allowNull: false },
      ownerId: { type: DataTypes.INTEGER, allowNull: false },
      name: { type: DataTypes.TEXT, allowNull: false },
      description: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
      visibility: { type: DataTypes.TEXT, allowNull: false, defaultValue: "private" },
      revision: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      savedFrom: { type: DataTypes.JSONB },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "collections", modelName: "Collection" },
  );
  CollectionMember.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      collectionId: { type: DataTypes.INTEGER, allowNull: false },
      networkId: { type: DataTypes.INTEGER, allowNull: false },
      position: { type: DataTypes.INTEGER, allowNull: false },
      addedRevision: { type: DataTypes.INTEGER, allowNull: false },
      removedRevision: { type: DataTypes.INTEGER },
      addedAt: { type: DataTypes.DATE },
      removedAt: { type: DataTypes.DATE },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "collection_members", modelName: "CollectionMember" },
  );
}
