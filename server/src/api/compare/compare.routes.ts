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
import { validate } from "../../middlewares/validate";
import { getCompareRows } from "./compare.service";
import { compareSchema } from "./compare.schemas";

export const compareRouter = Router();
compareRouter.use(apiRateLimit); // public reads: the read API's limit, per token or IP

compareRouter.get("/", validate(compareSchema), async (req, res) => {
  res.json(await getCompareRows([...new Set(req.query.refs as unknown as string[])], req.user));
});
