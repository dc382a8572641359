/**
 * Which dataset version a public address means, and who may see it. Published versions are public;
 * a withdrawn one answers 410 with its tombstone (accession, citation, reason); drafts, submissions and
 * declined versions exist only for their owner and curators (everyone else gets 404, as if absent).
 */
import { Op } from "sequelize";
import type { StudyMetadata } from "@shared/types/dataset";
import type { Tombstone } from "@shared/types/network-view";
import { formatCitationText } from "@shared/citation";
import { config } from "../../config/env";
import { ApiError, GoneError } from "../../lib/api-error";
import { hasRole } from "../../middlewares/require-role";
import { Dataset, DatasetVersion } from "../../models";
import { registeredVersionDoi } from "../../dois/dois";
import type { AuthUser } from "../../types";

export const ACCESSION_RE = /^TB-\d{6}$/;

export interface ResolvedVersion {
  dataset: Dataset;
  version: DatasetVersion;
  latestPublishedVersion: number | null;
}

/** Parses "v2" or "2" into 2; anything else is a 404 (the address does not exist). */
export function parseVersionParam(v: string): number {
  const m = /^v?(\d{1,6})$/.exec(v);
  if (!m || Number(m[1]) < 1) throw ApiError.notFound(`No version "${v}": versions are written v1, v2, …`);
  return Number(m[1]);
}

export function versionUrl(accession: string, version: number): string {
  return `${config().publicUrl}/datasets/${accession}/v/${version}`;
}

function yearOf(d: Date | null | undefined): number {
  return (d ?? new Date()).getUTCFullYear();
}

/** The text citation of a version; `doi` is its registered DOI (null while pending). */
export function citationFor(accession: string, version: DatasetVersion, doi: string | null = null): string {
  const md = version.metadata as unknown as StudyMetadata;
  return formatCitationText({
    metadata: { title: md.title ?? accession, creators: Array.isArray(md.creators) ? md.creators : [] },
    accession,
    version: version.number,
    year: yearOf(version.publishedAt),
    url: versionUrl(accession, version.number),
    doi,
  });
}

export async function tombstoneOf(accession: string, version: DatasetVersion): Promise<Tombstone> {
  const doi = await registeredVersionDoi(version.id);
  return {
    accession,
    version: version.number,
    doi,
    citation: citationFor(accession, version, doi),
    reason: version.withdrawalReason ?? "Withdrawn by a curator.",
    withdrawnAt: (version.withdrawnAt ?? version.updatedAt).toISOString(),
  };
}

export { GoneError };

function mayReadUnpublished(user: AuthUser | undefined, dataset: Dataset): boolean {
  return !!user && (user.id === dataset.ownerId || hasRole(user, "curator"));
}

/**
 * The version an address names: `versionNumber` undefined means the latest published one (when the
 * latest published-or-withdrawn version is withdrawn, its tombstone).
 */
export async function resolveVersion(accession: string, versionNumber: number | undefined, user: AuthUser | undefined): Promise<ResolvedVersion> {
  if (!ACCESSION_RE.test(accession)) throw ApiError.notFound(`No dataset "${accession}": accessions look like TB-000042.`);
  const dataset = await Dataset.findOne({ where: { accession } });
  if (!dataset) throw ApiError.notFound(`No dataset ${accession}.`);
  const latestPublished = (await DatasetVersion.max("number", { where: { datasetId: dataset.id, state: "published" } })) as number | null;
  let version: DatasetVersion | null;
  if (versionNumber === undefined) {
    version = await DatasetVersion.findOne({
      where: { datasetId: dataset.id, state: { [Op.in]: ["published", "withdrawn"] } },
      order: [["number", "DESC"]],
    });
    if (version?.state === "withdrawn" && latestPublished) {
      // an older published version is still live: show that one
      version = await DatasetVersion.findOne({ where: { datasetId: dataset.id, number: latestPublished } });
    }
  } else {
    version = await DatasetVersion.findOne({ where: { datasetId: dataset.id, number: versionNumber } });
  }
  if (!version) throw ApiError.notFound(`No published version of ${accession}${versionNumber ? ` numbered ${versionNumber}` : ""}.`);
  if (version.state === "withdrawn") throw new GoneError(await tombstoneOf(accession, version));
  if (version.state !== "published" && !mayReadUnpublished(user, dataset)) {
    throw ApiError.notFound(`No published version of ${accession} numbered ${version.number}.`);
  }
  return { dataset, version, latestPublishedVersion: latestPublished ?? null };
}
