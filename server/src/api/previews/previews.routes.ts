/**
 * /api/v1/previews — link-preview images (1200 × 630 PNG) of dataset and network pages, named in their
 * pages' og:image tags.
 *
 * | route                                   | who                | answer                                   |
 * |-----------------------------------------|--------------------|------------------------------------------|
 * | GET /:accession/:version.png            | anyone (published) | PNG: the version's first networks' matrices |
 * | GET /:accession/:version/:position.png  | anyone (published) | PNG: the network's module-ordered matrix  |
 * Unpublished versions: owner and curators only (404 for others); withdrawn → 410.
 */
import { Router, type Response } from "express";
import { apiRateLimit } from "../../middlewares/api-rate-limit";
import { validate } from "../../middlewares/validate";
import { datasetPreview, networkPreview, type Preview } from "./previews.service";
import { datasetPreviewSchema, networkPreviewSchema } from "./previews.schemas";

export const previewsRouter = Router();
previewsRouter.use(apiRateLimit);

function send(res: Response, p: Preview) {
  res.type("image/png");
  res.set("ETag", p.etag);
  res.set("Cache-Control", p.cacheable ? "public, max-age=3600" : "private, no-store");
  res.send(p.png);
}

previewsRouter.get("/:accession/:version.png", validate(datasetPreviewSchema), async (req, res) => {
  const { accession, version } = req.params as Record<string, string>;
  send(res, await datasetPreview(accession, version, req.user));
});

previewsRouter.get("/:accession/:version/:position.png", validate(networkPreviewSchema), async (req, res) => {
  const { accession, version, position } = req.params as unknown as { accession: string; version: string; position: number };
  send(res, await networkPreview(accession, version, position, req.user));
});
