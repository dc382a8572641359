/**
 * Request schemas of /api/v1/bundles: mounted by the routes (validate) and described by the OpenAPI
 * document. A selection is `refs`, a collection (`collection`, `revision`) or catalogue filters: in the
 * query they are the catalogue's own filter fields, in a JSON body the `filter` object, read by the
 * catalogue's schema (catalogue.schemas.ts) in both cases. An unknown parameter or field is refused by
 * name, never taken as "the whole catalogue".
 */
import type { FieldSchema, RequestSchema } from "../../middlewares/validate";
import { collectionCode, networkRefItem } from "../common.schemas";
import { catalogueFilterQuery } from "../catalogue/catalogue.schemas";
import { BUNDLE_PARTS, DEFAULT_PARTS } from "./bundles.parts";
import { BUNDLE_COMPRESSIONS } from "./bundles.stream";
import { BUNDLE_LIMIT } from "./bundles.selection";

const INCLUDE = `The optional parts: ${BUNDLE_PARTS.join(", ")}. Absent: ${DEFAULT_PARTS.join(", ")}; empty: none`;
const PARTS_RULE = `must list parts of a bundle from ${BUNDLE_PARTS.join(", ")} (or none).`;

const choice: Record<string, FieldSchema> = {
  compression: {
    type: "string",
    enum: [...BUNDLE_COMPRESSIONS],
    description: "fast (default): files stored uncompressed, about seven times larger but sent about three times as fast; small: deflated (zlib level 6), for slow connections",
    example: "small",
  },
  collection: { ...collectionCode, description: "A collection: its published members of the current revision (or of revision)" },
  revision: { type: "integer", minimum: 1, maximum: 2147483647, description: "With collection: the members of that revision", example: 1 },
};

const refsText: FieldSchema = { type: "array", items: networkRefItem, minItems: 1, description: `Network references (any published version), comma-separated or repeated; without it, the catalogue filters select the networks. At most ${BUNDLE_LIMIT}`, example: ["TB-000001/v1/1", "TB-000001/v1/2"] };

/** GET /bundles: references, a collection or the catalogue's filters, and what the zip holds. */
export const bundleQuerySchema: RequestSchema = {
  query: {
    type: "object",
    properties: {
      refs: refsText,
      include: { type: "array", items: { type: "string", enum: [...BUNDLE_PARTS] }, description: `${INCLUDE} (comma-separated or repeated)`, example: ["partitions", "roles", "nulls", "edges", "originals"] },
      ...choice,
      ...catalogueFilterQuery.properties,
    },
    additionalProperties: false,
  },
};

/** POST /bundles and /bundles/estimate: the selection in a JSON body (for long lists of references). */
export const bundleBodySchema: RequestSchema = {
  body: {
    type: "object",
    description: `Either refs (explicit networks, any published version), collection, or filter (catalogue parameters; the latest published versions). At most ${BUNDLE_LIMIT} networks.`,
    properties: {
      refs: { type: "array", items: networkRefItem, minItems: 1, description: `Network references (any published version); at most ${BUNDLE_LIMIT}`, example: ["TB-000001/v1/1", "TB-000002/v1/3"] },
      filter: { type: "object", description: 'Catalogue filter parameters, as in GET /catalogue without paging, e.g. { "interactionType": "pollination", "country": "NO" }' },
      include: {
        anyOf: [
          { type: "string", pattern: `^ *(?:(?:${BUNDLE_PARTS.join("|")}) *(?:, *|$))*$` },
          { type: "array", items: { type: "string", enum: [...BUNDLE_PARTS] } },
        ],
        "x-rule": PARTS_RULE,
        description: `${INCLUDE}. A list, or a comma-separated string`,
        example: "partitions,roles,nulls,edges",
      },
      ...choice,
    },
    additionalProperties: false,
  },
};
