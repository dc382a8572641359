/** Request schemas of /api/v1/network-views/map: the catalogue's own filter fields and rules (catalogue.schemas.ts), mounted through validate() and described by the OpenAPI document. */
import type { RequestSchema } from "../../middlewares/validate";
import { CATALOGUE_FILTER_FIELDS, catalogueRules } from "../catalogue/catalogue.schemas";

export const mapSchema: RequestSchema = {
  query: { type: "object", properties: CATALOGUE_FILTER_FIELDS, additionalProperties: false },
  queryRules: catalogueRules,
};
