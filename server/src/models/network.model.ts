import type { CellMeaning } from "@shared/network/parse/options";
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export interface NetworkReadOptions {
  sheet?: string;
  missing?: CellMeaning;
  blank?: CellMeaning;
}

/**
 * One interaction network inside a version (`TB-000042/v2/3` is position 3 of version 2). `canonical` is
 * the parsed network in the engine's serialized form; `metadata` the network-level metadata (JSON Schema).
 * Load `canonical` only when needed (it can be large).
 */
export class Network extends Model<InferAttributes<Network>, InferCreationAttributes<Network>> {
  declare id: CreationOptional<number>;
  declare versionId: number;
  declare position: number;
  declare fileId: number;
  declare originalName: string;
  declare format: "matrix" | "edgelist";
  declare kind: "bipartite" | "unipartite";
  declare directed: CreationOptional<boolean>;
  declare weighted: CreationOptional<boolean>;
  declare metadata: CreationOptional<Record<string, unknown>>;
  declare canonical: unknown;
  declare nNodes: number;
  declare nRows: number | null;
  declare nCols: number | null;
  declare nLinks: number;
  declare totalWeight: number;
  declare connectance: number | null;
  declare parseWarnings: CreationOptional<unknown[]>;
  /** The parser's reading options beyond kind and layout: workbook sheet, meaning of NA-like and blank cells. */
  declare readOptions: CreationOptional<NetworkReadOptions>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/** A network's kind and size, as every public answer about it states them. */
export function networkShape(n: Network) {
  return { kind: n.kind, directed: n.directed, weighted: n.weighted, nNodes: n.nNodes, nRows: n.nRows, nCols: n.nCols, nLinks: n.nLinks, connectance: n.connectance };
}

export function initNetwork(sequelize: Sequelize): void {
  Network.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      versionId: { type: DataTypes.INTEGER, allowNull: false },
      position: { type: DataTypes.INTEGER, allowNull: false },
      fileId: { type: DataTypes.INTEGER, allowNull: false },
      originalName: { type: DataTypes.TEXT, allowNull: false },
      format: { type: DataTypes.TEXT, allowNull: false },
      kind: { type: DataTypes.ENUM("bipartite", "unipartite"), allowNull: false },
      directed: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      weighted: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      metadata: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
      canonical: { type: DataTypes.JSONB, allowNull: false },
      nNodes: { type: DataTypes.INTEGER, allowNull: false },
      nRows: { type: DataTypes.INTEGER },
      nCols: { type: DataTypes.INTEGER },
      nLinks: { type: DataTypes.INTEGER, allowNull: false },
      totalWeight: { type: DataTypes.DOUBLE, allowNull: false },
      connectance: { type: DataTypes.DOUBLE },
      parseWarnings: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
      readOptions: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "networks", modelName: "Network", defaultScope: { attributes: { exclude: ["canonical"] } } },
  );
}
