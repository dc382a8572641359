/**
 * Admin, development: the messages captured by the local mail catcher running in this process
 * (`npm start` starts one). Without a catcher every route answers 404 `no_mail_catcher`. Browser session
 * only: the messages hold live confirmation and password-reset links, which an API token must not read.
 */
import { Router, type Request, type Response } from "express";
import { requireBrowserSession, requireRole } from "../../middlewares/require-role";
import { ApiError } from "../../lib/api-error";
import * as service from "./outbox.service";

export const outboxRouter = Router();

outboxRouter.get("/", requireRole("admin"), requireBrowserSession, (req: Request, res: Response) => {
  res.json(service.listMessages({ to: typeof req.query.to === "string" ? req.query.to : undefined }));
});
outboxRouter.get("/:id", requireRole("admin"), requireBrowserSession, (req: Request, res: Response) => {
  const id = Number(req.params.id);
  if (!Number.isInteger(id) || id < 1) throw ApiError.notFound("No such message.");
  res.json(service.getMessage(id));
});
