/**
 * /api/v1/tokens — the signed-in user's personal API tokens.
 *
 * | route          | who                          | answer                                   |
 * |----------------|------------------------------|------------------------------------------|
 * | GET /          | signed in                    | `{ data: ApiTokenView[] }`               |
 * | POST /         | signed in, in the browser    | 201 `{ token, secret }` (secret once)    |
 * | DELETE /:id    | signed in, own token         | `{ token }` (revoked)                    |
 * Creating or revoking needs a browser session (403 `session_required` to a token): a token cannot mint more tokens.
 */
import { Router } from "express";
import { requireBrowserSession, requireSignedIn } from "../../middlewares/require-role";
import { createToken, listTokens, revokeToken } from "./tokens.service";
import { validate } from "../../middlewares/validate";
import { createTokenSchema, revokeTokenSchema } from "./tokens.schemas";

export const tokensRouter = Router();

tokensRouter.get("/", requireSignedIn, async (req, res) => {
  res.json({ data: await listTokens(req.user!.id) });
});

tokensRouter.post("/", requireBrowserSession, validate(createTokenSchema), async (req, res) => {
  res.status(201).json(await createToken(req.user!.id, (req.body as { name: string }).name.trim()));
});

tokensRouter.delete("/:id", requireBrowserSession, validate(revokeTokenSchema), async (req, res) => {
  res.json({ token: await revokeToken(req.user!.id, req.params.id as unknown as number) });
});
