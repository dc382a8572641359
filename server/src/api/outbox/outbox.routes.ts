/**
 * Admin, development: the messages captured by the local mail catcher running in this process
 * (`npm start` starts one). Without a catcher every route answers 404 `no_mail_catcher`. Browser session
 * only: the messages hold live confirmation and password-reset links, which an API token must not read.
 */
import { Router, type Request, type Response } from "express";
import { requireBrowserSession, requireRole } from "../../middlewares/require-role";
import { validate } from "../../middlewares/validate";
import * as service from "./outbox.service";
import { outboxListSchema, outboxMessageSchema } from "./outbox.schemas";

export const outboxRouter = Router();

outboxRouter.get("/", requireRole("admin"), requireBrowserSession, validate(outboxListSchema), (req: Request, res: Response) => {
  res.json(service.listMessages(req.query as { to?: string }));
});
outboxRouter.get("/:id", requireRole("admin"), requireBrowserSession, validate(outboxMessageSchema), (req: Request, res: Response) => {
  res.json(service.getMessage(req.params.id as unknown as number));
});
