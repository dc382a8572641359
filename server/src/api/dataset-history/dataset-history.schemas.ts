/** Request schemas of /api/v1/network-views/history (curators): mounted by the routes through validate(). */
import type { RequestSchema } from "../../middlewares/validate";
import { accessionParams } from "../common.schemas";

export const historySchema: RequestSchema = { params: accessionParams };
