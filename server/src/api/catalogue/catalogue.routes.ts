/**
 * /api/v1/catalogue — the public catalogue (also at GET /api/v1/networks).
 *
 * | route              | who    | answer                                                         |
 * |--------------------|--------|----------------------------------------------------------------|
 * | GET /              | anyone | `{ data: CatalogueRow[], meta: { total, page, pageSize, facets } }` |
 * The query is checked by catalogue.schemas.ts (400 naming every refused parameter).
 */
import { Router, type RequestHandler } from "express";
import { apiRateLimit } from "../../middlewares/api-rate-limit";
import { validate } from "../../middlewares/validate";
import { searchCatalogue } from "./catalogue.service";
import { catalogueSchema, toCatalogueQuery } from "./catalogue.schemas";

export const catalogueRouter = Router();

/** The checks and the handler, shared with the networks router's list route. */
export const listCatalogue: RequestHandler[] = [
  validate(catalogueSchema),
  async (req, res) => {
    res.set("Cache-Control", "no-cache");
    res.json(await searchCatalogue(toCatalogueQuery(req.query as Record<string, unknown>)));
  },
];

catalogueRouter.get("/", apiRateLimit, ...listCatalogue);
