/** Admin: the metrics pipeline (settings, queue and batches, progress, failures, retries, runs per network). */
import { Router } from "express";
import { requireRole } from "../../middlewares/require-role";
import { validate } from "../../middlewares/validate";
import * as c from "./pipeline.controller";
import { batchListSchema, batchSchema, batchStartSchema, networkSchema, runListSchema, settingsSchema } from "./pipeline.schemas";

export const pipelineRouter = Router();
const admin = requireRole("admin");

pipelineRouter.get("/settings", admin, c.getSettings);
pipelineRouter.put("/settings", admin, validate(settingsSchema), c.putSettings);
pipelineRouter.get("/queue", admin, c.queueProgress);
pipelineRouter.get("/batches", admin, validate(batchListSchema), c.listBatches);
pipelineRouter.post("/batches", admin, validate(batchStartSchema), c.startBatch);
pipelineRouter.post("/batches/preview", admin, validate(batchStartSchema), c.previewBatch);
pipelineRouter.get("/batches/current", admin, c.currentBatch);
pipelineRouter.get("/batches/:id", admin, validate(batchSchema), c.getBatch);
pipelineRouter.get("/batches/:id/failures", admin, validate(batchSchema), c.batchFailures);
pipelineRouter.post("/batches/:id/retry", admin, validate(batchSchema), c.retryFailed);
pipelineRouter.get("/runs", admin, validate(runListSchema), c.listRuns);
pipelineRouter.get("/networks/:id", admin, validate(networkSchema), c.networkMetrics);
