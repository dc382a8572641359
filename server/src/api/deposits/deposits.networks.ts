/**
 * The networks of a deposit: adding parsed files to an editable version (all or nothing, in ONE
 * transaction: the file bytes with SHA-256, deduplicated, and the network with its canonical form; a
 * failure stores nothing), changing a network's metadata or how its file is read (then the stored
 * original is parsed again), reordering and deleting networks, and a network's original file and
 * canonical form for the owner and curators.
 */
import type { Transaction } from "sequelize";
import { ApiError } from "../../lib/api-error";
import { audit } from "../../lib/audit";
import { sequelize } from "../../db/sequelize";
import { Network, StoredFile } from "../../models";
import type { NetworkReadOptions } from "../../models/network.model";
import type { Viewer } from "../datasets/datasets.service";
import { bytesOf, type UploadedFile } from "./deposits.upload";
import { DIRECTED_NEEDS_ONE_MODE } from "./deposits.schemas";
import { bump, checkMetadataObject, loadCuratorEditable, loadNetworkOf, loadOwnEditable, loadVisibleVersion, OWNER_EDITABLE, stateMessage, tx } from "./deposits.access";
import { depositDetail, getDeposit, type DepositDetail } from "./deposits.detail";
import { deleteOrphanFiles, networkColumns, parseUploads, storeFile, withMissingValues, withMissingValuesOf, type UploadOptions } from "./deposits.files";

/** Who may upload to a version now: its owner while it is editable (404 for others who may not see it). */
export async function assertUploadTarget(versionId: number, viewer: Viewer): Promise<void> {
  const pre = await loadVisibleVersion(versionId, viewer);
  if (pre.dataset.ownerId !== viewer.id) throw ApiError.forbidden("Only the depositor uploads files to a deposit.");
  if (!OWNER_EDITABLE.includes(pre.version.state)) throw ApiError.conflict(stateMessage(pre.version.state));
}

/** Adds parsed network files to an editable version, all or nothing. */
export async function addNetworks(versionId: number, viewer: Viewer, files: UploadedFile[], opts: UploadOptions): Promise<{ networks: Array<{ id: number; position: number; originalName: string }>; deposit: DepositDetail }> {
  // Visibility and state first, so a refused upload is not parsed for nothing.
  await assertUploadTarget(versionId, viewer);
  const parsed = await parseUploads(files, opts);
  const bytes = await Promise.all(parsed.map((p) => bytesOf(p.file)));
  const created = await tx(async (t) => {
    const { dataset, version } = await loadOwnEditable(versionId, viewer, t);
    const maxPos = ((await Network.max("position", { where: { versionId: version.id }, transaction: t })) as number | null) ?? 0;
    const out: Network[] = [];
    let pos = maxPos;
    for (const [i, p] of parsed.entries()) {
      const fileId = await storeFile(bytes[i], p.sha256, t);
      pos += 1;
      const n = await Network.create(
        {
          versionId: version.id,
          position: pos,
          fileId,
          originalName: p.file.name,
          metadata: withMissingValues({ name: p.parsed.workbook && p.parsed.workbook.sheets.length > 1 ? p.parsed.workbook.sheet : p.file.name.replace(/\.(csv|tsv|txt|xlsx)$/i, "") }, p),
          ...networkColumns(p),
        },
        { transaction: t },
      );
      out.push(n);
    }
    await bump(version, t);
    await audit({ actorId: viewer.id, action: "deposit.network.add", entityType: "dataset_version", entityId: version.id, datasetId: dataset.id, details: { files: parsed.map((p, i) => ({ name: p.file.name, sha256: p.sha256, position: out[i].position })) } }, t);
    return out;
  });
  return { networks: created.map((n) => ({ id: n.id, position: n.position, originalName: n.originalName })), deposit: await getDeposit(versionId, viewer) };
}

/**
 * Changes a network's metadata, and/or how its file is read (kind, directed, format): then the stored
 * original is parsed again and the canonical form replaced.
 */
