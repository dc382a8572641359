/**
 * Withdrawing a dataset (POST /api/v1/datasets/:accession/withdraw): every published version becomes a
 * tombstone with the curator's reason, the catalogue drops it, its DOIs keep resolving (to the tombstone)
 * and the depositor is told by e-mail.
 */
import { Op } from "sequelize";
import { sequelize } from "../../db/sequelize";
import { ApiError } from "../../lib/api-error";
import { audit } from "../../lib/audit";
import { Dataset, DatasetVersion } from "../../models";
import { requestDoiSync } from "../../dois/dois";
import { notifyCatalogueChanged } from "../catalogue/catalogue.events";
import { mailDepositor } from "../reviews/reviews.service";
import type { Viewer } from "./datasets.service";

/** Withdraws every published version of a dataset (curator or admin; the reason, checked by the route, is not blank). */
export async function withdrawDataset(accession: string, viewer: Viewer, reasonText: string): Promise<{ accession: string; reason: string; withdrawnAt: string }> {
  const reason = reasonText.trim();
  const result = await sequelize().transaction(async (t) => {
    const dataset = await Dataset.findOne({ where: { accession }, transaction: t, lock: t.LOCK.UPDATE });
    if (!dataset) throw ApiError.notFound(`No dataset ${accession}.`);
    const published = await DatasetVersion.findAll({ where: { datasetId: dataset.id, state: "published" }, transaction: t });
    if (!published.length) throw ApiError.conflict(`${accession} has no published version to withdraw.`);
    const at = new Date();
    await DatasetVersion.update(
      { state: "withdrawn", withdrawnAt: at, withdrawalReason: reason, lockVersion: sequelize().literal("lock_version + 1") as unknown as number },
      { where: { id: { [Op.in]: published.map((v) => v.id) } }, transaction: t },
    );
    await notifyCatalogueChanged(dataset.id, t);
    // the DOIs stay and keep resolving (to the tombstone); their metadata says the version was withdrawn
    await requestDoiSync(dataset.id, t);
    await audit({ actorId: viewer.id, action: "dataset.withdraw", entityType: "dataset", entityId: dataset.id, datasetId: dataset.id, details: { accession, reason, versions: published.map((v) => v.number) } }, t);
    return { dataset, latest: published.sort((a, b) => b.number - a.number)[0], at };
  });
  await mailDepositor("withdraw", result.dataset, result.latest, reason);
  return { accession, reason, withdrawnAt: result.at.toISOString() };
}
