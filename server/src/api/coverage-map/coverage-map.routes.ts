/**
 * /api/v1/network-views/map — the coverage map's points for the catalogue's filters. Reads only.
 *
 * | route                         | who    | answer                               |
 * |-------------------------------|--------|--------------------------------------|
 * | GET /?<catalogue filters>     | anyone | MapPointRow[] (public coordinates)   |
 * The filters are the catalogue's, checked by the same schema and rules (coverage-map.schemas.ts).
 */
import { Router } from "express";
import { apiRateLimit } from "../../middlewares/api-rate-limit";
import { validate } from "../../middlewares/validate";
import { toCatalogueQuery } from "../catalogue/catalogue.schemas";
import { getMapPoints } from "./coverage-map.service";
import { mapSchema } from "./coverage-map.schemas";

export const coverageMapRouter = Router();
coverageMapRouter.use(apiRateLimit); // public reads: the read API's limit, per token or IP

coverageMapRouter.get("/", validate(mapSchema), async (req, res) => {
  res.set("Cache-Control", "no-cache");
  res.json(await getMapPoints(toCatalogueQuery(req.query as Record<string, unknown>)));
});
