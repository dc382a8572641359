/**
 * Curation: the review queue, the review page's data, decisions with optimistic locking, metadata
 * corrections (audited with before/after) and publishing. (Withdrawal is api/datasets/datasets.withdrawal.ts,
 * which mails the depositor through mailDepositor here.)
 *
 * Decisions: publish, request changes (comment required), decline (reason required). A decision applies
 * only to a `submitted` version whose `lock_version` is the one the curator saw: the conditional UPDATE
 * makes two curators deciding at once safe (one wins; the other gets 409). A curator never decides on
 * their own deposit (403). Publishing needs metadata that passes the full submission validation (422 with
 * every problem otherwise: curators' corrections are saved unvalidated). Publishing assigns the accession
 * on first publication only (`TB-` + six digits
 * from the sequence accession_seq, so never reused), freezes the version and queues the metrics of every
 * network, all in one transaction. It also reserves the dataset's DOIs (concept and version), which a job
 * registers with DataCite after the commit (server/src/dois/dois.ts), so a DataCite outage never blocks publishing.
 */
import { QueryTypes } from "sequelize";
import { ApiError } from "../../lib/api-error";
import { withNormalisedDoi } from "@shared/validation/doi";
import { audit } from "../../lib/audit";
import { logger } from "../../lib/logger";
import { sequelize } from "../../db/sequelize";
import { config } from "../../config/env";
import { AuditLog, Dataset, DatasetVersion, Network, Review, User } from "../../models";
import { enqueueNetworkMetrics } from "../../pipeline/enqueue";
import { notifyCatalogueChanged } from "../catalogue/catalogue.events";
import { doisOfDataset, requestDoiSync, reserveDois } from "../../dois/dois";
import { sendMail } from "../../emails/mailer";
import { reviewDecisionEmail, type DecisionKind } from "../../emails/templates/review-decision";
import type { Viewer } from "../datasets/datasets.service";
import { loadCuratorEditable, loadVisibleVersion } from "../deposits/deposits.access";
import { depositDetail } from "../deposits/deposits.detail";
import { updateNetwork } from "../deposits/deposits.networks";
import { submissionProblems } from "../deposits/deposits.submission";

export type Decision = "publish" | "request_changes" | "decline";

export type { HistoryEntry, QueueItem, ReviewDetail } from "@shared/types/review";
import type { HistoryEntry, QueueItem, ReviewDetail } from "@shared/types/review";
import { storeMatrixCsvs } from "../bundles/bundles.stored-csv";

export const QUEUE_STATES = ["submitted", "changes_requested", "published", "declined", "withdrawn"] as const;
export type QueueState = (typeof QUEUE_STATES)[number];

/** Submissions in a state (default: waiting for a decision, oldest first; others newest first), optionally searched. */
export async function reviewQueue(viewer: Viewer, opts: { state?: QueueState; q?: string } = {}): Promise<QueueItem[]> {
  const state = opts.state ?? "submitted";
  const q = (opts.q ?? "").trim();
  const rows = (await sequelize().query(
    `SELECT v.id, v.dataset_id, v.number, v.state, v.metadata->>'title' AS title, v.submitted_at, v.updated_at, d.accession, d.owner_id, u.display_name,
            (SELECT count(*) FROM networks n WHERE n.version_id = v.id) AS networks,
            EXISTS (SELECT 1 FROM reviews r WHERE r.version_id = v.id) AS resubmission
       FROM dataset_versions v JOIN datasets d ON d.id = v.dataset_id JOIN users u ON u.id = d.owner_id
      WHERE v.state = :state
        AND (:q = '' OR v.metadata->>'title' ILIKE :like OR u.display_name ILIKE :like OR coalesce(d.accession, '') ILIKE :like)
      ORDER BY ${state === "submitted" ? "v.submitted_at ASC, v.id ASC" : "v.updated_at DESC, v.id DESC"}
      LIMIT 500`,
    { replacements: { state, q, like: `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` }, type: QueryTypes.SELECT },
  )) as Array<{ id: number; dataset_id: number; number: number; state: string; title: string | null; submitted_at: Date | null; updated_at: Date; accession: string | null; owner_id: number; display_name: string; networks: string; resubmission: boolean }>;
  return rows.map((r) => ({
    versionId: r.id,
    datasetId: r.dataset_id,
    accession: r.accession,
    number: r.number,
    state: r.state as QueueItem["state"],
    title: r.title ?? "(untitled)",
    depositor: r.display_name,
    ownerId: r.owner_id,
    submittedAt: new Date(r.submitted_at ?? r.updated_at).toISOString(),
    updatedAt: new Date(r.updated_at).toISOString(),
    networkCount: Number(r.networks),
    resubmission: r.resubmission,
    ownDeposit: r.owner_id === viewer.id,
  }));
}

export async function datasetHistory(datasetId: number): Promise<HistoryEntry[]> {
  const rows = await AuditLog.findAll({ where: { datasetId }, order: [["id", "ASC"]], include: [{ model: User, as: "actor", attributes: ["displayName"] }] });
  return rows.map((r) => ({
    id: Number(r.id),
    at: new Date(r.createdAt).toISOString(),
    action: r.action,
    actor: (r as AuditLog & { actor?: User }).actor?.displayName ?? null,
    details: r.details ?? {},
  }));
}

