/**
 * Request schemas of /api/v1/deposits: mounted by the routes through validate(). Ids, the shapes of the
 * JSON bodies and the text fields of an upload (read after the files) are checked here; what needs the
 * deposit itself (its state, its networks, the study metadata's own JSON Schema) is checked by the
 * service, and problems inside an uploaded file keep their file, row and column (deposits.upload.ts).
 */
import type { ErrorDetail } from "@shared/types/api";
import type { FieldSchema, ObjectSchema, RequestSchema } from "../../middlewares/validate";
import { idField, idParams } from "../common.schemas";
import { MAX_COMMENT_CHARS } from "./deposits.comments";
import { BLOCKS } from "./deposits.metadata";

const deposit = idParams("deposit");
const depositNetwork: ObjectSchema = { type: "object", properties: { id: idField("deposit"), networkId: idField("network") }, required: ["id", "networkId"] };

const metadata: FieldSchema = { type: "object", description: "Study metadata (checked against the metadata JSON Schema when saved and when submitted)" };

/** How a file is read: the workbook sheet, and what NA-like (`missing`) and blank cells mean. */
const MEANINGS = ["no-interaction", "not-observed"];
const readProperties: Record<string, FieldSchema> = {
  sheet: { type: "string", minLength: 1, maxLength: 200, description: "The sheet of a workbook (.xlsx) to read (default: the first)" },
  missing: { type: "string", enum: MEANINGS, description: "What NA-like cells (NA, -, ?) mean" },
  blank: { type: "string", enum: MEANINGS, description: "What blank cells mean" },
};
const kind: FieldSchema = { type: "string", enum: ["bipartite", "unipartite"], description: "Two-mode (rows and columns are different nodes) or one-mode" };
const directed: FieldSchema = { type: "boolean", description: "One-mode networks only: links have a direction" };
const format: FieldSchema = { type: "string", enum: ["auto", "matrix", "edgelist"], description: "How the table is laid out (auto: told from the file)" };

/** Why a network cannot be directed when its kind is not one-mode. */
export const DIRECTED_NEEDS_ONE_MODE = 'A bipartite network cannot be directed: only one-mode networks (kind "unipartite") can be.';

/** A bipartite network has no direction. */
const directedNeedsOneMode = (b: Record<string, unknown>): ErrorDetail[] =>
  b.directed === true && b.kind !== "unipartite" ? [{ path: "/directed", message: DIRECTED_NEEDS_ONE_MODE }] : [];

export const depositSchema: RequestSchema = { params: deposit };
export const depositNetworkSchema: RequestSchema = { params: depositNetwork };

export const createSchema: RequestSchema = { body: { type: "object", properties: { metadata }, additionalProperties: false } };

export const metadataSchema: RequestSchema = { params: deposit, body: { type: "object", properties: { metadata }, required: ["metadata"], additionalProperties: false } };

/** The multipart field that carries the uploaded files. */
export const UPLOAD_FILE_PART = "files";

/** The text fields sent with the files (multipart), read after them. */
export const uploadFieldsSchema: RequestSchema = {
  filePart: { name: UPLOAD_FILE_PART, description: "Network files (.csv, .tsv, .txt, .xlsx), or one zip of them" },
  fields: {
    type: "object",
    properties: {
      kind: { ...kind, default: "bipartite" },
      directed: { ...directed, default: false },
      format: { ...format, default: "auto" },
      ...readProperties,
      fileOptions: {
        type: "object",
        "x-json": true,
        additionalProperties: { type: "object", properties: readProperties, additionalProperties: false },
        "x-rule": 'must be a JSON object keyed by file name, e.g. {"web.xlsx": {"sheet": "Lowland", "missing": "not-observed"}}.',
        description: "How to read each file, by file name (overrides sheet, missing and blank)",
      },
    },
    additionalProperties: false,
  },
  bodyRules: directedNeedsOneMode,
};

export const networkChangesSchema: RequestSchema = {
  params: depositNetwork,
  body: { type: "object", properties: { metadata, kind, directed, format, ...readProperties }, additionalProperties: false, minProperties: 1 },
  // Without `kind` the stored kind decides, so the service judges `directed` then (deposits.networks.ts).
  bodyRules: (b) => (b.directed === undefined || b.kind === undefined ? [] : directedNeedsOneMode(b)),
};

export const reorderSchema: RequestSchema = {
  params: deposit,
  body: { type: "object", properties: { order: { type: "array", items: idField("network"), uniqueItems: true, description: "Every network id of the deposit, in the new order" } }, required: ["order"], additionalProperties: false },
};

export const applyBlocksSchema: RequestSchema = {
  params: deposit,
  body: {
    type: "object",
    properties: {
      from: idField("network", "The network whose metadata is copied"),
      blocks: { type: "array", items: { type: "string", enum: Object.keys(BLOCKS) }, minItems: 1, uniqueItems: true, description: "The blocks of metadata to copy to every other network" },
    },
    required: ["from", "blocks"],
    additionalProperties: false,
  },
};

export const sheetSchema: RequestSchema = {
  params: deposit,
  body: { type: "object", properties: { csv: { type: "string", minLength: 1, maxLength: 5_000_000, pattern: "\\S", description: "The CSV text of the metadata sheet" } }, required: ["csv"], additionalProperties: false },
};

const commentText = (what: string): FieldSchema => ({ type: "string", minLength: 1, maxLength: MAX_COMMENT_CHARS, pattern: "\\S", description: what });

export const submitSchema: RequestSchema = {
  params: deposit,
  body: {
    type: "object",
    properties: { reply: { type: ["string", "null"], maxLength: MAX_COMMENT_CHARS, description: "A reply to the curators' last comments, added to the conversation (blank: none)" } },
    additionalProperties: false,
  },
};

export const commentSchema: RequestSchema = {
  params: deposit,
  body: { type: "object", properties: { body: commentText("The comment") }, required: ["body"], additionalProperties: false },
  bodyStatus: 422,
};
