import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

import { ROLES, type Role } from "@shared/types/auth";

export { ROLES, type Role };

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<number>;
  declare email: string;
  declare passwordHash: string;
  declare displayName: string;
  declare affiliation: CreationOptional<string | null>;
  declare orcid: CreationOptional<string | null>;
  /** Set when the iD came from ORCID's sign-in (verified), null when typed by hand. */
  declare orcidVerifiedAt: CreationOptional<Date | null>;
  declare role: CreationOptional<Role>;
  declare emailVerifiedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initUser(sequelize: Sequelize): void {
  User.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      email: { type: DataTypes.TEXT, allowNull: false },
      passwordHash: { type: DataTypes.TEXT, allowNull: false },
      displayName: { type: DataTypes.TEXT, allowNull: false },
      affiliation: { type: DataTypes.TEXT },
      orcid: { type: DataTypes.TEXT },
      orcidVerifiedAt: { type: DataTypes.DATE },
      role: { type: DataTypes.ENUM(...ROLES), allowNull: false, defaultValue: "depositor" },
      emailVerifiedAt: { type: DataTypes.DATE },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "users", modelName: "User" },
  );
}
