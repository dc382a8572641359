/** Request schemas of /api/v1/network-views/summaries (the compare view): mounted by the route and described by the OpenAPI document. */
import { MAX_COMPARE } from "@shared/types/network-view";
import type { RequestSchema } from "../../middlewares/validate";

export const compareSchema: RequestSchema = {
  query: {
    type: "object",
    properties: {
      refs: {
        type: "array",
        // not checked one by one: a reference that cannot be plotted is listed in meta.unavailable with its reason
        items: { type: "string", maxLength: 100, title: "network references such as TB-000042/v2/3" },
        minItems: 1,
        maxItems: MAX_COMPARE,
        description: `The networks to compare, in order: up to ${MAX_COMPARE} references (TB-000042/v2/3), comma-separated or repeated`,
        example: ["TB-000001/v1/1", "TB-000001/v1/2"],
      },
    },
    required: ["refs"],
    additionalProperties: false,
  },
};
