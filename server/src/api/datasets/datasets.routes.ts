/**
 * /api/v1/datasets — published datasets by accession (public read), plus the owner's "new version" and a
 * curator's withdrawal. Withdrawn datasets answer 410 with their tombstone. The public reads share the
 * read API's rate limit (per token or IP). Addresses and bodies are checked by datasets.schemas.ts.
 */
import { Router } from "express";
import { apiRateLimit } from "../../middlewares/api-rate-limit";
import { requireRole, requireSignedIn } from "../../middlewares/require-role";
import { requireVerifiedEmail } from "../../middlewares/require-verified-email";
import { validate } from "../../middlewares/validate";
import * as c from "./datasets.controller";
import { datasetSchema, datasetVersionSchema, networkFileSchema, newVersionSchema, withdrawSchema } from "./datasets.schemas";

export const datasetsRouter = Router();

datasetsRouter.get("/:accession", apiRateLimit, validate(datasetSchema), c.show); // public: latest published version (?version=N)
datasetsRouter.get("/:accession/versions/:n", apiRateLimit, validate(datasetVersionSchema), c.showVersion); // public: one published version
datasetsRouter.get("/:accession/versions/:n/networks/:pos/file", apiRateLimit, validate(networkFileSchema), c.networkFile); // public: original bytes
datasetsRouter.post("/:accession/versions", requireSignedIn, requireVerifiedEmail, validate(newVersionSchema), c.newVersion); // owner: v(n+1) draft
datasetsRouter.post("/:accession/withdraw", requireRole("curator"), validate(withdrawSchema), c.withdraw); // curator/admin, reason required
