/**
 * Which deposit versions a viewer may read or change now, and what every change of a deposit shares.
 * - Owner and curators see a version; everyone else gets 404 (drafts are never revealed).
 * - The owner edits a version in `draft` or `changes_requested`; submitted, published, declined and
 *   withdrawn versions are refused (409). Curators correct submissions through the reviews service
 *   (`loadCuratorEditable`).
 * - A change runs in one transaction (`tx`), locks its version and raises its lock version (`bump`).
 */
import type { Transaction } from "sequelize";
import type { VersionState } from "@shared/types/dataset";
import { ApiError } from "../../lib/api-error";
import { sequelize } from "../../db/sequelize";
import { hasRole } from "../../middlewares/require-role";
import { Dataset, DatasetVersion, Network } from "../../models";
import type { Viewer } from "../datasets/datasets.service";

export const OWNER_EDITABLE: VersionState[] = ["draft", "changes_requested"];
const MAX_METADATA_CHARS = 200_000;

/** Runs a change in one transaction (nothing half-written). */
export function tx<T>(fn: (t: Transaction) => Promise<T>): Promise<T> {
  return sequelize().transaction(fn);
}

/** Why a version in `state` cannot be edited (the 409's message). */
export function stateMessage(state: VersionState): string {
  switch (state) {
    case "submitted":
      return "This version is submitted and waits for a curator; it cannot be edited now.";
    case "published":
      return "Published versions cannot be changed; start a new version instead.";
    case "withdrawn":
      return "This version was withdrawn and cannot be changed.";
    case "declined":
      return "This version was declined and cannot be changed.";
    default:
      return `A ${state} version cannot be changed.`;
  }
}

/** Loads a version the viewer may see (owner or curator), else 404. */
export async function loadVisibleVersion(versionId: number, viewer: Viewer, t?: Transaction, lock = false): Promise<{ dataset: Dataset; version: DatasetVersion }> {
  if (!Number.isInteger(versionId) || versionId < 1) throw ApiError.notFound("No such deposit.");
  const version = await DatasetVersion.findByPk(versionId, { transaction: t, lock: lock && t ? t.LOCK.UPDATE : undefined });
  if (!version) throw ApiError.notFound("No such deposit.");
  const dataset = await Dataset.findByPk(version.datasetId, { transaction: t });
  if (!dataset) throw ApiError.notFound("No such deposit.");
  if (dataset.ownerId !== viewer.id && !hasRole(viewer, "curator")) throw ApiError.notFound("No such deposit.");
  return { dataset, version };
}

/** Loads a version its owner may edit now (locked for update inside `t`). */
export async function loadOwnEditable(versionId: number, viewer: Viewer, t: Transaction): Promise<{ dataset: Dataset; version: DatasetVersion }> {
  const r = await loadVisibleVersion(versionId, viewer, t, true);
  if (r.dataset.ownerId !== viewer.id) throw ApiError.forbidden("Only the depositor edits a deposit; curators correct metadata from the review page.");
  if (!OWNER_EDITABLE.includes(r.version.state)) throw ApiError.conflict(stateMessage(r.version.state), [{ path: "state", message: stateMessage(r.version.state) }]);
  return r;
}

/**
 * A version a curator may correct: a submission (submitted or changes requested), or with `published` also a
 * published version (its study metadata only: the caller keeps data and licence fixed).
 */
export async function loadCuratorEditable(versionId: number, viewer: Viewer, t: Transaction, opts: { published?: boolean } = {}): Promise<{ dataset: Dataset; version: DatasetVersion }> {
  if (!hasRole(viewer, "curator")) throw ApiError.forbidden("This needs the curator role.");
  const r = await loadVisibleVersion(versionId, viewer, t, true);
  if (r.dataset.ownerId === viewer.id) throw ApiError.forbidden("You cannot correct your own deposit as a curator; another curator reviews it (edit it yourself when changes are requested).");
  const states = opts.published ? ["submitted", "changes_requested", "published"] : ["submitted", "changes_requested"];
  if (!states.includes(r.version.state)) {
    throw ApiError.conflict(r.version.state === "draft" ? "Drafts are the depositor's until submitted." : stateMessage(r.version.state));
  }
  return r;
}

/** A network of the version, else 404. */
export async function loadNetworkOf(version: DatasetVersion, networkId: number, t?: Transaction): Promise<Network> {
  const n = await Network.findOne({ where: { id: networkId, versionId: version.id }, transaction: t });
  if (!n) throw ApiError.notFound("This deposit has no such network.");
  return n;
}

/** A metadata object from a request (study or network metadata), else 400; at most MAX_METADATA_CHARS of JSON. */
export function checkMetadataObject(meta: unknown, what: string): Record<string, unknown> {
  if (!meta || typeof meta !== "object" || Array.isArray(meta)) throw ApiError.badRequest(`${what} must be a JSON object.`, [{ path: "/metadata", message: `${what} must be a JSON object.` }]);
  if (JSON.stringify(meta).length > MAX_METADATA_CHARS) throw ApiError.badRequest(`${what} is too large.`, [{ path: "/metadata", message: `At most ${MAX_METADATA_CHARS} characters.` }]);
  return meta as Record<string, unknown>;
}

/** Raises a version's lock version with the change (its state, metadata, submission time). */
export async function bump(version: DatasetVersion, t: Transaction, changes: Partial<Pick<DatasetVersion, "metadata" | "state" | "submittedAt">> = {}): Promise<void> {
  await version.update({ ...changes, lockVersion: version.lockVersion + 1 }, { transaction: t });
}
