/**
 * Reading datasets: the `DatasetDetail` of a version (shared/types/dataset.ts) as a given viewer may see
 * it, the published read API by accession, tombstones of withdrawn datasets and original network files.
 *
 * Visibility: published versions are public; drafts, submissions, change requests and declined versions
 * only to their owner and curators (404 for anyone else). The public get generalised coordinates
 * (server/src/lib/public-locality.ts) and never the contact e-mail; owner, curators and admins see both.
 */
import { Op } from "sequelize";
import type { DatasetDetail, NetworkMetadata, NetworkSummary, StudyMetadata, VersionState, VersionSummary } from "@shared/types/dataset";
import { publicLocality } from "../../lib/public-locality";
import { ApiError, GoneError } from "../../lib/api-error";
import { tombstoneOf } from "../datasets/datasets.access";
import { hasRole } from "../../middlewares/require-role";
import { Dataset, DatasetVersion, Network, StoredFile, User } from "../../models";
import { getCurrentMetrics } from "../../pipeline/metrics-read";
import { doisOfDataset } from "../../dois/dois";
import { verifiedOrcids } from "../auth/orcid.service";

export interface Viewer {
  id: number;
  role: "depositor" | "curator" | "admin";
}

export const PUBLIC_STATES: VersionState[] = ["published"];

/** Owner, curators and admins see everything of a dataset (exact coordinates, contact e-mail, drafts). */
export function isPrivileged(viewer: Viewer | undefined, dataset: Dataset): boolean {
  return !!viewer && (viewer.id === dataset.ownerId || hasRole(viewer, "curator"));
}

export function networkRef(accession: string | null, versionNumber: number, position: number, state: VersionState): string | null {
  return accession && (state === "published" || state === "withdrawn") ? `${accession}/v${versionNumber}/${position}` : null;
}

function iso(d: Date | null | undefined): string | null {
  return d ? new Date(d).toISOString() : null;
}

export function versionSummary(v: DatasetVersion, networkCount: number): VersionSummary {
  return {
    number: v.number,
    state: v.state,
    submittedAt: iso(v.submittedAt),
    publishedAt: iso(v.publishedAt),
    withdrawnAt: iso(v.withdrawnAt),
    networkCount,
  };
}

/** The study metadata as this viewer may see it. */
export function viewStudyMetadata(meta: Record<string, unknown>, privileged: boolean): StudyMetadata {
  if (privileged) return meta as unknown as StudyMetadata;
  const { contactEmail: _omit, ...rest } = meta;
  void _omit;
  return rest as unknown as StudyMetadata;
}

export function viewNetworkMetadata(meta: Record<string, unknown>, privileged: boolean): NetworkMetadata {
  if (privileged || meta.locality === undefined || meta.locality === null) return meta as unknown as NetworkMetadata;
  return { ...meta, locality: publicLocality(meta.locality as NetworkMetadata["locality"]) } as unknown as NetworkMetadata;
}

