/** Request schemas of /api/v1/datasets: mounted by the routes (validate) and described by the OpenAPI document. */
import type { ObjectSchema, RequestSchema } from "../../middlewares/validate";
import { accession, accessionParams, position, versionInt } from "../common.schemas";

const versionParams: ObjectSchema = { type: "object", properties: { accession, n: versionInt }, required: ["accession", "n"] };

export const datasetSchema: RequestSchema = {
  params: accessionParams,
  query: { type: "object", properties: { version: { ...versionInt, description: "A version number (default: the latest published version)" } } },
};

export const datasetVersionSchema: RequestSchema = { params: versionParams };

export const networkFileSchema: RequestSchema = {
  params: { type: "object", properties: { ...versionParams.properties, pos: position }, required: ["accession", "n", "pos"] },
};

export const newVersionSchema: RequestSchema = { params: accessionParams };

export const withdrawSchema: RequestSchema = {
  params: accessionParams,
  body: {
    type: "object",
    properties: { reason: { type: "string", minLength: 1, maxLength: 5000, pattern: "\\S", description: "Why the dataset is withdrawn: shown on the tombstone page and e-mailed to the depositor" } },
    required: ["reason"],
  },
  bodyStatus: 422,
  bodyMessage: "A reason is required to withdraw a dataset: say why; it is shown on the tombstone page.",
};
