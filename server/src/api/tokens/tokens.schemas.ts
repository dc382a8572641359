/** Request schemas of /api/v1/tokens: mounted by the routes (validate) and described by the OpenAPI document. */
import type { ObjectSchema, RequestSchema } from "../../middlewares/validate";

const tokenId: ObjectSchema = {
  type: "object",
  properties: { id: { type: "integer", minimum: 1, maximum: 999999999, title: "token", description: "Token id", example: 1 } },
  required: ["id"],
};

export const createTokenSchema: RequestSchema = {
  body: {
    type: "object",
    properties: { name: { type: "string", minLength: 1, maxLength: 80, pattern: "\\S", description: "A name to tell your tokens apart, such as “R scripts on my laptop”" } },
    required: ["name"],
  },
  bodyStatus: 422,
};

export const revokeTokenSchema: RequestSchema = { params: tokenId };
