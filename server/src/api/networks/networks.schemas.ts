/** Request schemas of /api/v1/networks/:accession/:version/:position…: mounted by the routes (validate) and described by the OpenAPI document. */
import type { FieldSchema, RequestSchema } from "../../middlewares/validate";
import { networkRefParams } from "../common.schemas";

const layout: FieldSchema = { type: "string", enum: ["matrix", "edgelist"], default: "matrix", description: "matrix (default, keeps isolated nodes) or edgelist" };
const spreadsheetSafe: FieldSchema = { type: "boolean", default: false, description: "true: formula-like labels get a leading apostrophe for spreadsheet programs (default false: exact labels)" };

export const networkSchema: RequestSchema = {
  params: networkRefParams,
  query: {
    type: "object",
    properties: {
      format: { type: "string", enum: ["json", "csv"], default: "json", description: "json (default) or csv" },
      include: { type: "string", enum: ["data"], description: "data: add node labels and links (JSON)" },
      layout: { ...layout, description: `With format=csv: ${layout.description}` },
      spreadsheetSafe: { ...spreadsheetSafe, description: `With format=csv: ${spreadsheetSafe.description}` },
    },
  },
};

export const networkCsvSchema: RequestSchema = { params: networkRefParams, query: { type: "object", properties: { layout, spreadsheetSafe } } };

/** data.json and metrics: the address only. */
export const networkRefSchema: RequestSchema = { params: networkRefParams };
