/**
 * /api/v1/catalogue — the public catalogue (also at GET /api/v1/networks).
 *
 * | route              | who    | answer                                                         |
 * |--------------------|--------|----------------------------------------------------------------|
 * | GET /              | anyone | `{ data: CatalogueRow[], meta: { total, page, pageSize, facets } }` |
 */
import { Router, type RequestHandler } from "express";
import { apiRateLimit } from "../../middlewares/api-rate-limit";
import { searchCatalogue } from "./catalogue.service";
import { parseCatalogueQuery } from "./catalogue.validation";

export const catalogueRouter = Router();

/** Shared with the networks router's list route. */
export const listCatalogue: RequestHandler = async (req, res) => {
  const q = parseCatalogueQuery(req.query as Record<string, unknown>);
  res.set("Cache-Control", "no-cache");
  res.json(await searchCatalogue(q));
};

catalogueRouter.get("/", apiRateLimit, listCatalogue);