export async function reviewDetail(versionId: number, viewer: Viewer): Promise<ReviewDetail> {
  const { dataset, version } = await loadVisibleVersion(versionId, viewer);
  const [base, networks, owner, history] = await Promise.all([
    depositDetail(dataset, version, viewer),
    Network.findAll({ where: { versionId: version.id }, order: [["position", "ASC"]] }),
    User.findByPk(dataset.ownerId),
    datasetHistory(dataset.id),
  ]);
  const dupRows = networks.length
    ? ((await sequelize().query(
        `SELECT n.file_id, d.accession, v.number, n.position
           FROM networks n JOIN dataset_versions v ON v.id = n.version_id JOIN datasets d ON d.id = v.dataset_id
          WHERE n.file_id IN (:fileIds) AND v.state = 'published' AND v.dataset_id <> :datasetId
          ORDER BY d.accession, v.number, n.position`,
        { replacements: { fileIds: networks.map((n) => n.fileId), datasetId: dataset.id }, type: QueryTypes.SELECT },
      )) as Array<{ file_id: number; accession: string; number: number; position: number }>)
    : [];
  const duplicates = networks
    .map((n) => ({
      networkId: n.id,
      position: n.position,
      sha256: base.networks.find((x) => x.id === n.id)?.sha256 ?? "",
      publishedAs: dupRows.filter((r) => r.file_id === n.fileId).map((r) => `${r.accession}/v${r.number}/${r.position}`),
    }))
    .filter((d) => d.publishedAs.length);
  return {
    ...base,
    depositor: { id: owner?.id ?? dataset.ownerId, displayName: owner?.displayName ?? "", email: owner?.email ?? "" },
    ownDeposit: dataset.ownerId === viewer.id,
    problems: submissionProblems(version, networks),
    duplicates,
    history,
  };
}

function decisionUrl(kind: DecisionKind, accession: string | null, versionId: number): string {
  const base = config().publicUrl;
  if (kind === "publish" || kind === "withdraw") return `${base}/datasets/${accession}`;
  if (kind === "request_changes") return `${base}/deposit/${versionId}`;
  return `${base}/my-deposits`;
}

export async function mailDepositor(kind: DecisionKind, dataset: Dataset, version: DatasetVersion, comment: string | null): Promise<void> {
  try {
    const owner = await User.findByPk(dataset.ownerId);
    if (!owner) return;
    const dois = kind === "publish" ? await doisOfDataset(dataset.id) : null;
    const versionDoi = dois?.versions.get(version.number);
    await sendMail(
      owner.email,
      reviewDecisionEmail({
        kind,
        title: String(version.metadata?.title ?? "(untitled)"),
        versionNumber: version.number,
        accession: dataset.accession ?? null,
        comment,
        depositor: owner.displayName,
        url: decisionUrl(kind, dataset.accession ?? null, version.id),
        dois: versionDoi && dois?.concept ? { version: versionDoi.doi, concept: dois.concept.doi } : null,
      }),
    );
  } catch (err) {
    logger.warn({ err }, "could not e-mail the depositor about a decision");
  }
}

