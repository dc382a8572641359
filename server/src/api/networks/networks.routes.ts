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
 * Unpublished versions: owner and curators only (404 for others); withdrawn → 410.
 */
import { Readable } from "node:stream";
import { pipeline } from "node:stream/promises";
import { Router, type Request, type Response } from "express";
import { ApiError } from "../../lib/api-error";
import { logger } from "../../lib/logger";
import { sendPublicAnswer } from "../../lib/public-answers";
import { apiRateLimit } from "../../middlewares/api-rate-limit";
import { config } from "../../config/env";
import { listCatalogue } from "../catalogue/catalogue.routes";
import { getNetworkCsv, getNetworkJson, getNetworkMetrics, type NetworkRefParams } from "./networks.service";

export const networksRouter = Router();
networksRouter.use(apiRateLimit);

const baseUrl = () => `${config().publicUrl}/api/v1/networks`;

function layoutOf(req: Request): "matrix" | "edgelist" {
  const l = req.query.layout;
  if (l === undefined || l === "matrix") return "matrix";
  if (l === "edgelist") return "edgelist";
  throw ApiError.badRequest(`layout must be matrix or edgelist, got "${String(l)}".`, [{ path: "layout", message: "must be matrix or edgelist" }]);
}

/** `spreadsheetSafe=true`: formula-like labels get a leading apostrophe (the data are otherwise exact). */
function spreadsheetSafeOf(req: Request): boolean {
  const v = req.query.spreadsheetSafe;
  if (v === undefined || v === "false") return false;
  if (v === "true") return true;
  throw ApiError.badRequest(`spreadsheetSafe must be true or false, got "${String(v)}".`, [{ path: "spreadsheetSafe", message: "must be true or false" }]);
}

async function sendCsv(req: Request, res: Response) {
  // the network is checked and its size computed before anything is sent (a damaged one is an error answer)
  const { ref, bytes, pieces } = await getNetworkCsv(req.params as unknown as NetworkRefParams, req.user, layoutOf(req), spreadsheetSafeOf(req));
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

networksRouter.get("/:accession/:version/:position", async (req, res) => {
  const format = req.query.format ?? "json";
  if (format === "csv") return sendCsv(req, res);
  if (format !== "json") throw ApiError.badRequest(`format must be json or csv, got "${String(format)}".`, [{ path: "format", message: "must be json or csv" }]);
  res.json(await getNetworkJson(req.params as unknown as NetworkRefParams, req.user, req.query.include === "data", baseUrl()));
});

networksRouter.get("/:accession/:version/:position/data.csv", sendCsv);

networksRouter.get("/:accession/:version/:position/data.json", async (req, res) => {
  res.json(await getNetworkJson(req.params as unknown as NetworkRefParams, req.user, true, baseUrl()));
});

networksRouter.get("/:accession/:version/:position/metrics", async (req, res) => {
  const p = req.params as unknown as NetworkRefParams;
  await sendPublicAnswer(req, res, p.accession, `metrics/${p.version}/${p.position}`, () => getNetworkMetrics(p, req.user));
});
