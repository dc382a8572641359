/** Mounts every resource router under /api/v1. One line per resource. */
import { Router } from "express";
import { healthRouter } from "./health/health.routes";
import { authRouter } from "./auth/auth.routes";
import { orcidRouter } from "./auth/orcid.routes";
import { networkViewsRouter } from "./network-views/network-views.routes";
import { compareRouter } from "./compare/compare.routes";
import { coverageMapRouter } from "./coverage-map/coverage-map.routes";
import { datasetHistoryRouter } from "./dataset-history/dataset-history.routes";
import { accountRouter } from "./account/account.routes";
import { usersRouter } from "./users/users.routes";
import { outboxRouter } from "./outbox/outbox.routes";
import { catalogueRouter } from "./catalogue/catalogue.routes";
import { networksRouter } from "./networks/networks.routes";
import { bundlesRouter } from "./bundles/bundles.routes";
import { tokensRouter } from "./tokens/tokens.routes";
import { openapiRouter } from "./openapi/openapi.routes";
import { datasetsRouter } from "./datasets/datasets.routes";
import { depositsRouter } from "./deposits/deposits.routes";
import { reviewsRouter } from "./reviews/reviews.routes";
import { pipelineRouter } from "./pipeline/pipeline.routes";
import { collectionsRouter } from "./collections/collections.routes";
import { previewsRouter } from "./previews/previews.routes";

export function apiRouter(): Router {
  const r = Router();
  r.use("/health", healthRouter);
  r.use("/auth/orcid", orcidRouter);
  r.use("/auth", authRouter);
  r.use("/network-views/summaries", compareRouter);
  r.use("/network-views/map", coverageMapRouter);
  r.use("/network-views/history", datasetHistoryRouter);
  r.use("/network-views", networkViewsRouter);
  r.use("/account", accountRouter);
  r.use("/users", usersRouter);
  r.use("/outbox", outboxRouter);
  r.use("/catalogue", catalogueRouter);
  r.use("/networks", networksRouter);
  r.use("/bundles", bundlesRouter);
  r.use("/tokens", tokensRouter);
  r.use("/openapi.json", openapiRouter);
  r.use("/datasets", datasetsRouter);
  r.use("/deposits", depositsRouter);
  r.use("/reviews", reviewsRouter);
  r.use("/pipeline", pipelineRouter);
  r.use("/collections", collectionsRouter);
  r.use("/previews", previewsRouter);
  return r;
}