export async function decide(versionId: number, viewer: Viewer, input: { decision: Decision; comment?: string | null; lockVersion?: number }): Promise<ReviewDetail> {
  const comment = (input.comment ?? "").trim() || null;
  if ((input.decision === "request_changes" || input.decision === "decline") && !comment) {
    const what = input.decision === "decline" ? "A reason is required to decline." : "A comment is required to request changes: say what to change.";
    throw ApiError.unprocessable(what, [{ path: "/comment", message: what }]);
  }
  const { dataset, version } = await loadVisibleVersion(versionId, viewer);
  if (dataset.ownerId === viewer.id) throw ApiError.forbidden("You cannot decide on your own deposit; another curator must review it.");
  if (version.state !== "submitted") {
    const state = version.state.replace("_", " ");
    const last = await Review.findOne({ where: { versionId: version.id }, order: [["id", "DESC"]], include: [{ model: User, as: "curator", attributes: ["displayName"] }] });
    if (last && ["published", "declined", "changes_requested"].includes(version.state)) {
      const who = last.curatorId === viewer.id ? "You already decided on this submission" : `Another curator decided on this submission first (${(last as Review & { curator?: User }).curator?.displayName ?? "a curator"})`;
      throw ApiError.conflict(`${who}: it is now ${state}. Reload the page; your decision was not recorded.`);
    }
    throw ApiError.conflict(`This version is not awaiting a decision: it is ${state}.`);
  }
  const seenLock = input.lockVersion ?? version.lockVersion;
  const newState = input.decision === "publish" ? "published" : input.decision === "decline" ? "declined" : "changes_requested";

  await sequelize().transaction(async (t) => {
    const [rows] = (await sequelize().query(
      `UPDATE dataset_versions SET state = :state, lock_version = lock_version + 1, updated_at = now(),
              published_at = CASE WHEN :state = 'published' THEN now() ELSE published_at END
        WHERE id = :id AND state = 'submitted' AND lock_version = :lock RETURNING id`,
      { replacements: { state: newState, id: version.id, lock: seenLock }, transaction: t },
    )) as [Array<{ id: number }>, unknown];
    if (!rows.length) {
      throw ApiError.conflict("Another curator decided on or edited this submission a moment ago. Reload the page to see its current state; your decision was not recorded.", [
        { path: "/lockVersion", message: "The submission changed since you opened it." },
      ]);
    }
    if (input.decision === "publish") {
      // Published metadata is validated metadata: corrections are saved as they are, so check again here.
      const fresh = await DatasetVersion.findByPk(version.id, { transaction: t });
      const nets = await Network.findAll({ where: { versionId: version.id }, order: [["position", "ASC"]], transaction: t });
      const problems = submissionProblems(fresh!, nets);
      if (problems.length) {
        throw ApiError.unprocessable(`This submission cannot be published: ${problems.length} metadata problem${problems.length === 1 ? "" : "s"} to correct first (or request changes).`, problems);
      }
      if (!dataset.accession) {
        const [seq] = (await sequelize().query(`SELECT nextval('accession_seq') AS n`, { type: QueryTypes.SELECT, transaction: t })) as Array<{ n: string }>;
        const accession = `TB-${String(seq.n).padStart(6, "0")}`;
        await dataset.update({ accession }, { transaction: t });
      }
      // the matrix CSVs bundles copy (bundles.stored-csv.ts): the version is frozen from now on
      await storeMatrixCsvs(nets.map((n) => n.id), t);
      await enqueueNetworkMetrics(nets.map((n) => n.id), { transaction: t });
      // DOIs: names reserved now, registered with DataCite by a job after the commit
      await reserveDois(dataset.id, dataset.accession!, version.id, version.number, t);
      await notifyCatalogueChanged(dataset.id, t);
    }
    await Review.create({ versionId: version.id, curatorId: viewer.id, decision: input.decision, comment }, { transaction: t });
    await audit(
      { actorId: viewer.id, action: `review.${input.decision}`, entityType: "dataset_version", entityId: version.id, datasetId: dataset.id, details: { from: "submitted", to: newState, comment, ...(input.decision === "publish" ? { accession: dataset.accession } : {}) } },
      t,
    );
  });
  await version.reload();
  await mailDepositor(input.decision, dataset, version, comment);
  return reviewDetail(versionId, viewer);
}

/**
 * A curator corrects the study metadata of a submission, or of a published version (a misspelt creator, a
 * missing iD, the source publication's DOI): audited with before and after. A published version's
 * correction must leave its metadata valid and its licence as published (data given out under a licence
 * keep it; a new version can change it); the catalogue and the DOIs' metadata follow it.
 */
export async function correctStudyMetadata(versionId: number, viewer: Viewer, metadata: unknown, lockVersion?: number): Promise<ReviewDetail> {
  if (!metadata || typeof metadata !== "object" || Array.isArray(metadata)) throw ApiError.badRequest("Study metadata must be a JSON object.", [{ path: "/metadata", message: "A JSON object." }]);
  await sequelize().transaction(async (t) => {
    const { dataset, version } = await loadCuratorEditable(versionId, viewer, t, { published: true });
    if (lockVersion !== undefined && lockVersion !== version.lockVersion) throw ApiError.conflict("The submission changed since you opened it; reload and correct again.");
    const published = version.state === "published";
    const before = version.metadata;
    const after = withNormalisedDoi(metadata as Record<string, unknown>);
    if (published && after.licence !== (before as Record<string, unknown>).licence) {
      throw ApiError.unprocessable("The licence of a published version cannot change: its data were given out under it. Start a new version to publish under another licence.", [
        { path: "/licence", message: `Published under ${String((before as Record<string, unknown>).licence)}; keep it.` },
      ]);
    }
    await version.update({ metadata: after, lockVersion: version.lockVersion + 1 }, { transaction: t });
    if (published) {
      const nets = await Network.findAll({ where: { versionId: version.id }, order: [["position", "ASC"]], transaction: t });
      const problems = submissionProblems(version, nets).filter((p) => p.section === "study");
      if (problems.length) throw ApiError.unprocessable(`The correction was not saved: published metadata must stay complete (${problems.length} problem${problems.length === 1 ? "" : "s"}).`, problems);
      await notifyCatalogueChanged(dataset.id, t);
      await requestDoiSync(dataset.id, t);
    }
    await audit({ actorId: viewer.id, action: published ? "dataset.metadata.correct" : "review.metadata.correct", entityType: "dataset_version", entityId: version.id, datasetId: dataset.id, details: { before, after } }, t);
  });
  return reviewDetail(versionId, viewer);
}

export async function correctNetworkMetadata(versionId: number, networkId: number, viewer: Viewer, metadata: unknown): Promise<ReviewDetail> {
  await updateNetwork(versionId, networkId, viewer, { metadata }, true);
  return reviewDetail(versionId, viewer);
}
