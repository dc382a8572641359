/** Registers every model on the app's Sequelize instance and declares all associations in one place. */
import type { Sequelize } from "sequelize";
import { sequelize as appSequelize } from "../db/sequelize";
import { ApiToken, initApiToken } from "./api-token.model";
import { AuditLog, initAuditLog } from "./audit-log.model";
import { Collection, CollectionMember, initCollection } from "./collection.model";
import { Dataset, initDataset } from "./dataset.model";
import { DatasetVersion, initDatasetVersion } from "./dataset-version.model";
import { MetricBatch, initMetricBatch } from "./metric-batch.model";
import { MetricRun, initMetricRun } from "./metric-run.model";
import { Network, initNetwork } from "./network.model";
import { Review, initReview } from "./review.model";
import { StoredFile, initStoredFile } from "./stored-file.model";
import { SubmissionComment, initSubmissionComment } from "./submission-comment.model";
import { User, initUser } from "./user.model";
import { UserToken, initUserToken } from "./user-token.model";

let initialised: Sequelize | undefined;

export function initModels(seq: Sequelize = appSequelize()): Sequelize {
  if (initialised === seq) return seq;
  initUser(seq);
  initUserToken(seq);
  initApiToken(seq);
  initAuditLog(seq);
  initDataset(seq);
  initDatasetVersion(seq);
  initStoredFile(seq);
  initNetwork(seq);
  initReview(seq);
  initMetricBatch(seq);
  initMetricRun(seq);
  initCollection(seq);
  initSubmissionComment(seq);

  User.hasMany(UserToken, { foreignKey: "userId", as: "tokens" });
  UserToken.belongsTo(User, { foreignKey: "userId", as: "user" });
  User.hasMany(ApiToken, { foreignKey: "userId", as: "apiTokens" });
  ApiToken.belongsTo(User, { foreignKey: "userId", as: "user" });
  AuditLog.belongsTo(User, { foreignKey: "actorId", as: "actor" });

  Dataset.belongsTo(User, { foreignKey: "ownerId", as: "owner" });
  User.hasMany(Dataset, { foreignKey: "ownerId", as: "datasets" });
  Dataset.hasMany(DatasetVersion, { foreignKey: "datasetId", as: "versions" });
  DatasetVersion.belongsTo(Dataset, { foreignKey: "datasetId", as: "dataset" });
  DatasetVersion.hasMany(Network, { foreignKey: "versionId", as: "networks" });
  Network.belongsTo(DatasetVersion, { foreignKey: "versionId", as: "version" });
  Network.belongsTo(StoredFile, { foreignKey: "fileId", as: "file" });
  DatasetVersion.hasMany(Review, { foreignKey: "versionId", as: "reviews" });
  Review.belongsTo(DatasetVersion, { foreignKey: "versionId", as: "version" });
  Review.belongsTo(User, { foreignKey: "curatorId", as: "curator" });
  DatasetVersion.hasMany(SubmissionComment, { foreignKey: "versionId", as: "comments" });
  SubmissionComment.belongsTo(User, { foreignKey: "authorId", as: "author" });

  Network.hasMany(MetricRun, { foreignKey: "networkId", as: "metricRuns" });
  MetricRun.belongsTo(Network, { foreignKey: "networkId", as: "network" });
  MetricBatch.hasMany(MetricRun, { foreignKey: "batchId", as: "runs" });
  MetricRun.belongsTo(MetricBatch, { foreignKey: "batchId", as: "batch" });

  Collection.belongsTo(User, { foreignKey: "ownerId", as: "owner" });
  Collection.hasMany(CollectionMember, { foreignKey: "collectionId", as: "members" });
  CollectionMember.belongsTo(Network, { foreignKey: "networkId", as: "network" });

  initialised = seq;
  return seq;
}

export { networkShape } from "./network.model";
export { ApiToken, AuditLog, Collection, CollectionMember, Dataset, DatasetVersion, MetricBatch, MetricRun, Network, Review, StoredFile, SubmissionComment, User, UserToken };
