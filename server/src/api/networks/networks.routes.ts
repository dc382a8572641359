/**
 * /api/v1/networks — the catalogue list (same as /catalogue) and single networks by reference
 * (`TB-000042/v2/3`), as JSON or CSV, and their current metrics.
 *
 * | route                                           | who                | answer                          |
 * |-------------------------------------------------|--------------------|---------------------------------|
 * | GET /                                           | anyone             | catalogue page (see /catalogue) |
 * | GET /:accession/:version/:position              | anyone (published) | NetworkJson (`?format=csv` CSV; `?include=data` labels and links) |
 * | GET /:accession/:version/:position/data.csv     | anyone (published) | CSV (`?layout=matrix|edgelist`, `&spreadsheetSafe=true`) |
 * | GET /:accession/:version/:position/data.json    | anyone (published) | NetworkJson with data           |
 * | GET /:accession/:version/:position/metrics      | anyone (published) | `{ ref, metrics }`              |
 * Unpublished versions: owner and curators only (404 for others); withdrawn → 410. Addresses and query
 * parameters are checked by networks.schemas.ts (a malformed address is a 404, a bad parameter a 400).
 */
import { Readable } from "node:stream";
import { pipeline } from "node:stream/promises";
import { Router, type Request, type Response } from "express";
import { logger } from "../../lib/logger";
import { sendPublicAnswer } from "../../lib/public-answers";
import { apiRateLimit } from "../../middlewares/api-rate-limit";
import { validate } from "../../middlewares/validate";
import { config } from "../../config/env";
import { listCatalogue } from "../catalogue/catalogue.routes";
import { networkRefOf } from "../common.schemas";
import { getNetworkCsv, getNetworkJson, getNetworkMetrics } from "./networks.service";
import { networkCsvSchema, networkRefSchema, networkSchema } from "./networks.schemas";

export const networksRouter = Router();
networksRouter.use(apiRateLimit);

const baseUrl = () => `${config().publicUrl}/api/v1/networks`;

/** The CSV answer; `layout` and `spreadsheetSafe` (formula-like labels get a leading apostrophe) as validate() left them. */
async function sendCsv(req: Request, res: Response) {
  const q = req.query as unknown as { layout: "matrix" | "edgelist"; spreadsheetSafe: boolean };
  // the network is checked and its size computed before anything is sent (a damaged one is an error answer)
  const { ref, bytes, pieces } = await getNetworkCsv(networkRefOf(req.params), req.user, q.layout, q.spreadsheetSafe);
  res.type("text/csv; charset=utf-8");
  res.set("Content-Disposition", `inline; filename="${ref.replace(/\//g, "_")}.csv"`);
  res.set("Content-Length", String(bytes));
  await pipeline(Readable.from(pieces, { objectMode: false }), res).catch((err: unknown) => {
    // the client went away, or a damaged row was found while writing: the answer is cut short
    if ((err as { code?: string }).code !== "ERR_STREAM_PREMATURE_CLOSE") logger.warn({ err, ref }, "network CSV cut short");
    if (!res.destroyed) res.destroy();
  });
}

networksRouter.get("/", listCatalogue);

networksRouter.get("/:accession/:version/:position", validate(networkSchema), async (req, res) => {
  const q = req.query as unknown as { format: "json" | "csv"; include?: "data" };
  if (q.format === "csv") return sendCsv(req, res);
  res.json(await getNetworkJson(networkRefOf(req.params), req.user, q.include === "data", baseUrl()));
});

networksRouter.get("/:accession/:version/:position/data.csv", validate(networkCsvSchema), sendCsv);

networksRouter.get("/:accession/:version/:position/data.json", validate(networkRefSchema), async (req, res) => {
  res.json(await getNetworkJson(networkRefOf(req.params), req.user, true, baseUrl()));
});

networksRouter.get("/:accession/:version/:position/metrics", validate(networkRefSchema), async (req, res) => {
  const p = networkRefOf(req.params);
  await sendPublicAnswer(req, res, p.accession, `metrics/${p.version}/${p.position}`, () => getNetworkMetrics(p, req.user));
});
