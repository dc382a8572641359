/** Request schemas of /api/v1/network-views: mounted by the routes (validate) and described by the OpenAPI document. */
import type { RequestSchema } from "../../middlewares/validate";
import { networkRefParams } from "../common.schemas";

/** /:accession/:version/:position (and its partition files). */
export const networkViewSchema: RequestSchema = { params: networkRefParams };
