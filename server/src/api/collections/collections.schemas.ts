/**
 * Request schemas of /api/v1/collections: mounted by the routes (validate) and described by the OpenAPI
 * document. A collection's `filter` holds catalogue parameters, read by the catalogue's own schema
 * (catalogue.schemas.ts); "refs or filter, not both" is said by the service, which words it for people.
 */
import type { ObjectSchema, RequestSchema } from "../../middlewares/validate";
import { accession, collectionCode, idField, networkRefItem, position, versionRef } from "../common.schemas";

const codeParams: ObjectSchema = { type: "object", properties: { code: collectionCode }, required: ["code"] };

const name = { type: "string", minLength: 1, maxLength: 200, pattern: "\\S", description: "The collection's name" } as const;
const description = { type: "string", maxLength: 5000, description: "What the collection is for (shown on its page)" } as const;
const visibility = { type: "string", enum: ["public", "private"], description: "public: anyone with the link; private (default): only you" } as const;
const refs = { type: "array", items: networkRefItem, minItems: 1, description: "Network references (exact versions); a collection holds at most 5,000 networks" } as const;
const MESSAGE = "The collection has problems.";

export const createCollectionSchema: RequestSchema = {
  body: {
    type: "object",
    properties: {
      name,
      description,
      visibility: { ...visibility, default: "private" },
      refs,
      filter: { type: "object", description: 'Catalogue filter parameters, e.g. { "interactionType": "pollination", "country": "NO" }: every network matching them, frozen to their versions' },
    },
    required: ["name"],
    additionalProperties: false,
  },
  bodyMessage: MESSAGE,
};

export const collectionSchema: RequestSchema = {
  params: codeParams,
  query: { type: "object", properties: { revision: idField("revision", "Members of an earlier revision") }, additionalProperties: false },
};

export const updateCollectionSchema: RequestSchema = {
  params: codeParams,
  body: { type: "object", properties: { name, description, visibility }, additionalProperties: false },
  bodyMessage: MESSAGE,
};

export const deleteCollectionSchema: RequestSchema = { params: codeParams };

export const addMembersSchema: RequestSchema = {
  params: codeParams,
  body: { type: "object", properties: { refs }, required: ["refs"], additionalProperties: false },
};

export const removeMemberSchema: RequestSchema = {
  params: { type: "object", properties: { code: collectionCode, accession, version: versionRef, position }, required: ["code", "accession", "version", "position"] },
};