export async function updateNetwork(
  versionId: number,
  networkId: number,
  viewer: Viewer,
  changes: { metadata?: unknown; kind?: UploadOptions["kind"]; directed?: boolean; format?: UploadOptions["format"]; read?: NetworkReadOptions },
  asCurator = false,
): Promise<DepositDetail> {
  const meta = changes.metadata !== undefined ? checkMetadataObject(changes.metadata, "Network metadata") : undefined;
  const reparse = changes.kind !== undefined || changes.directed !== undefined || changes.format !== undefined || changes.read !== undefined;
  if (asCurator && reparse) throw ApiError.badRequest("Curators correct metadata only; ask the depositor to change how a file is read.");
  const { dataset, version } = await tx(async (t) => {
    const r = asCurator ? await loadCuratorEditable(versionId, viewer, t) : await loadOwnEditable(versionId, viewer, t);
    const net = await loadNetworkOf(r.version, networkId, t);
    const before = net.metadata;
    const update: Record<string, unknown> = {};
    // `missingValues` records what the parser was told about the file's cells: it follows the file, not the form.
    if (meta) update.metadata = withMissingValuesOf(meta, net.metadata ?? {});
    if (reparse) {
      const file = await StoredFile.unscoped().findByPk(net.fileId, { transaction: t });
      if (!file) throw ApiError.notFound("The stored file is missing.");
      const kind = changes.kind ?? net.kind;
      // A one-mode network made bipartite loses its direction; asking a bipartite one for a direction is refused.
      if (kind === "bipartite" && changes.directed === true) throw ApiError.badRequest(DIRECTED_NEEDS_ONE_MODE, [{ path: "/directed", message: DIRECTED_NEEDS_ONE_MODE }]);
      const directed = kind === "bipartite" ? false : (changes.directed ?? net.directed);
      const read = { ...(net.readOptions ?? {}), ...changes.read };
      const [p] = await parseUploads([{ name: net.originalName, bytes: file.bytes }], { kind, directed, format: changes.format ?? net.format, read });
      Object.assign(update, networkColumns(p));
      update.metadata = withMissingValues((update.metadata as Record<string, unknown> | undefined) ?? net.metadata ?? {}, p);
    }
    await net.update(update, { transaction: t });
    await bump(r.version, t);
    await audit(
      {
        actorId: viewer.id,
        action: asCurator ? "review.network.correct" : "deposit.network.update",
        entityType: "network",
        entityId: net.id,
        datasetId: r.dataset.id,
        details: { versionId: r.version.id, position: net.position, ...(asCurator && meta ? { before, after: meta } : {}), ...(reparse ? { reparsed: { kind: changes.kind, directed: changes.directed, format: changes.format } } : {}) },
      },
      t,
    );
    return r;
  });
  return depositDetail(dataset, version, viewer);
}

export async function deleteNetwork(versionId: number, networkId: number, viewer: Viewer): Promise<DepositDetail> {
  const { dataset, version } = await tx(async (t) => {
    const r = await loadOwnEditable(versionId, viewer, t);
    const net = await loadNetworkOf(r.version, networkId, t);
    await net.destroy({ transaction: t });
    await deleteOrphanFiles([net.fileId], t);
    await renumber(r.version.id, t);
    await bump(r.version, t);
    await audit({ actorId: viewer.id, action: "deposit.network.delete", entityType: "dataset_version", entityId: r.version.id, datasetId: r.dataset.id, details: { networkId: net.id, originalName: net.originalName } }, t);
    return r;
  });
  return depositDetail(dataset, version, viewer);
}

/** Positions 1..n in the given order (ids), or in the current order. Two passes avoid the unique (version, position) clash. */
async function renumber(versionId: number, t: Transaction, order?: number[]): Promise<void> {
  const nets = await Network.findAll({ where: { versionId }, order: [["position", "ASC"]], transaction: t });
  const ids = order ?? nets.map((n) => n.id);
  await sequelize().query(`UPDATE networks SET position = position + 100000 WHERE version_id = :versionId`, { replacements: { versionId }, transaction: t });
  for (let i = 0; i < ids.length; i++) {
    await sequelize().query(`UPDATE networks SET position = :pos WHERE id = :id AND version_id = :versionId`, { replacements: { pos: i + 1, id: ids[i], versionId }, transaction: t });
  }
}

export async function reorderNetworks(versionId: number, viewer: Viewer, order: unknown): Promise<DepositDetail> {
  const { dataset, version } = await tx(async (t) => {
    const r = await loadOwnEditable(versionId, viewer, t);
    const nets = await Network.findAll({ where: { versionId: r.version.id }, transaction: t });
    const ids = nets.map((n) => n.id).sort((a, b) => a - b);
    const given = Array.isArray(order) ? order.map(Number) : [];
    if (given.length !== ids.length || [...given].sort((a, b) => a - b).some((id, i) => id !== ids[i])) {
      throw ApiError.badRequest("The order must list every network of the deposit exactly once.", [{ path: "/order", message: `Expected a permutation of [${ids.join(", ")}].` }]);
    }
    await renumber(r.version.id, t, given);
    await bump(r.version, t);
    await audit({ actorId: viewer.id, action: "deposit.network.reorder", entityType: "dataset_version", entityId: r.version.id, datasetId: r.dataset.id, details: { order: given } }, t);
    return r;
  });
  return depositDetail(dataset, version, viewer);
}

/** The original file of a network of a version the viewer may see. */
export async function getDepositNetworkFile(versionId: number, networkId: number, viewer: Viewer): Promise<{ name: string; bytes: Buffer; sha256: string }> {
  const { version } = await loadVisibleVersion(versionId, viewer);
  const net = await loadNetworkOf(version, networkId);
  const file = await StoredFile.unscoped().findByPk(net.fileId);
  if (!file) throw ApiError.notFound("The stored file is missing.");
  return { name: net.originalName, bytes: file.bytes, sha256: file.sha256 };
}

/** The canonical parsed form of a network (for previews). */
export async function getDepositNetworkCanonical(versionId: number, networkId: number, viewer: Viewer): Promise<unknown> {
  const { version } = await loadVisibleVersion(versionId, viewer);
  const net = await Network.unscoped().findOne({ where: { id: networkId, versionId: version.id }, attributes: ["id", "canonical"] });
  if (!net) throw ApiError.notFound("This deposit has no such network.");
  return net.canonical;
}
