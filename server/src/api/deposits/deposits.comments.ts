/**
 * The conversation on a submission (migration 20261202-1420): the depositor and the curators write to each
 * other in one thread per version, shown on both sides together with the decisions and the submissions.
 *
 * - Who: the version's owner (always the depositor side) and curators; everyone else gets 404, like the
 *   deposit itself. A curator writing with an API token gets 403 `session_required` (curator writes need a
 *   browser session); the depositor may use a token, as for the rest of a deposit.
 * - When: once the version has been submitted (a draft has no curator to talk to yet); afterwards in every
 *   state, so a declined or published submission can still be discussed.
 * - E-mail: a comment goes to the other side with a link to answer: the depositor's to the curators who
 *   took part in this version (decided or commented; every curator when none has yet), a curator's to the
 *   depositor and to the other curators who took part.
 */
import { Op, QueryTypes } from "sequelize";
import type { Request } from "express";
import { sequelize } from "../../db/sequelize";
import { config } from "../../config/env";
import { ApiError } from "../../lib/api-error";
import { audit } from "../../lib/audit";
import { logger } from "../../lib/logger";
import { sessionRequired } from "../../middlewares/require-role";
import { Dataset, DatasetVersion, Review, SubmissionComment, User } from "../../models";
import { sendMail } from "../../emails/mailer";
import { submissionCommentEmail } from "../../emails/templates/submission-comment";
import type { ThreadEntry, ThreadResponse } from "@shared/types/review";
import type { Viewer } from "../datasets/datasets.service";
import { loadVisibleVersion } from "./deposits.access";

export const MAX_COMMENT_CHARS = 10_000;

/** A comment's text as stored: line ends as \n, trimmed (the route's schema has checked it is text with something in it, within MAX_COMMENT_CHARS). */
export function commentText(text: string): string {
  return text.replace(/\r\n/g, "\n").trim();
}

function sideOf(dataset: Dataset, viewer: Viewer): "depositor" | "curator" {
  return dataset.ownerId === viewer.id ? "depositor" : "curator";
}

/** The thread of a version: comments, decisions and submissions, oldest first. */
export async function listThread(versionId: number, viewer: Viewer): Promise<ThreadResponse> {
  const { dataset, version } = await loadVisibleVersion(versionId, viewer);
  const [comments, reviews, snaps] = await Promise.all([
    SubmissionComment.findAll({ where: { versionId: version.id }, order: [["createdAt", "ASC"], ["id", "ASC"]], include: [{ model: User, as: "author", attributes: ["displayName"] }] }),
    Review.findAll({ where: { versionId: version.id }, order: [["createdAt", "ASC"]], include: [{ model: User, as: "curator", attributes: ["displayName"] }] }),
    sequelize().query(
      `SELECT s.id, s.round, s.submitted_at, u.display_name FROM submission_snapshots s LEFT JOIN users u ON u.id = s.submitted_by WHERE s.version_id = :v ORDER BY s.round`,
      { replacements: { v: version.id }, type: QueryTypes.SELECT },
    ) as Promise<Array<{ id: number; round: number; submitted_at: Date; display_name: string | null }>>,
  ]);
  const entries: ThreadEntry[] = [
    ...snaps.map((s): ThreadEntry => ({ kind: "submitted", id: s.id, at: new Date(s.submitted_at).toISOString(), round: s.round, author: s.display_name ?? "(former account)" })),
    ...reviews.map((r): ThreadEntry => ({ kind: "decision", id: r.id, at: new Date(r.createdAt).toISOString(), decision: r.decision, author: (r as Review & { curator?: User }).curator?.displayName ?? "(former account)", body: r.comment ?? null })),
    ...comments.map((c): ThreadEntry => ({
      kind: "comment",
      id: c.id,
      at: new Date(c.createdAt).toISOString(),
      side: c.side,
      author: (c as SubmissionComment & { author?: User }).author?.displayName ?? "(former account)",
      body: c.body,
      round: c.round,
      own: c.authorId === viewer.id,
    })),
  ];
  // the submission comes before a reply sent with it (same transaction, same instant)
  const order = { submitted: 0, comment: 1, decision: 2 } as const;
  entries.sort((a, b) => a.at.localeCompare(b.at) || order[a.kind] - order[b.kind] || a.id - b.id);
  return { entries, canComment: version.state !== "draft", side: sideOf(dataset, viewer) };
}

