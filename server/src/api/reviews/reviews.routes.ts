/** /api/v1/reviews — curators only: the queue, a submission's review data, decisions and corrections. */
import { Router, type Request, type Response } from "express";
import type { ListResponse } from "@shared/types/api";
import { ApiError } from "../../lib/api-error";
import { requireRole } from "../../middlewares/require-role";
import { idParam } from "../deposits/deposits.validation";
import * as s from "./reviews.service";
import { submissionDiff } from "./reviews.diff";

export const reviewsRouter = Router();
reviewsRouter.use(requireRole("curator"));

function decisionBody(body: unknown): { decision: s.Decision; comment: string | null; lockVersion?: number } {
  const b = (body ?? {}) as Record<string, unknown>;
  if (!["publish", "request_changes", "decline"].includes(String(b.decision))) {
    throw ApiError.badRequest('decision must be "publish", "request_changes" or "decline".', [{ path: "/decision", message: "Choose publish, request changes or decline." }]);
  }
  if (b.comment !== undefined && b.comment !== null && typeof b.comment !== "string") throw ApiError.badRequest("comment must be text.", [{ path: "/comment", message: "Text." }]);
  if (b.comment && (b.comment as string).length > 20000) throw ApiError.badRequest("comment is too long.", [{ path: "/comment", message: "At most 20000 characters." }]);
  if (b.lockVersion !== undefined && !Number.isInteger(b.lockVersion)) throw ApiError.badRequest("lockVersion must be an integer.", [{ path: "/lockVersion", message: "An integer." }]);
  return { decision: b.decision as s.Decision, comment: (b.comment as string | undefined) ?? null, lockVersion: b.lockVersion as number | undefined };
}

reviewsRouter.get("/", async (req: Request, res: Response) => {
  const state = req.query.state === undefined || req.query.state === "" ? undefined : String(req.query.state);
  if (state !== undefined && !(s.QUEUE_STATES as readonly string[]).includes(state)) {
    throw ApiError.badRequest(`state must be one of ${s.QUEUE_STATES.join(", ")}.`, [{ path: "state", message: `One of ${s.QUEUE_STATES.join(", ")}.` }]);
  }
  const q = typeof req.query.q === "string" ? req.query.q.slice(0, 200) : undefined;
  const data = await s.reviewQueue(req.user!, { state: state as s.QueueState | undefined, q });
  const body: ListResponse<s.QueueItem> = { data, meta: { total: data.length } };
  res.json(body);
});
reviewsRouter.get("/:versionId", async (req, res) => {
  res.json(await s.reviewDetail(idParam(req.params.versionId, "submission"), req.user!));
});
reviewsRouter.post("/:versionId/decision", async (req, res) => {
  res.json(await s.decide(idParam(req.params.versionId, "submission"), req.user!, decisionBody(req.body)));
});
reviewsRouter.put("/:versionId/metadata", async (req, res) => {
  const b = (req.body ?? {}) as { metadata?: unknown; lockVersion?: number };
  res.json(await s.correctStudyMetadata(idParam(req.params.versionId, "submission"), req.user!, b.metadata, b.lockVersion));
});
reviewsRouter.patch("/:versionId/networks/:networkId", async (req, res) => {
  res.json(await s.correctNetworkMetadata(idParam(req.params.versionId, "submission"), idParam(req.params.networkId, "network"), req.user!, (req.body as { metadata?: unknown } | undefined)?.metadata));
});
reviewsRouter.get("/:versionId/diff", async (req, res) => {
  res.json(await submissionDiff(idParam(req.params.versionId, "submission"), req.user!));
});
