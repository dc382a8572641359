/**
 * /api/v1/network-views — what the network view, the compare view and the dataset page's curator history
 * plot and list. Reads only; access: published for everyone, unpublished for owner and curators (404 for
 * others), withdrawn → 410 with the tombstone.
 *
 * | route                                         | who                  | answer                           |
 * |-----------------------------------------------|----------------------|----------------------------------|
 * | GET /summaries?refs=TB-…/v1/1,…               | anyone               | rows + `meta.unavailable` (per ref) |
 * | GET /map?<catalogue filters>                  | anyone               | MapPointRow[] (public coordinates) |
 * | GET /history/:accession                       | curator              | AuditEntry[]                     |
 * | GET /:accession/:version/:position            | anyone (see above)   | NetworkView                      |
 * | GET /:accession/:version/:position/partition.csv  | anyone (see above) | node,level,module             |
 * | GET /:accession/:version/:position/partition.json | anyone (see above) | rows/columns with modules     |
 */
import { Router, type Request } from "express";
import { apiRateLimit } from "../../middlewares/api-rate-limit";
import { requireRole } from "../../middlewares/require-role";
import { getCompareRows, getHistory, getMapPoints, getNetworkView, partitionCsv, partitionJson } from "./network-views.service";
import { parseAccession, parsePosition, parseRefs, parseVersion } from "./network-views.validation";

export const networkViewsRouter = Router();
networkViewsRouter.use(apiRateLimit); // public reads: the read API's limit, per token or IP

async function view(req: Request) {
  return getNetworkView(parseAccession(req.params.accession as string), parseVersion(req.params.version as string), parsePosition(req.params.position as string), req.user);
}

networkViewsRouter.get("/summaries", async (req, res) => {
  res.json(await getCompareRows(parseRefs(req.query.refs), req.user));
});

networkViewsRouter.get("/map", async (req, res) => {
  res.set("Cache-Control", "no-cache");
  res.json(await getMapPoints(req.query as Record<string, unknown>));
});

networkViewsRouter.get("/history/:accession", requireRole("curator"), async (req, res) => {
  res.json({ data: await getHistory(parseAccession(req.params.accession as string)) });
});

networkViewsRouter.get("/:accession/:version/:position", async (req, res) => {
  res.setHeader("Cache-Control", "private, no-cache");
  res.json(await view(req));
});

networkViewsRouter.get("/:accession/:version/:position/partition.csv", async (req, res) => {
  const v = await view(req);
  const body = partitionCsv(v);
  res.type("text/csv; charset=utf-8");
  res.setHeader("Content-Disposition", `attachment; filename="${v.ref.replace(/\//g, "_")}_partition.csv"`);
  res.send(body);
});

networkViewsRouter.get("/:accession/:version/:position/partition.json", async (req, res) => {
  const v = await view(req);
  const body = partitionJson(v);
  res.setHeader("Content-Disposition", `attachment; filename="${v.ref.replace(/\//g, "_")}_partition.json"`);
  res.json(body);
});
