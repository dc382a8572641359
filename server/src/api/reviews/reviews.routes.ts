/** /api/v1/reviews — curators only: the queue, a submission's review data, decisions and corrections. */
import { Router, type Request, type Response } from "express";
import type { ListResponse } from "@shared/types/api";
import { requireRole } from "../../middlewares/require-role";
import { validate } from "../../middlewares/validate";
import { decisionSchema, networkCorrectionSchema, queueSchema, studyCorrectionSchema, submissionSchema } from "./reviews.schemas";
import * as s from "./reviews.service";
import { submissionDiff } from "./reviews.diff";

export const reviewsRouter = Router();
reviewsRouter.use(requireRole("curator"));

/** The submission's version id, a whole number once validate() has read it. */
const versionIdOf = (req: Request): number => (req.params as unknown as { versionId: number }).versionId;

reviewsRouter.get("/", validate(queueSchema), async (req: Request, res: Response) => {
  const { state, q } = req.query as { state?: s.QueueState; q?: string };
  const data = await s.reviewQueue(req.user!, { state, q: q?.slice(0, 200) });
  const body: ListResponse<s.QueueItem> = { data, meta: { total: data.length } };
  res.json(body);
});
reviewsRouter.get("/:versionId", validate(submissionSchema), async (req, res) => {
  res.json(await s.reviewDetail(versionIdOf(req), req.user!));
});
reviewsRouter.post("/:versionId/decision", validate(decisionSchema), async (req, res) => {
  const b = req.body as { decision: s.Decision; comment?: string | null; lockVersion?: number };
  res.json(await s.decide(versionIdOf(req), req.user!, { decision: b.decision, comment: b.comment ?? null, lockVersion: b.lockVersion }));
});
reviewsRouter.put("/:versionId/metadata", validate(studyCorrectionSchema), async (req, res) => {
  const b = req.body as { metadata: Record<string, unknown>; lockVersion?: number };
  res.json(await s.correctStudyMetadata(versionIdOf(req), req.user!, b.metadata, b.lockVersion));
});
reviewsRouter.patch("/:versionId/networks/:networkId", validate(networkCorrectionSchema), async (req, res) => {
  const networkId = (req.params as unknown as { networkId: number }).networkId;
  res.json(await s.correctNetworkMetadata(versionIdOf(req), networkId, req.user!, (req.body as { metadata: Record<string, unknown> }).metadata));
});
reviewsRouter.get("/:versionId/diff", validate(submissionSchema), async (req, res) => {
  res.json(await submissionDiff(versionIdOf(req), req.user!));
});
