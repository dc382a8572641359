/**
 * /api/v1/deposits — a depositor's own drafts and submissions (owner; curators may read). Every route
 * needs a signed-in account with a confirmed e-mail address; the service checks owner and state.
 */
import { Router } from "express";
import { requireSignedIn } from "../../middlewares/require-role";
import { requireVerifiedEmail } from "../../middlewares/require-verified-email";
import * as c from "./deposits.controller";
import { uploadFiles } from "./deposits.validation";
import { createRateLimiter } from "../../middlewares/rate-limit";

/** Each comment sends e-mail: 30 per account per 15 minutes (the router has signed the caller in). */
const commentRateLimit = createRateLimiter({ what: "comments", limit: 30, key: (req) => `user:${req.user?.id ?? 0}` });

export const depositsRouter = Router();

depositsRouter.use(requireSignedIn, requireVerifiedEmail);
depositsRouter.get("/", c.list); // my deposits with their states
depositsRouter.post("/", c.create); // new dataset + v1 draft
depositsRouter.get("/:id", c.show); // owner or curator, else 404
depositsRouter.delete("/:id", c.remove); // owner, drafts only
depositsRouter.put("/:id/metadata", c.updateMetadata); // owner, draft or changes requested
depositsRouter.post("/:id/networks", c.uploadTarget, uploadFiles, c.upload); // owner (checked before the body is read); multipart "files" (+ kind, directed, format)
depositsRouter.put("/:id/networks/order", c.reorder); // owner; { order: [networkId…] }
depositsRouter.post("/:id/networks/apply", c.applyBlocks); // owner; { from: networkId, blocks: ["locality", "habitat", "dates", "sampling"] }
depositsRouter.get("/:id/metadata-sheet", c.metadataSheet); // owner or curator: CSV, one row per network
depositsRouter.put("/:id/metadata-sheet", c.uploadMetadataSheet); // owner; { csv } → every network filled, problems per cell
depositsRouter.patch("/:id/networks/:networkId", c.updateNetwork); // owner; { metadata?, kind?, directed?, format? }
depositsRouter.delete("/:id/networks/:networkId", c.deleteNetwork); // owner
depositsRouter.get("/:id/networks/:networkId/file", c.networkFile); // owner or curator: original bytes
depositsRouter.get("/:id/networks/:networkId/canonical", c.networkCanonical); // owner or curator: parsed form for previews
depositsRouter.post("/:id/submit", c.submit); // owner; full validation, e-mails the curators; { reply? } goes to the thread
depositsRouter.get("/:id/comments", c.thread); // owner or curator: the conversation on the submission
depositsRouter.post("/:id/comments", commentRateLimit, c.comment); // owner or curator (session), once submitted; e-mails the other side
