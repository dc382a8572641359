/**
 * /api/v1/deposits — a depositor's own drafts and submissions (owner; curators may read). Every route
 * needs a signed-in account with a confirmed e-mail address; ids and bodies are checked by
 * deposits.schemas.ts (validate), owner and state by the service.
 */
import { Router } from "express";
import { requireSignedIn } from "../../middlewares/require-role";
import { requireVerifiedEmail } from "../../middlewares/require-verified-email";
import { validate } from "../../middlewares/validate";
import * as c from "./deposits.controller";
import { uploadFiles } from "./deposits.upload";
import { createRateLimiter } from "../../middlewares/rate-limit";
import * as v from "./deposits.schemas";

/** Each comment sends e-mail: 30 per account per 15 minutes (the router has signed the caller in). */
const commentRateLimit = createRateLimiter({ what: "comments", limit: 30, key: (req) => `user:${req.user?.id ?? 0}` });

export const depositsRouter = Router();

depositsRouter.use(requireSignedIn, requireVerifiedEmail);
depositsRouter.get("/", c.list); // my deposits with their states
depositsRouter.post("/", validate(v.createSchema), c.create); // new dataset + v1 draft
depositsRouter.get("/:id", validate(v.depositSchema), c.show); // owner or curator, else 404
depositsRouter.delete("/:id", validate(v.depositSchema), c.remove); // owner, drafts only
depositsRouter.put("/:id/metadata", validate(v.metadataSchema), c.updateMetadata); // owner, draft or changes requested
// owner (checked before the body is read); multipart "files" (+ kind, directed, format, sheet, missing, blank, fileOptions, checked after the files)
depositsRouter.post("/:id/networks", validate(v.depositSchema), c.uploadTarget, uploadFiles, validate(v.uploadFieldsSchema), c.upload);
depositsRouter.put("/:id/networks/order", validate(v.reorderSchema), c.reorder); // owner; { order: [networkId…] }
depositsRouter.post("/:id/networks/apply", validate(v.applyBlocksSchema), c.applyBlocks); // owner; { from: networkId, blocks: ["locality", "habitat", "dates", "sampling"] }
depositsRouter.get("/:id/metadata-sheet", validate(v.depositSchema), c.metadataSheet); // owner or curator: CSV, one row per network
depositsRouter.put("/:id/metadata-sheet", validate(v.sheetSchema), c.uploadMetadataSheet); // owner; { csv } → every network filled, problems per cell
depositsRouter.patch("/:id/networks/:networkId", validate(v.networkChangesSchema), c.updateNetwork); // owner; { metadata?, kind?, directed?, format?, sheet?, missing?, blank? }
depositsRouter.delete("/:id/networks/:networkId", validate(v.depositNetworkSchema), c.deleteNetwork); // owner
depositsRouter.get("/:id/networks/:networkId/file", validate(v.depositNetworkSchema), c.networkFile); // owner or curator: original bytes
depositsRouter.get("/:id/networks/:networkId/canonical", validate(v.depositNetworkSchema), c.networkCanonical); // owner or curator: parsed form for previews
depositsRouter.post("/:id/submit", validate(v.submitSchema), c.submit); // owner; full validation, e-mails the curators; { reply? } goes to the thread
depositsRouter.get("/:id/comments", validate(v.depositSchema), c.thread); // owner or curator: the conversation on the submission
depositsRouter.post("/:id/comments", commentRateLimit, validate(v.commentSchema), c.comment); // owner or curator (session), once submitted; e-mails the other side
