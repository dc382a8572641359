/** Request schemas of /api/v1/outbox (admin, development): mounted by the routes through validate(). */
import type { RequestSchema } from "../../middlewares/validate";
import { idParams } from "../common.schemas";

export const outboxListSchema: RequestSchema = {
  query: { type: "object", properties: { to: { type: "string", maxLength: 254, description: "Part of a recipient's e-mail address" } } },
};

export const outboxMessageSchema: RequestSchema = { params: idParams("message") };
