/**
 * Starting a new version of a published dataset (POST /api/v1/datasets/:accession/versions): the owner gets
 * a draft v(n+1) copied from the latest published version, which then goes through the deposit workflow.
 */
import { sequelize } from "../../db/sequelize";
import { ApiError } from "../../lib/api-error";
import { audit } from "../../lib/audit";
import { hasRole } from "../../middlewares/require-role";
import { Dataset, DatasetVersion } from "../../models";
import { depositDetail, type DepositDetail } from "../deposits/deposits.detail";
import type { Viewer } from "./datasets.service";

/** Owner starts v(n+1) as a draft copied from the latest published version (files shared). */
export async function startNewVersion(accession: string, viewer: Viewer): Promise<DepositDetail> {
  const { dataset, version } = await sequelize().transaction(async (t) => {
    const dataset = await Dataset.findOne({ where: { accession }, transaction: t, lock: t.LOCK.UPDATE });
    if (!dataset || (dataset.ownerId !== viewer.id && !hasRole(viewer, "curator"))) throw ApiError.notFound(`No dataset ${accession}.`);
    if (dataset.ownerId !== viewer.id) throw ApiError.forbidden("Only the depositor of a dataset starts a new version of it.");
    const versions = await DatasetVersion.findAll({ where: { datasetId: dataset.id }, order: [["number", "ASC"]], transaction: t });
    const open = versions.find((v) => ["draft", "submitted", "changes_requested"].includes(v.state));
    if (open) throw ApiError.conflict(`Version ${open.number} is still open (${open.state.replace("_", " ")}); finish or delete it first.`, [{ path: "versionId", message: String(open.id) }]);
    const latest = [...versions].reverse().find((v) => v.state === "published");
    if (!latest) throw ApiError.conflict("Only a published dataset gets new versions.");
    const number = versions[versions.length - 1].number + 1;
    const version = await DatasetVersion.create({ datasetId: dataset.id, number, state: "draft", metadata: latest.metadata }, { transaction: t });
    await sequelize().query(
      `INSERT INTO networks (version_id, position, file_id, original_name, format, kind, directed, weighted, metadata, canonical,
         n_nodes, n_rows, n_cols, n_links, total_weight, connectance, parse_warnings, read_options, created_at, updated_at)
       SELECT :newId, position, file_id, original_name, format, kind, directed, weighted, metadata, canonical,
         n_nodes, n_rows, n_cols, n_links, total_weight, connectance, parse_warnings, read_options, now(), now()
         FROM networks WHERE version_id = :oldId ORDER BY position`,
      { replacements: { newId: version.id, oldId: latest.id }, transaction: t },
    );
    await audit({ actorId: viewer.id, action: "version.create", entityType: "dataset_version", entityId: version.id, datasetId: dataset.id, details: { number, copiedFrom: latest.number } }, t);
    return { dataset, version };
  });
  return depositDetail(dataset, version, viewer);
}
