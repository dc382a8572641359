/** Request schemas of /api/v1/pipeline (admin): mounted by the routes through validate(). */
import { NULL_MODELS } from "@shared/network/null-models/index";
import type { FieldSchema, ObjectSchema, RequestSchema } from "../../middlewares/validate";
import { ANNEALING, OBJECTIVES } from "../../pipeline/settings";
import { idField, idParams } from "../common.schemas";

const RUN_STATUSES = ["queued", "running", "succeeded", "failed", "superseded"] as const;

const page: FieldSchema = { type: "integer", minimum: 1, maximum: 100000, default: 1, description: "Page number, from 1" };

export const batchListSchema: RequestSchema = {
  query: { type: "object", properties: { page, pageSize: { type: "integer", minimum: 1, maximum: 100, default: 20, description: "Batches per page" } } },
};

export const runListSchema: RequestSchema = {
  query: {
    type: "object",
    properties: {
      page,
      pageSize: { type: "integer", minimum: 1, maximum: 200, default: 50, description: "Runs per page" },
      status: { type: "string", enum: [...RUN_STATUSES], description: "Only runs in this state" },
      batchId: idField("batch", "Only runs of this batch"),
    },
  },
};

export const batchSchema: RequestSchema = { params: idParams("batch") };
export const networkSchema: RequestSchema = { params: idParams("network") };

/**
 * The settings an admin may change, each optional (the rest keep their current values); the pipeline core
 * (pipeline/settings.ts) merges them over the current settings.
 */
const settingsBody: ObjectSchema = {
  type: "object",
  properties: {
    objective: { type: "string", enum: [...OBJECTIVES], description: "Modularity objective (auto: by the network's kind)" },
    restarts: { type: "integer", minimum: 1, maximum: 1000, description: "Seeded optimizer restarts per network (and per null replicate)" },
    nullModels: {
      anyOf: [
        { const: "standard" },
        { type: "array", items: { type: "string", enum: [...NULL_MODELS] }, minItems: 1, maxItems: NULL_MODELS.length, uniqueItems: true },
      ],
      description: "standard (the standard null models of each network's kind), or a list of null models, the first the primary",
    },
    nullModel: { type: "string", enum: [...NULL_MODELS, "auto"], description: "One null model (older form of nullModels; auto means standard)" },
    nulls: { type: "integer", minimum: 0, maximum: 10000, description: "Null replicates per network and null model (0: no significance test)" },
    seed: { type: "integer", minimum: 0, maximum: 0xffffffff, description: "Random seed" },
    annealing: { type: "string", enum: [...ANNEALING], description: "Simulated-annealing refinement" },
  },
  additionalProperties: false,
};

export const settingsSchema: RequestSchema = { body: settingsBody, bodyMessage: "Some pipeline settings are not valid." };

/** Starting (or previewing) a batch: settings to compute with (over the current ones), and whether to recompute results that exist. */
export const batchStartSchema: RequestSchema = {
  body: {
    type: "object",
    properties: {
      settings: { ...settingsBody, description: "Settings of this batch, over the current ones" },
      force: { type: "boolean", default: false, description: "Recompute networks that already have results for these settings" },
    },
    additionalProperties: false,
  },
  bodyMessage: "The batch request is not valid.",
};
