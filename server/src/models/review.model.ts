import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export type ReviewDecision = "publish" | "request_changes" | "decline";

/** A curator's decision on a submitted version. */
export class Review extends Model<InferAttributes<Review>, InferCreationAttributes<Review>> {
  declare id: CreationOptional<number>;
  declare versionId: number;
  declare curatorId: number;
  declare decision: ReviewDecision;
  declare comment: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initReview(sequelize: Sequelize): void {
  Review.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      versionId: { type: DataTypes.INTEGER, allowNull: false },
      curatorId: { type: DataTypes.INTEGER, allowNull: false },
      decision: { type: DataTypes.ENUM("publish", "request_changes", "decline"), allowNull: false },
      comment: { type: DataTypes.TEXT },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "reviews", modelName: "Review" },
  );
}
