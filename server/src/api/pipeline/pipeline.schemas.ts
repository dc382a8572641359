/** Request schemas of /api/v1/pipeline (admin): mounted by the routes through validate(). */
import type { FieldSchema, RequestSchema } from "../../middlewares/validate";

const RUN_STATUSES = ["queued", "running", "succeeded", "failed", "superseded"] as const;

const page: FieldSchema = { type: "integer", minimum: 1, maximum: 100000, default: 1, description: "Page number, from 1" };
const idOf = (title: string): RequestSchema["params"] => ({ type: "object", properties: { id: { type: "integer", minimum: 1, maximum: 2147483647, title, description: `The ${title}'s id` } }, required: ["id"] });

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
      batchId: { type: "integer", minimum: 1, maximum: 2147483647, description: "Only runs of this batch" },
    },
  },
};

export const batchSchema: RequestSchema = { params: idOf("batch") };
export const networkSchema: RequestSchema = { params: idOf("network") };
