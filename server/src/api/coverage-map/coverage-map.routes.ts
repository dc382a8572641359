/**
 * /api/v1/network-views/map — the coverage map's points for the catalogue's filters. Reads only.
 *
 * | route                         | who    | answer                               |
 * |-------------------------------|--------|--------------------------------------|
 * | GET /?<catalogue filters>     | anyone | MapPointRow[] (public coordinates)   |
 */
import { Router } from "express";
import { apiRateLimit } from "../../middlewares/api-rate-limit";
import { getMapPoints } from "./coverage-map.service";

export const coverageMapRouter = Router();
coverageMapRouter.use(apiRateLimit); // public reads: the read API's limit, per token or IP

coverageMapRouter.get("/", async (req, res) => {
  res.set("Cache-Control", "no-cache");
  res.json(await getMapPoints(req.query as Record<string, unknown>));
});
