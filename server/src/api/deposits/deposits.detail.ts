/**
 * What the deposit page shows of a version: the dataset's detail (datasets service), its networks'
 * findings against the metadata schemas (saved drafts may be partial; submission refuses any finding),
 * and the curators' decisions.
 */
import { Network, Review, User, type Dataset, type DatasetVersion } from "../../models";
import { networkFindings, studyFindings } from "../../lib/schemas";
import { buildDatasetDetail, type Viewer } from "../datasets/datasets.service";
import { loadVisibleVersion, OWNER_EDITABLE } from "./deposits.access";

export type { DepositDetail, DepositListItem } from "@shared/types/deposit";
import type { DepositDetail } from "@shared/types/deposit";

export function findingsOf(version: DatasetVersion, networks: Network[]): DepositDetail["findings"] {
  return {
    study: studyFindings(version.metadata ?? {}),
    networks: networks.map((n) => ({ networkId: n.id, position: n.position, findings: networkFindings(n.metadata ?? {}, { kind: n.kind, directed: n.directed }) })),
  };
}

export async function depositDetail(dataset: Dataset, version: DatasetVersion, viewer: Viewer): Promise<DepositDetail> {
  const detail = await buildDatasetDetail(dataset, version, viewer);
  const [networks, reviews] = await Promise.all([
    Network.findAll({ where: { versionId: version.id }, order: [["position", "ASC"]] }),
    Review.findAll({ where: { versionId: version.id }, order: [["createdAt", "ASC"]], include: [{ model: User, as: "curator", attributes: ["displayName"] }] }),
  ]);
  return {
    ...detail,
    versionId: version.id,
    lockVersion: version.lockVersion,
    updatedAt: new Date(version.updatedAt).toISOString(),
    editable: dataset.ownerId === viewer.id && OWNER_EDITABLE.includes(version.state),
    findings: findingsOf(version, networks),
    reviews: reviews.map((r) => ({
      id: r.id,
      decision: r.decision,
      comment: r.comment ?? null,
      curator: (r as Review & { curator?: User }).curator?.displayName ?? "",
      at: new Date(r.createdAt).toISOString(),
    })),
  };
}

export async function getDeposit(versionId: number, viewer: Viewer): Promise<DepositDetail> {
  const { dataset, version } = await loadVisibleVersion(versionId, viewer);
  return depositDetail(dataset, version, viewer);
}
