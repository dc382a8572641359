import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** One message in the thread of a submission (migration 20261202-1420). */
export class SubmissionComment extends Model<InferAttributes<SubmissionComment>, InferCreationAttributes<SubmissionComment>> {
  declare id: CreationOptional<number>;
  declare versionId: number;
  declare authorId: number | null;
  declare side: "depositor" | "curator";
  declare body: string;
  declare round: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initSubmissionComment(sequelize: Sequelize): void {
  SubmissionComment.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      versionId: { type: DataTypes.INTEGER, allowNull: false },
      authorId: { type: DataTypes.INTEGER },
      side: { type: DataTypes.TEXT, allowNull: false },
      body: { type: DataTypes.TEXT, allowNull: false },
      round: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "submission_comments", modelName: "SubmissionComment" },
  );
}