/** Builds the DatasetDetail of one version for a viewer (visibility must be checked by the caller). */
export async function buildDatasetDetail(dataset: Dataset, version: DatasetVersion, viewer: Viewer | undefined, opts: { metrics?: boolean } = {}): Promise<DatasetDetail> {
  const privileged = isPrivileged(viewer, dataset);
  const [owner, allVersions, networks] = await Promise.all([
    User.findByPk(dataset.ownerId, { attributes: ["id", "displayName"] }),
    DatasetVersion.findAll({ where: { datasetId: dataset.id }, order: [["number", "ASC"]] }),
    Network.findAll({ where: { versionId: version.id }, order: [["position", "ASC"]], include: [{ model: StoredFile, as: "file", attributes: ["id", "sha256", "size"] }] }),
  ]);
  const visibleVersions = allVersions.filter((v) => privileged || v.state === "published" || v.state === "withdrawn");
  const counts = new Map<number, number>();
  if (visibleVersions.length) {
    const rows = (await Network.count({ where: { versionId: { [Op.in]: visibleVersions.map((v) => v.id) } }, group: ["version_id"] })) as unknown as Array<{ version_id?: number; versionId?: number; count: number | string }>;
    for (const r of rows) counts.set(Number(r.version_id ?? r.versionId), Number(r.count));
  }
  const metrics = opts.metrics !== false && (version.state === "published" || version.state === "withdrawn") ? await getCurrentMetrics(networks.map((n) => n.id), { showErrors: viewer?.role === "curator" || viewer?.role === "admin" }) : new Map();
  const published = allVersions.filter((v) => v.state === "published");
  const netSummaries: NetworkSummary[] = networks.map((n) => {
    const file = (n as Network & { file?: StoredFile }).file;
    return {
      id: n.id,
      ref: networkRef(dataset.accession ?? null, version.number, n.position, version.state),
      position: n.position,
      originalName: n.originalName,
      format: n.format,
      kind: n.kind,
      directed: n.directed,
      weighted: n.weighted,
      nNodes: n.nNodes,
      nRows: n.nRows,
      nCols: n.nCols,
      nLinks: n.nLinks,
      totalWeight: n.totalWeight,
      connectance: n.connectance,
      sha256: file?.sha256 ?? "",
      size: file?.size ?? 0,
      metadata: viewNetworkMetadata(n.metadata ?? {}, privileged),
      warnings: ((n.parseWarnings ?? []) as Array<{ code: string; message: string; row?: number | null; column?: number | null }>).map((w) => ({
        code: w.code,
        message: w.message,
        ...(w.row != null ? { row: w.row } : {}),
        ...(w.column != null ? { column: w.column } : {}),
      })),
      metrics: metrics.get(n.id) ?? null,
    };
  });
  const dois = await doisOfDataset(dataset.id);
  const creators = ((version.metadata as Partial<StudyMetadata> | null)?.creators ?? []) as StudyMetadata["creators"];
  const verified = await verifiedOrcids(Array.isArray(creators) ? creators.map((c) => c?.orcid ?? "").filter(Boolean) : []);
  const withdrawal = version.state === "withdrawn" ? { at: iso(version.withdrawnAt) ?? "", reason: version.withdrawalReason ?? "" } : null;
  return {
    id: dataset.id,
    accession: dataset.accession ?? null,
    version: versionSummary(version, networks.length),
    latestPublishedVersion: published.length ? published[published.length - 1].number : null,
    owner: { id: owner?.id ?? dataset.ownerId, displayName: owner?.displayName ?? "" },
    metadata: viewStudyMetadata(version.metadata ?? {}, privileged),
    versions: visibleVersions.map((v) => versionSummary(v, counts.get(v.id) ?? 0)),
    networks: netSummaries,
    withdrawal,
    dois: { version: dois.versions.get(version.number) ?? null, concept: dois.concept },
    verifiedOrcids: [...verified],
  };
}

const ACCESSION = /^TB-\d{6}$/;

/**
 * The published version of a dataset by accession: the latest, or version `number`. 404 for an unknown
 * accession or an unpublished version; 410 with the tombstone when the version (or the whole dataset) was
 * withdrawn.
 */
export async function findPublishedVersion(accession: string, number?: number): Promise<{ dataset: Dataset; version: DatasetVersion }> {
  if (!ACCESSION.test(accession)) throw ApiError.notFound(`No dataset ${accession}: accessions look like TB-000042.`);
  const dataset = await Dataset.findOne({ where: { accession } });
  if (!dataset) throw ApiError.notFound(`No dataset ${accession}.`);
  const versions = await DatasetVersion.findAll({ where: { datasetId: dataset.id, state: { [Op.in]: ["published", "withdrawn"] } }, order: [["number", "ASC"]] });
  if (number !== undefined) {
    const v = versions.find((x) => x.number === number);
    if (!v) throw ApiError.notFound(`${accession} has no published version ${number}.`);
    if (v.state === "withdrawn") throw new GoneError(await tombstoneOf(accession, v));
    return { dataset, version: v };
  }
  const published = versions.filter((v) => v.state === "published");
  if (published.length) return { dataset, version: published[published.length - 1] };
  const withdrawn = versions.filter((v) => v.state === "withdrawn");
  if (withdrawn.length) throw new GoneError(await tombstoneOf(accession, withdrawn[withdrawn.length - 1]));
  throw ApiError.notFound(`No dataset ${accession}.`);
}

export async function getPublishedDetail(accession: string, number: number | undefined, viewer: Viewer | undefined): Promise<DatasetDetail> {
  const { dataset, version } = await findPublishedVersion(accession, number);
  return buildDatasetDetail(dataset, version, viewer);
}

/** The original bytes of a published network, with its original name. */
export async function getPublishedNetworkFile(accession: string, number: number, position: number): Promise<{ name: string; bytes: Buffer; sha256: string }> {
  const { version } = await findPublishedVersion(accession, number);
  const net = await Network.findOne({ where: { versionId: version.id, position } });
  if (!net) throw ApiError.notFound(`${accession}/v${number} has no network ${position}.`);
  const file = await StoredFile.unscoped().findByPk(net.fileId);
  if (!file) throw ApiError.notFound("The file is missing.");
  return { name: net.originalName, bytes: file.bytes, sha256: file.sha256 };
}
