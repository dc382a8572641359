/**
 * Deposits: a depositor's drafts and submissions. Rules:
 * - The owner edits a version in `draft` or `changes_requested`; submitted, published, declined and
 *   withdrawn versions are refused (409). Curators correct submissions through the reviews service.
 * - Drafts save as you go: study and network metadata may be partial; full schema validation (and the
 *   cross-field rules) happen at submission, with every problem listed per field and per network.
 * - An upload is parsed in a parse thread (the engine's parser, lib/parse/pool.ts), then stored in ONE transaction: the file
 *   bytes with SHA-256 (deduplicated), the network with its canonical form. A failure stores nothing.
 * - Every change writes an audit row in the same transaction; visible only to owner and curators (404).
 */
import { Op, QueryTypes, type Transaction } from "sequelize";
import type { BasicMetrics } from "@shared/network";
import type { CanonicalNetworkJson } from "@shared/network/parse/serialize";
import { parseInThread } from "../../lib/parse/pool";
import type { ParsedFile } from "../../lib/parse/task";
import type { VersionState } from "@shared/types/dataset";
import { ApiError, type ErrorDetail } from "../../lib/api-error";
import { audit } from "../../lib/audit";
import { networkFindings, studyFindings } from "../../lib/schemas";
import { withNormalisedDoi } from "@shared/validation/doi";
import { sequelize } from "../../db/sequelize";
import { config } from "../../config/env";
import { logger } from "../../lib/logger";
import { hasRole } from "../../middlewares/require-role";
import { Dataset, DatasetVersion, Network, Review, StoredFile, SubmissionComment, User } from "../../models";
import type { NetworkReadOptions } from "../../models/network.model";
import { sendMail } from "../../emails/mailer";
import { reviewSubmittedEmail } from "../../emails/templates/review-submitted";
import { depositReceiptEmail } from "../../emails/templates/deposit-receipt";
import { buildDatasetDetail, type Viewer } from "../datasets/datasets.service";
import { bytesOf, type UploadedFile } from "./deposits.upload";
import { cellOf, readSheet, writeSheet } from "./deposits.sheet";
import { recordSubmission } from "./deposits.snapshots";

export const OWNER_EDITABLE: VersionState[] = ["draft", "changes_requested"];
const MAX_METADATA_CHARS = 200_000;

export type { DepositDetail, DepositListItem } from "@shared/types/deposit";
import type { DepositDetail, DepositListItem } from "@shared/types/deposit";

function tx<T>(fn: (t: Transaction) => Promise<T>): Promise<T> {
  return sequelize().transaction(fn);
}

