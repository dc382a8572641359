import type { NextFunction, Request, Response } from "express";
import type { ListResponse } from "@shared/types/api";
import { config } from "../../config/env";
import { createDeposit, deleteDraft, listMyDeposits, updateStudyMetadata } from "./deposits.service";
import { getDeposit, type DepositListItem } from "./deposits.detail";
import * as networks from "./deposits.networks";
import { applyBlocks as copyBlocks, applyMetadataSheet, getMetadataSheet, type BlockName } from "./deposits.metadata";
import { submitDeposit } from "./deposits.submission";
import { expandUpload } from "./deposits.upload";
import type { UploadOptions } from "./deposits.files";
import { originalFileType } from "../../lib/file-type";
import { addComment, commentText, listThread } from "./deposits.comments";
import type { TempFile } from "../../lib/upload-storage";
import type { NetworkReadOptions } from "../../models/network.model";

// Ids and bodies are checked (and coerced) by validate() with deposits.schemas.ts in deposits.routes.ts.
const viewer = (req: Request) => req.user!;
const depositId = (req: Request): number => (req.params as unknown as { id: number }).id;
const networkId = (req: Request): number => (req.params as unknown as { networkId: number }).networkId;

type ReadFields = { sheet?: string; missing?: NetworkReadOptions["missing"]; blank?: NetworkReadOptions["blank"] };

/** The read options among checked fields, or undefined when none is given. */
function readOf(b: ReadFields): NetworkReadOptions | undefined {
  const read: NetworkReadOptions = {};
  if (b.sheet !== undefined) read.sheet = b.sheet;
  if (b.missing !== undefined) read.missing = b.missing;
  if (b.blank !== undefined) read.blank = b.blank;
  return Object.keys(read).length ? read : undefined;
}

export async function list(req: Request, res: Response) {
  const data = await listMyDeposits(viewer(req));
  const body: ListResponse<DepositListItem> = { data, meta: { total: data.length } };
  res.json(body);
}

export async function create(req: Request, res: Response) {
  res.status(201).json(await createDeposit(viewer(req), (req.body as { metadata?: object }).metadata ?? {}));
}

export async function show(req: Request, res: Response) {
  res.json(await getDeposit(depositId(req), viewer(req)));
}

export async function updateMetadata(req: Request, res: Response) {
  res.json(await updateStudyMetadata(depositId(req), viewer(req), (req.body as { metadata: object }).metadata));
}

/** Before the multipart body is read: only the owner of an editable deposit gets to send files. */
export async function uploadTarget(req: Request, _res: Response, next: NextFunction) {
  await networks.assertUploadTarget(depositId(req), viewer(req));
  next();
}

export async function upload(req: Request, res: Response) {
  const cfg = config();
  const f = req.body as ReadFields & Pick<UploadOptions, "kind" | "directed" | "format"> & { fileOptions?: Record<string, ReadFields> };
  const read = readOf(f);
  const perFile = f.fileOptions && Object.fromEntries(Object.entries(f.fileOptions).map(([name, o]) => [name, readOf(o) ?? {}]));
  const opts: UploadOptions = { kind: f.kind, directed: f.directed, format: f.format, ...(read ? { read } : {}), ...(perFile ? { perFile } : {}) };
  const files = await expandUpload((req.files as TempFile[] | undefined) ?? [], { maxBytes: cfg.uploadMaxBytes, maxFiles: cfg.uploadMaxFiles });
  res.status(201).json(await networks.addNetworks(depositId(req), viewer(req), files, opts));
}

export async function updateNetwork(req: Request, res: Response) {
  const { metadata, kind, directed, format, ...rest } = req.body as ReadFields & Partial<Pick<UploadOptions, "kind" | "directed" | "format">> & { metadata?: object };
  const read = readOf(rest);
  const changes = { ...(metadata !== undefined ? { metadata } : {}), ...(kind !== undefined ? { kind } : {}), ...(directed !== undefined ? { directed } : {}), ...(format !== undefined ? { format } : {}), ...(read ? { read } : {}) };
  res.json(await networks.updateNetwork(depositId(req), networkId(req), viewer(req), changes));
}

export async function deleteNetwork(req: Request, res: Response) {
  res.json(await networks.deleteNetwork(depositId(req), networkId(req), viewer(req)));
}

export async function reorder(req: Request, res: Response) {
  res.json(await networks.reorderNetworks(depositId(req), viewer(req), (req.body as { order: number[] }).order));
}

export async function remove(req: Request, res: Response) {
  await deleteDraft(depositId(req), viewer(req));
  res.status(204).end();
}

export async function submit(req: Request, res: Response) {
  const reply = commentText((req.body as { reply?: string | null }).reply ?? "");
  res.json(await submitDeposit(depositId(req), viewer(req), reply || null));
}

export async function thread(req: Request, res: Response) {
  res.json(await listThread(depositId(req), viewer(req)));
}

export async function comment(req: Request, res: Response) {
  res.status(201).json(await addComment(depositId(req), viewer(req), (req.body as { body: string }).body, req.authVia));
}

export async function networkFile(req: Request, res: Response) {
  const f = await networks.getDepositNetworkFile(depositId(req), networkId(req), viewer(req));
  res.setHeader("Digest", `sha-256=${Buffer.from(f.sha256, "hex").toString("base64")}`);
  res.attachment(f.name).type(originalFileType(f.name, f.bytes)).send(f.bytes);
}

export async function networkCanonical(req: Request, res: Response) {
  res.json(await networks.getDepositNetworkCanonical(depositId(req), networkId(req), viewer(req)));
}

export async function metadataSheet(req: Request, res: Response) {
  const sheet = await getMetadataSheet(depositId(req), viewer(req));
  res.attachment(sheet.name).type("text/csv; charset=utf-8").send(sheet.csv);
}

export async function uploadMetadataSheet(req: Request, res: Response) {
  res.json(await applyMetadataSheet(depositId(req), viewer(req), (req.body as { csv: string }).csv));
}

export async function applyBlocks(req: Request, res: Response) {
  const b = req.body as { from: number; blocks: BlockName[] };
  res.json(await copyBlocks(depositId(req), viewer(req), b.from, b.blocks));
}
