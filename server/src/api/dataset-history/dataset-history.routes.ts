/**
 * /api/v1/network-views/history — a dataset's audit history, as the dataset page lists it to curators.
 *
 * | route                 | who     | answer        |
 * |-----------------------|---------|---------------|
 * | GET /:accession       | curator | AuditEntry[]  |
 */
import { Router } from "express";
import { apiRateLimit } from "../../middlewares/api-rate-limit";
import { requireRole } from "../../middlewares/require-role";
import { validate } from "../../middlewares/validate";
import { getHistory } from "./dataset-history.service";
import { historySchema } from "./dataset-history.schemas";

export const datasetHistoryRouter = Router();
datasetHistoryRouter.use(apiRateLimit); // the read API's limit, per token or IP

datasetHistoryRouter.get("/:accession", requireRole("curator"), validate(historySchema), async (req, res) => {
  res.json({ data: await getHistory(req.params.accession as string) });
});
