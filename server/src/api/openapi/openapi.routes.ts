/** GET /api/v1/openapi.json — the OpenAPI 3.1 description of the public API. */
import { Router } from "express";
import { openapiDocument } from "./openapi.document";

export const openapiRouter = Router();

openapiRouter.get("/", (_req, res) => {
  res.set("Cache-Control", "public, max-age=300");
  res.json(openapiDocument());
});
