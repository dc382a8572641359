/**
 * Submitting a deposit: full validation of the study and every network (every problem listed per field
 * and per network), the state change with a snapshot of what was submitted (deposits.snapshots.ts) and
 * the depositor's reply in the thread, all in one transaction; then the curators' e-mail and the
 * depositor's receipt (a failed e-mail is logged, never undoes the submission).
 */
import { Op } from "sequelize";
import { ApiError, type ErrorDetail } from "../../lib/api-error";
import { audit } from "../../lib/audit";
import { config } from "../../config/env";
import { logger } from "../../lib/logger";
import { Dataset, DatasetVersion, Network, SubmissionComment, User } from "../../models";
import { sendMail } from "../../emails/mailer";
import { reviewSubmittedEmail } from "../../emails/templates/review-submitted";
import { depositReceiptEmail } from "../../emails/templates/deposit-receipt";
import type { Viewer } from "../datasets/datasets.service";
import { recordSubmission } from "./deposits.snapshots";
import { bump, loadOwnEditable, tx } from "./deposits.access";
import { depositDetail, findingsOf, type DepositDetail } from "./deposits.detail";

/** Full validation of a version: study and every network; returns the problems as error details. */
export function submissionProblems(version: DatasetVersion, networks: Network[]): ErrorDetail[] {
  const f = findingsOf(version, networks);
  const problems: ErrorDetail[] = f.study.map((e) => ({ path: `/study${e.path}`, field: e.path, section: "study", message: e.message }));
  for (const n of f.networks) {
    const name = networks.find((x) => x.id === n.networkId)?.originalName ?? "";
    for (const e of n.findings) problems.push({ path: `/networks/${n.position}${e.path}`, field: e.path, section: "network", network: n.position, networkId: n.networkId, file: name, message: `Network ${n.position} (${name}): ${e.message}` });
  }
  if (!networks.length) problems.push({ path: "/networks", section: "networks", message: "Add at least one network file before submitting." });
  return problems;
}

/**
 * Submits (or resubmits) a version. `reply`: the depositor's message to the curators sent with it (e.g. what
 * was changed as asked), stored in the submission's thread and quoted in the curators' e-mail.
 */
export async function submitDeposit(versionId: number, viewer: Viewer, reply: string | null = null): Promise<DepositDetail> {
  const { dataset, version, resubmission } = await tx(async (t) => {
    const r = await loadOwnEditable(versionId, viewer, t);
    const networks = await Network.findAll({ where: { versionId: r.version.id }, order: [["position", "ASC"]], transaction: t });
    const problems = submissionProblems(r.version, networks);
    if (problems.length) throw ApiError.unprocessable(`The deposit cannot be submitted yet: ${problems.length} problem${problems.length === 1 ? "" : "s"} to fix.`, problems);
    const resubmission = r.version.state === "changes_requested";
    const from = r.version.state;
    await bump(r.version, t, { state: "submitted", submittedAt: new Date() });
    const round = await recordSubmission(r.version.id, viewer.id, t);
    if (reply) await SubmissionComment.create({ versionId: r.version.id, authorId: viewer.id, side: "depositor", body: reply, round }, { transaction: t });
    await audit({ actorId: viewer.id, action: "deposit.submit", entityType: "dataset_version", entityId: r.version.id, datasetId: r.dataset.id, details: { from, to: "submitted", networks: networks.length, round } }, t);
    return { ...r, resubmission, networkCount: networks.length };
  });
  await notifyCurators(dataset, version, viewer, resubmission, reply);
  await sendReceipt(version, viewer, resubmission);
  return depositDetail(dataset, version, viewer);
}

/** The depositor's receipt: what arrived, when, and what happens next. */
async function sendReceipt(version: DatasetVersion, depositor: Viewer, resubmission: boolean): Promise<void> {
  try {
    const owner = await User.findByPk(depositor.id);
    if (!owner) return;
    const networkCount = await Network.count({ where: { versionId: version.id } });
    await sendMail(owner.email, depositReceiptEmail({
      title: String(version.metadata?.title ?? "(untitled)"),
      depositor: owner.displayName,
      versionNumber: version.number,
      networkCount,
      resubmission,
      at: version.submittedAt ? new Date(version.submittedAt) : new Date(),
      url: `${config().publicUrl}/deposit/${version.id}`,
    }));
  } catch (err) {
    logger.warn({ err }, "could not send the depositor a receipt");
  }
}

async function notifyCurators(dataset: Dataset, version: DatasetVersion, depositor: Viewer, resubmission: boolean, reply: string | null): Promise<void> {
  try {
    const curators = await User.findAll({ where: { role: { [Op.in]: ["curator", "admin"] }, id: { [Op.ne]: dataset.ownerId } } });
    if (!curators.length) return;
    const owner = await User.findByPk(depositor.id);
    const networkCount = await Network.count({ where: { versionId: version.id } });
    const mail = reviewSubmittedEmail({
      title: String(version.metadata?.title ?? "(untitled)"),
      depositor: owner?.displayName ?? "A depositor",
      versionNumber: version.number,
      networkCount,
      resubmission,
      reviewUrl: `${config().publicUrl}/review/${version.id}`,
      reply,
    });
    await Promise.all(curators.map((c) => sendMail(c.email, mail)));
  } catch (err) {
    logger.warn({ err }, "could not e-mail the curators about a submission");
  }
}
