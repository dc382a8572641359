/**
 * /api/v1/datasets — published datasets by accession (public read), plus the owner's "new version" and a
 * curator's withdrawal. Withdrawn datasets answer 410 with their tombstone.
 */
import { Router } from "express";
import { requireRole, requireSignedIn } from "../../middlewares/require-role";
import { requireVerifiedEmail } from "../../middlewares/require-verified-email";
import * as c from "./datasets.controller";

export const datasetsRouter = Router();

datasetsRouter.get("/:accession", c.show); // public: latest published version (?version=N)
datasetsRouter.get("/:accession/versions/:n", c.showVersion); // public: one published version
datasetsRouter.get("/:accession/versions/:n/networks/:pos/file", c.networkFile); // public: original bytes
datasetsRouter.post("/:accession/versions", requireSignedIn, requireVerifiedEmail, c.newVersion); // owner: v(n+1) draft
datasetsRouter.post("/:accession/withdraw", requireRole("curator"), c.withdraw); // curator/admin, reason required
