/** Request schemas of /api/v1/previews: mounted by the routes (validate) and described by the OpenAPI document. */
import type { RequestSchema } from "../../middlewares/validate";
import { networkRefParams, versionRefParams } from "../common.schemas";

export const datasetPreviewSchema: RequestSchema = { params: versionRefParams };

export const networkPreviewSchema: RequestSchema = { params: networkRefParams };
