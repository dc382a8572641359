/**
 * /api/v1/network-views/summaries — the compare view's rows. Reads only; a network the reader may not see
 * (a draft of someone else, withdrawn, unknown) is listed in `meta.unavailable` with the reason.
 *
 * | route                                   | who    | answer                                |
 * |-----------------------------------------|--------|---------------------------------------|
 * | GET /?refs=TB-…/v1/1,…                  | anyone | rows + `meta.unavailable` (per ref)   |
 */
import { Router } from "express";
import { apiRateLimit } from "../../middlewares/api-rate-limit";
import { getCompareRows } from "./compare.service";
import { parseRefs } from "./compare.validation";

export const compareRouter = Router();
compareRouter.use(apiRateLimit); // public reads: the read API's limit, per token or IP

compareRouter.get("/", async (req, res) => {
  res.json(await getCompareRows(parseRefs(req.query.refs), req.user));
});
