/** Request schemas of /api/v1/reviews (curators): mounted by the routes through validate(). */
import type { FieldSchema, ObjectSchema, RequestSchema } from "../../middlewares/validate";
import { QUEUE_STATES } from "./reviews.service";
import { idField } from "../common.schemas";

const versionId = idField("submission", "The submitted version's id");
const submission: ObjectSchema = { type: "object", properties: { versionId }, required: ["versionId"] };

export const queueSchema: RequestSchema = {
  query: {
    type: "object",
    properties: {
      state: { type: "string", enum: [...QUEUE_STATES], description: "Only submissions in this state" },
      q: { type: "string", description: "Words of the title, accession or depositor (the first 200 characters are used)" },
    },
  },
};

export const submissionSchema: RequestSchema = { params: submission };

export const decisionSchema: RequestSchema = {
  params: submission,
  body: {
    type: "object",
    properties: {
      decision: { type: "string", enum: ["publish", "request_changes", "decline"], description: "Publish, request changes or decline" },
      comment: { type: ["string", "null"], maxLength: 20000, description: "To the depositor (e-mailed and shown in the conversation)" },
      lockVersion: { type: "integer", minimum: 0, description: "The version's lock number as read (a decision on a changed submission is refused)" },
    },
    required: ["decision"],
    additionalProperties: false,
  },
};

/** Metadata a curator's correction saves (checked against the metadata JSON Schema by the service). */
const studyMetadata: FieldSchema = { type: "object", description: "The corrected study metadata, whole (checked against the metadata JSON Schema when published)" };
const networkMetadata: FieldSchema = { type: "object", description: "The corrected network metadata, whole (checked against the network metadata JSON Schema when published)" };

export const studyCorrectionSchema: RequestSchema = {
  params: submission,
  body: {
    type: "object",
    properties: {
      metadata: studyMetadata,
      lockVersion: { type: "integer", minimum: 0, description: "The version's lock number as read (a correction of a changed submission is refused)" },
    },
    required: ["metadata"],
    additionalProperties: false,
  },
};

export const networkCorrectionSchema: RequestSchema = {
  params: { type: "object", properties: { versionId, networkId: idField("network") }, required: ["versionId", "networkId"] },
  body: { type: "object", properties: { metadata: networkMetadata }, required: ["metadata"], additionalProperties: false },
};