function stateMessage(state: VersionState): string {
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
async function loadOwnEditable(versionId: number, viewer: Viewer, t: Transaction): Promise<{ dataset: Dataset; version: DatasetVersion }> {
  const r = await loadVisibleVersion(versionId, viewer, t, true);
  if (r.dataset.ownerId !== viewer.id) throw ApiError.forbidden("Only the depositor edits a deposit; curators correct metadata from the review page.");
  if (!OWNER_EDITABLE.includes(r.version.state)) throw ApiError.conflict(stateMessage(r.version.state), [{ path: "state", message: stateMessage(r.version.state) }]);
  return r;
}

function checkMetadataObject(meta: unknown, what: string): Record<string, unknown> {
  if (!meta || typeof meta !== "object" || Array.isArray(meta)) throw ApiError.badRequest(`${what} must be a JSON object.`, [{ path: "/metadata", message: `${what} must be a JSON object.` }]);
  if (JSON.stringify(meta).length > MAX_METADATA_CHARS) throw ApiError.badRequest(`${what} is too large.`, [{ path: "/metadata", message: `At most ${MAX_METADATA_CHARS} characters.` }]);
  return meta as Record<string, unknown>;
}

async function bump(version: DatasetVersion, t: Transaction, changes: Partial<Pick<DatasetVersion, "metadata" | "state" | "submittedAt">> = {}): Promise<void> {
  await version.update({ ...changes, lockVersion: version.lockVersion + 1 }, { transaction: t });
}

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

export interface UploadOptions {
  kind: "bipartite" | "unipartite";
  directed: boolean;
  format: "auto" | "matrix" | "edgelist";
  /** Workbook sheet and meaning of cells without a number, for every file… */
  read?: NetworkReadOptions;
  /** …or per file name (overrides `read`). */
  perFile?: Record<string, NetworkReadOptions>;
}

export interface ParsedUpload {
  file: UploadedFile;
  sha256: string;
  parsed: ParsedFile;
  canonical: CanonicalNetworkJson;
  metrics: BasicMetrics;
  read: NetworkReadOptions;
}

/**
 * Parses every file in the parse threads (lib/parse/pool.ts: off the web server's thread, with time and
 * memory limits); collects every file's problem (file, row, column) before refusing.
 */
export async function parseUploads(files: UploadedFile[], opts: UploadOptions): Promise<ParsedUpload[]> {
  const problems: ErrorDetail[] = [];
  const out: ParsedUpload[] = [];
  const maxBytes = config().uploadMaxBytes;
  for (const file of files) {
    const read: NetworkReadOptions = { ...opts.read, ...opts.perFile?.[file.name] };
    const res = await parseInThread({
      ...(file.bytes ? { bytes: new Uint8Array(file.bytes.buffer, file.bytes.byteOffset, file.bytes.byteLength) } : { path: file.path }),
      options: {
        fileName: file.name,
        format: opts.format,
        kind: opts.kind,
        directed: opts.kind === "unipartite" ? opts.directed : false,
        maxBytes,
        ...read,
      },
    });
    if (res.ok) {
      const parsed = res.parsed;
      // Keep only the answers that applied, so a later reading does not carry a meaningless choice.
      const kept: NetworkReadOptions = {};
      if (parsed.workbook) kept.sheet = parsed.workbook.sheet;
      if (parsed.missing.markerCells > 0 && read.missing) kept.missing = read.missing;
      if (parsed.missing.blankCells > 0 && read.blank) kept.blank = read.blank;
      out.push({ file, sha256: res.sha256, parsed, canonical: res.canonical, metrics: res.metrics, read: kept });
    } else {
      const err = res.problem;
      problems.push({
        file: file.name,
        ...(err.file && err.file !== file.name ? { where: err.file } : {}),
        ...(err.row !== null ? { row: err.row } : {}),
        ...(err.column !== null ? { column: err.column } : {}),
        code: err.code,
        message: err.message,
        ...(err.extra ? { extra: err.extra } : {}),
      });
    }
  }
  if (problems.length) {
    throw ApiError.unprocessable(
      problems.length === 1 ? `The upload was refused: ${problems[0].message}` : `The upload was refused: ${problems.length} files have problems. Nothing was stored.`,
      problems,
    );
  }
  return out;
}

async function storeFile(bytes: Buffer, sha256: string, t: Transaction): Promise<number> {
  const rows = (await sequelize().query(
    `INSERT INTO stored_files (sha256, size, bytes, created_at, updated_at) VALUES ($1, $2, $3, now(), now())
     ON CONFLICT (sha256) DO UPDATE SET updated_at = stored_files.updated_at RETURNING id`,
    { bind: [sha256, bytes.length, bytes], type: QueryTypes.SELECT, transaction: t },
  )) as Array<{ id: number }>;
  return rows[0].id;
}

function networkColumns(p: ParsedUpload) {
  const net = p.parsed.network;
  const m = p.metrics;
  return {
    format: p.parsed.format,
    kind: net.kind,
    directed: net.directed,
    weighted: net.weighted,
    canonical: p.canonical,
    nNodes: m.nodes,
    nRows: m.rows,
    nCols: m.cols,
    nLinks: m.links,
    totalWeight: m.totalWeight,
    connectance: m.connectance,
    parseWarnings: p.parsed.warnings.map((w) => ({ code: w.code, message: w.message, row: w.row, column: w.column, count: w.count })),
    readOptions: p.read,
  };
}

function withMissingValuesOf(meta: Record<string, unknown>, stored: Record<string, unknown>): Record<string, unknown> {
  const { missingValues: _given, ...rest } = meta;
  void _given;
  return stored.missingValues !== undefined ? { ...rest, missingValues: stored.missingValues } : rest;
}

/**
 * The network metadata's record of how cells without a number were read (`missingValues`, schema
 * network.schema.json), from the parse; absent when every cell held a number.
 */
export function withMissingValues(meta: Record<string, unknown>, p: ParsedUpload): Record<string, unknown> {
  const m = p.parsed.missing;
  const { missingValues: _old, ...rest } = meta;
  void _old;
  if (m.markerCells === 0 && m.blankCells === 0) return rest;
  return {
    ...rest,
    missingValues: {
      ...(m.markerCells > 0 ? { markers: m.markers, markerCells: m.markerCells, markerMeaning: m.markerMeaning ?? "no-interaction" } : {}),
      blankCells: m.blankCells,
      blankMeaning: m.blankMeaning,
    },
  };
}

/** Deletes stored files no network refers to any more (after network rows were removed). */
async function deleteOrphanFiles(fileIds: number[], t: Transaction): Promise<void> {
  if (!fileIds.length) return;
  await sequelize().query(`DELETE FROM stored_files f WHERE f.id IN (:ids) AND NOT EXISTS (SELECT 1 FROM networks n WHERE n.file_id = f.id)`, { replacements: { ids: fileIds }, transaction: t });
}

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

async function loadNetworkOf(version: DatasetVersion, networkId: number, t?: Transaction): Promise<Network> {
  const n = await Network.findOne({ where: { id: networkId, versionId: version.id }, transaction: t });
  if (!n) throw ApiError.notFound("This deposit has no such network.");
  return n;
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
      const read = { ...(net.readOptions ?? {}), ...changes.read };
      const [p] = await parseUploads([{ name: net.originalName, bytes: file.bytes }], { kind, directed: changes.directed ?? net.directed, format: changes.format ?? net.format, read });
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

/** Curators correct metadata of submissions (submitted or changes requested), never of published versions nor of their own deposits. */
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

/** The metadata sheet of a deposit (owner or curator): CSV text and a file name. */
export async function getMetadataSheet(versionId: number, viewer: Viewer): Promise<{ name: string; csv: string }> {
  const { dataset, version } = await loadVisibleVersion(versionId, viewer);
  const networks = await Network.findAll({ where: { versionId: version.id }, order: [["position", "ASC"]] });
  const stem = dataset.accession ? `${dataset.accession}-v${version.number}` : `deposit-${version.id}`;
  return { name: `${stem}-network-metadata.csv`, csv: writeSheet(networks.map((n) => ({ position: n.position, originalName: n.originalName, metadata: n.metadata ?? {} }))) };
}

export interface SheetCellProblem {
  row: number;
  column: number | null;
  columnName: string;
  field: string;
  network: number;
  message: string;
}

/**
 * Fills every network's metadata from an uploaded sheet in one transaction. Structural problems (unknown
 * column or network) refuse it whole; value problems are saved, as drafts are, and returned per cell.
 */
export async function applyMetadataSheet(versionId: number, viewer: Viewer, text: unknown): Promise<{ deposit: DepositDetail; cells: SheetCellProblem[]; rows: number }> {
  if (typeof text !== "string" || !text.trim()) throw ApiError.badRequest("Send the sheet's CSV text as csv.", [{ path: "/csv", message: "The CSV text of the metadata sheet." }]);
  const { dataset, version, rows } = await tx(async (t) => {
    const r = await loadOwnEditable(versionId, viewer, t);
    const nets = await Network.findAll({ where: { versionId: r.version.id }, order: [["position", "ASC"]], transaction: t });
    const rows = readSheet(text, nets.map((n) => n.position));
    for (const row of rows) {
      const net = nets.find((n) => n.position === row.position)!;
      await net.update({ metadata: withMissingValuesOf(row.metadata, net.metadata ?? {}) }, { transaction: t });
    }
    await bump(r.version, t);
    await audit({ actorId: viewer.id, action: "deposit.metadata.sheet", entityType: "dataset_version", entityId: r.version.id, datasetId: r.dataset.id, details: { networks: rows.map((x) => x.position) } }, t);
    return { ...r, rows };
  });
  const deposit = await depositDetail(dataset, version, viewer);
  const cells: SheetCellProblem[] = [];
  for (const row of rows) {
    const f = deposit.findings.networks.find((n) => n.position === row.position);
    for (const e of f?.findings ?? []) {
      const c = cellOf(row, e.path);
      cells.push({ row: row.row, column: c.column, columnName: c.name, field: e.path, network: row.position, message: e.message });
    }
  }
  return { deposit, cells, rows: rows.length };
}

/** What "apply this block to all networks" copies. */
export const BLOCKS = {
  locality: { fields: ["locality"], notRecorded: ["coordinates", "elevation"] },
  habitat: { fields: ["habitat"], notRecorded: ["habitat"] },
  dates: { fields: ["startDate", "endDate"], notRecorded: ["dates"] },
  sampling: { fields: ["samplingProtocol", "samplingEffort", "taxonomicResolution"], notRecorded: ["samplingEffort"] },
} as const;
export type BlockName = keyof typeof BLOCKS;

/** Copies blocks of one network's metadata (locality, habitat, dates, sampling) to every other network. */
export async function applyBlocks(versionId: number, viewer: Viewer, fromNetworkId: number, blocks: BlockName[]): Promise<DepositDetail> {
  const { dataset, version } = await tx(async (t) => {
    const r = await loadOwnEditable(versionId, viewer, t);
    const from = await loadNetworkOf(r.version, fromNetworkId, t);
    const src = from.metadata ?? {};
    const srcNr = (src.notRecorded ?? {}) as Record<string, unknown>;
    const others = await Network.findAll({ where: { versionId: r.version.id, id: { [Op.ne]: from.id } }, transaction: t });
    for (const n of others) {
      const meta: Record<string, unknown> = { ...(n.metadata ?? {}) };
      const nr: Record<string, unknown> = { ...((meta.notRecorded ?? {}) as Record<string, unknown>) };
      for (const b of blocks) {
        for (const f of BLOCKS[b].fields) {
          if (src[f] === undefined) delete meta[f];
          else meta[f] = structuredClone(src[f]);
        }
        for (const f of BLOCKS[b].notRecorded) {
          if (srcNr[f] === undefined) delete nr[f];
          else nr[f] = srcNr[f];
        }
      }
      if (Object.keys(nr).length) meta.notRecorded = nr;
      else delete meta.notRecorded;
      await n.update({ metadata: meta }, { transaction: t });
    }
    await bump(r.version, t);
    await audit({ actorId: viewer.id, action: "deposit.metadata.apply", entityType: "dataset_version", entityId: r.version.id, datasetId: r.dataset.id, details: { from: from.position, blocks, to: others.map((n) => n.position) } }, t);
    return r;
  });
  return depositDetail(dataset, version, viewer);
}
