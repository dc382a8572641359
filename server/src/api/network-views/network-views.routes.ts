/**
 * /api/v1/network-views — one network as the network view plots and lists it, and its partition as a file.
 * Reads only; access: published for everyone, unpublished for owner and curators (404 for others),
 * withdrawn → 410 with the tombstone; a malformed address is a 404 (network-views.schemas.ts). (The
 * compare rows, the coverage map and a dataset's history are served under this prefix too, by
 * api/compare/, api/coverage-map/ and api/dataset-history/.)
 *
 * | route                                         | who                  | answer                           |
 * |-----------------------------------------------|----------------------|----------------------------------|
 * | GET /:accession/:version/:position            | anyone (see above)   | NetworkView                      |
 * | GET /:accession/:version/:position/partition.csv  | anyone (see above) | node,level,module             |
 * | GET /:accession/:version/:position/partition.json | anyone (see above) | rows/columns with modules     |
 */
import { Router, type Request } from "express";
import { apiRateLimit } from "../../middlewares/api-rate-limit";
import { validate } from "../../middlewares/validate";
import { sendPublicAnswer } from "../../lib/public-answers";
import { networkRefOf } from "../common.schemas";
import { getNetworkView, partitionCsv, partitionJson } from "./network-views.service";
import { networkViewSchema } from "./network-views.schemas";

export const networkViewsRouter = Router();
networkViewsRouter.use(apiRateLimit); // public reads: the read API's limit, per token or IP

async function view(req: Request) {
  const { accession, version, position } = networkRefOf(req.params);
  return getNetworkView(accession, version, position, req.user);
}

networkViewsRouter.get("/:accession/:version/:position", validate(networkViewSchema), async (req, res) => {
  res.setHeader("Cache-Control", "private, no-cache");
  const { accession, version, position } = networkRefOf(req.params);
  await sendPublicAnswer(req, res, accession, `view/${version}/${position}`, () => getNetworkView(accession, version, position, req.user));
});

networkViewsRouter.get("/:accession/:version/:position/partition.csv", validate(networkViewSchema), async (req, res) => {
  const v = await view(req);
  const body = partitionCsv(v);
  res.type("text/csv; charset=utf-8");
  res.setHeader("Content-Disposition", `attachment; filename="${v.ref.replace(/\//g, "_")}_partition.csv"`);
  res.send(body);
});

networkViewsRouter.get("/:accession/:version/:position/partition.json", validate(networkViewSchema), async (req, res) => {
  const v = await view(req);
  const body = partitionJson(v);
  res.setHeader("Content-Disposition", `attachment; filename="${v.ref.replace(/\//g, "_")}_partition.json"`);
  res.json(body);
});