/** Adds a comment to a version's thread and e-mails the other side. */
export async function addComment(versionId: number, viewer: Viewer, text: string, via: Request["authVia"]): Promise<ThreadResponse> {
  const body = commentText(text);
  const { dataset, version, comment } = await sequelize().transaction(async (t) => {
    const r = await loadVisibleVersion(versionId, viewer, t, true);
    const side = sideOf(r.dataset, viewer);
    if (side === "curator" && via === "token") throw sessionRequired();
    if (r.version.state === "draft") throw ApiError.conflict("The conversation with the curators opens once the deposit is submitted; until then, nobody but you sees it.");
    const [{ round }] = (await sequelize().query(`SELECT coalesce(max(round), 0)::int AS round FROM submission_snapshots WHERE version_id = :v`, { replacements: { v: r.version.id }, type: QueryTypes.SELECT, transaction: t })) as Array<{ round: number }>;
    const comment = await SubmissionComment.create({ versionId: r.version.id, authorId: viewer.id, side, body, round }, { transaction: t });
    await audit({ actorId: viewer.id, action: "submission.comment", entityType: "dataset_version", entityId: r.version.id, datasetId: r.dataset.id, details: { commentId: comment.id, side, round } }, t);
    return { ...r, comment };
  });
  await mailComment(dataset, version, comment, viewer);
  return listThread(versionId, viewer);
}

/** Curators who decided or commented on this version (the people following it). */
async function participatingCurators(versionId: number, exceptIds: number[]): Promise<User[]> {
  const [reviews, comments] = await Promise.all([
    Review.findAll({ where: { versionId }, attributes: ["curatorId"] }),
    SubmissionComment.findAll({ where: { versionId, side: "curator" }, attributes: ["authorId"] }),
  ]);
  const ids = [...new Set([...reviews.map((r) => r.curatorId), ...comments.map((c) => c.authorId).filter((x): x is number => x !== null)])].filter((id) => !exceptIds.includes(id));
  if (!ids.length) return [];
  return User.findAll({ where: { id: { [Op.in]: ids }, role: { [Op.in]: ["curator", "admin"] } } });
}

async function mailComment(dataset: Dataset, version: DatasetVersion, comment: SubmissionComment, author: Viewer): Promise<void> {
  try {
    const base = config().publicUrl;
    const title = String(version.metadata?.title ?? "(untitled)");
    const authorUser = await User.findByPk(author.id);
    const authorName = authorUser?.displayName ?? "Someone";
    const common = { author: authorName, authorSide: comment.side, title, versionNumber: version.number, body: comment.body };
    const sends: Array<Promise<unknown>> = [];
    let curators = await participatingCurators(version.id, [author.id, dataset.ownerId]);
    if (comment.side === "depositor" && !curators.length) {
      curators = await User.findAll({ where: { role: { [Op.in]: ["curator", "admin"] }, id: { [Op.ne]: dataset.ownerId } } });
    }
    for (const c of curators) sends.push(sendMail(c.email, submissionCommentEmail({ ...common, to: "curator", recipient: c.displayName, url: `${base}/review/${version.id}` })));
    if (comment.side === "curator") {
      const owner = await User.findByPk(dataset.ownerId);
      if (owner) sends.push(sendMail(owner.email, submissionCommentEmail({ ...common, to: "depositor", recipient: owner.displayName, url: `${base}/deposit/${version.id}` })));
    }
    await Promise.all(sends);
  } catch (err) {
    logger.warn({ err }, "could not e-mail a submission comment");
  }
}
