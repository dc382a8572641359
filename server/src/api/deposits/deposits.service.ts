/**
 * Deposits: a depositor's drafts and submissions. This file holds the draft's life: a new dataset with its
 * first draft, the depositor's list of deposits, the study metadata, and deleting a draft. The rest of a
 * deposit lives beside it:
 * - deposits.access.ts: who may read or change a version now (owner, curators; the editable states), and
 *   what every change shares (one transaction, the lock version, the metadata size check);
 * - deposits.detail.ts: the deposit page's answer (detail, findings, decisions);
 * - deposits.files.ts and deposits.upload.ts: reading uploaded files (parse processes) and storing them;
 * - deposits.networks.ts: adding, re-reading, reordering and deleting networks, their files for viewers;
 * - deposits.metadata.ts and deposits.sheet.ts: network metadata of the whole deposit (sheet, blocks);
 * - deposits.submission.ts: full validation, submission and its e-mails (deposits.snapshots.ts records it);
 * - deposits.comments.ts: the conversation on a submission.
 * Rules: drafts save as you go (study and network metadata may be partial; full schema validation and the
 * cross-field rules happen at submission); every change writes an audit row in the same transaction;
 * versions are visible only to owner and curators (404).
 */
import { Op, QueryTypes } from "sequelize";
import { audit } from "../../lib/audit";
import { withNormalisedDoi } from "@shared/validation/doi";
import { sequelize } from "../../db/sequelize";
import { Dataset, DatasetVersion, Network, Review } from "../../models";
import type { Viewer } from "../datasets/datasets.service";
import { ApiError } from "../../lib/api-error";
import { bump, checkMetadataObject, loadOwnEditable, loadVisibleVersion, tx } from "./deposits.access";
import { depositDetail, type DepositDetail, type DepositListItem } from "./deposits.detail";
import { deleteOrphanFiles } from "./deposits.files";

/** Creates a dataset with its first version as a draft (metadata may be partial). */
export async function createDeposit(viewer: Viewer, metadata: unknown = {}): Promise<DepositDetail> {
  const meta = withNormalisedDoi(checkMetadataObject(metadata ?? {}, "Study metadata"));
  const { dataset, version } = await tx(async (t) => {
    const dataset = await Dataset.create({ ownerId: viewer.id }, { transaction: t });
    const version = await DatasetVersion.create({ datasetId: dataset.id, number: 1, state: "draft", metadata: meta }, { transaction: t });
    await audit({ actorId: viewer.id, action: "deposit.create", entityType: "dataset_version", entityId: version.id, datasetId: dataset.id, details: { number: 1 } }, t);
    return { dataset, version };
  });
  return depositDetail(dataset, version, viewer);
}

export async function listMyDeposits(viewer: Viewer): Promise<DepositListItem[]> {
  const datasets = await Dataset.findAll({ where: { ownerId: viewer.id }, order: [["id", "DESC"]] });
  if (!datasets.length) return [];
  const versions = await DatasetVersion.findAll({ where: { datasetId: { [Op.in]: datasets.map((d) => d.id) } }, order: [["number", "ASC"]] });
  const counts = (await sequelize().query<{ version_id: number; n: string }>(
    `SELECT version_id, count(*) AS n FROM networks WHERE version_id IN (:ids) GROUP BY version_id`,
    { replacements: { ids: versions.map((v) => v.id) }, type: QueryTypes.SELECT },
  )) as Array<{ version_id: number; n: string }>;
  const countOf = new Map(counts.map((c) => [Number(c.version_id), Number(c.n)]));
  const reviews = await Review.findAll({ where: { versionId: { [Op.in]: versions.map((v) => v.id) } }, order: [["id", "ASC"]] });
  const lastReview = new Map<number, Review>();
  for (const r of reviews) lastReview.set(r.versionId, r);
  const out: DepositListItem[] = [];
  for (const d of datasets) {
    const vs = versions.filter((v) => v.datasetId === d.id);
    const open = vs.some((v) => ["draft", "submitted", "changes_requested"].includes(v.state));
    const latestPublished = [...vs].reverse().find((v) => v.state === "published");
    for (const v of [...vs].reverse()) {
      const r = lastReview.get(v.id);
      out.push({
        versionId: v.id,
        datasetId: d.id,
        accession: d.accession ?? null,
        number: v.number,
        state: v.state,
        title: typeof v.metadata?.title === "string" && v.metadata.title ? (v.metadata.title as string) : "(untitled draft)",
        networkCount: countOf.get(v.id) ?? 0,
        updatedAt: new Date(v.updatedAt).toISOString(),
        submittedAt: v.submittedAt ? new Date(v.submittedAt).toISOString() : null,
        publishedAt: v.publishedAt ? new Date(v.publishedAt).toISOString() : null,
        lastReview: r ? { decision: r.decision, comment: r.comment ?? null, at: new Date(r.createdAt).toISOString() } : null,
        canStartNewVersion: !open && latestPublished?.id === v.id,
      });
    }
  }
  return out;
}

export async function updateStudyMetadata(versionId: number, viewer: Viewer, metadata: unknown): Promise<DepositDetail> {
  const meta = withNormalisedDoi(checkMetadataObject(metadata, "Study metadata"));
  const { dataset, version } = await tx(async (t) => {
    const r = await loadOwnEditable(versionId, viewer, t);
    await bump(r.version, t, { metadata: meta });
    await audit({ actorId: viewer.id, action: "deposit.metadata.update", entityType: "dataset_version", entityId: r.version.id, datasetId: r.dataset.id }, t);
    return r;
  });
  return depositDetail(dataset, version, viewer);
}

/** Deletes a draft (only in state draft). Deleting v1 deletes the dataset. */
export async function deleteDraft(versionId: number, viewer: Viewer): Promise<void> {
  await tx(async (t) => {
    const r = await loadVisibleVersion(versionId, viewer, t, true);
    if (r.dataset.ownerId !== viewer.id) throw ApiError.forbidden("Only the depositor may delete a draft.");
    if (r.version.state !== "draft") throw ApiError.conflict(`Only drafts can be deleted; this version is ${r.version.state.replace("_", " ")}.`);
    const nets = await Network.findAll({ where: { versionId: r.version.id }, transaction: t });
    const others = await DatasetVersion.count({ where: { datasetId: r.dataset.id, id: { [Op.ne]: r.version.id } }, transaction: t });
    await audit({ actorId: viewer.id, action: "deposit.delete", entityType: "dataset_version", entityId: r.version.id, datasetId: others ? r.dataset.id : null, details: { datasetId: r.dataset.id, number: r.version.number, title: r.version.metadata?.title ?? null } }, t);
    await r.version.destroy({ transaction: t });
    if (!others) await r.dataset.destroy({ transaction: t });
    await deleteOrphanFiles(nets.map((n) => n.fileId), t);
  });
}
