import type { NextFunction, Request, Response } from "express";
import type { ListResponse } from "@shared/types/api";
import { config } from "../../config/env";
import { createDeposit, deleteDraft, listMyDeposits, updateStudyMetadata } from "./deposits.service";
import { getDeposit, type DepositListItem } from "./deposits.detail";
import * as networks from "./deposits.networks";
import { applyBlocks as copyBlocks, applyMetadataSheet, BLOCKS, getMetadataSheet, type BlockName } from "./deposits.metadata";
import { submitDeposit } from "./deposits.submission";
import { ApiError } from "../../lib/api-error";
import { expandUpload } from "./deposits.upload";
import { idParam, networkChanges, uploadOptions } from "./deposits.validation";
import { originalFileType } from "../../lib/file-type";
import { addComment, commentBody, listThread } from "./deposits.comments";
import type { TempFile } from "../../lib/upload-storage";

const viewer = (req: Request) => req.user!;

export async function list(req: Request, res: Response) {
  const data = await listMyDeposits(viewer(req));
  const body: ListResponse<DepositListItem> = { data, meta: { total: data.length } };
  res.json(body);
}

export async function create(req: Request, res: Response) {
  res.status(201).json(await createDeposit(viewer(req), (req.body as { metadata?: unknown } | undefined)?.metadata ?? {}));
}

export async function show(req: Request, res: Response) {
  res.json(await getDeposit(idParam(req.params.id, "deposit"), viewer(req)));
}

export async function updateMetadata(req: Request, res: Response) {
  res.json(await updateStudyMetadata(idParam(req.params.id, "deposit"), viewer(req), (req.body as { metadata?: unknown } | undefined)?.metadata));
}

/** Before the multipart body is read: only the owner of an editable deposit gets to send files. */
export async function uploadTarget(req: Request, _res: Response, next: NextFunction) {
  await networks.assertUploadTarget(idParam(req.params.id, "deposit"), viewer(req));
  next();
}

export async function upload(req: Request, res: Response) {
  const cfg = config();
  const versionId = idParam(req.params.id, "deposit");
  const opts = uploadOptions(req.body as Record<string, unknown>);
  const files = await expandUpload((req.files as TempFile[] | undefined) ?? [], { maxBytes: cfg.uploadMaxBytes, maxFiles: cfg.uploadMaxFiles });
  res.status(201).json(await networks.addNetworks(versionId, viewer(req), files, opts));
}

export async function updateNetwork(req: Request, res: Response) {
  res.json(await networks.updateNetwork(idParam(req.params.id, "deposit"), idParam(req.params.networkId, "network"), viewer(req), networkChanges(req.body as Record<string, unknown>)));
}

export async function deleteNetwork(req: Request, res: Response) {
  res.json(await networks.deleteNetwork(idParam(req.params.id, "deposit"), idParam(req.params.networkId, "network"), viewer(req)));
}

export async function reorder(req: Request, res: Response) {
  res.json(await networks.reorderNetworks(idParam(req.params.id, "deposit"), viewer(req), (req.body as { order?: unknown } | undefined)?.order));
}

export async function remove(req: Request, res: Response) {
  await deleteDraft(idParam(req.params.id, "deposit"), viewer(req));
  res.status(204).end();
}

export async function submit(req: Request, res: Response) {
  const reply = (req.body as { reply?: unknown } | undefined)?.reply;
  res.json(await submitDeposit(idParam(req.params.id, "deposit"), viewer(req), reply === undefined || reply === null || reply === "" ? null : commentBody(reply, "/reply")));
}

export async function thread(req: Request, res: Response) {
  res.json(await listThread(idParam(req.params.id, "deposit"), viewer(req)));
}

export async function comment(req: Request, res: Response) {
  res.status(201).json(await addComment(idParam(req.params.id, "deposit"), viewer(req), (req.body as { body?: unknown } | undefined)?.body, req.authVia));
}

export async function networkFile(req: Request, res: Response) {
  const f = await networks.getDepositNetworkFile(idParam(req.params.id, "deposit"), idParam(req.params.networkId, "network"), viewer(req));
  res.setHeader("Digest", `sha-256=${Buffer.from(f.sha256, "hex").toString("base64")}`);
  res.attachment(f.name).type(originalFileType(f.name, f.bytes)).send(f.bytes);
}

export async function networkCanonical(req: Request, res: Response) {
  res.json(await networks.getDepositNetworkCanonical(idParam(req.params.id, "deposit"), idParam(req.params.networkId, "network"), viewer(req)));
}

export async function metadataSheet(req: Request, res: Response) {
  const sheet = await getMetadataSheet(idParam(req.params.id, "deposit"), viewer(req));
  res.attachment(sheet.name).type("text/csv; charset=utf-8").send(sheet.csv);
}

export async function uploadMetadataSheet(req: Request, res: Response) {
  res.json(await applyMetadataSheet(idParam(req.params.id, "deposit"), viewer(req), (req.body as { csv?: unknown } | undefined)?.csv));
}

export async function applyBlocks(req: Request, res: Response) {
  const b = (req.body ?? {}) as { from?: unknown; blocks?: unknown };
  const names = Object.keys(BLOCKS);
  const blocks = Array.isArray(b.blocks) ? b.blocks.map(String) : [];
  if (!blocks.length || blocks.some((x) => !names.includes(x))) throw ApiError.badRequest(`blocks must list some of ${names.join(", ")}.`, [{ path: "/blocks", message: `Some of ${names.join(", ")}.` }]);
  res.json(await copyBlocks(idParam(req.params.id, "deposit"), viewer(req), idParam(b.from, "network"), blocks as BlockName[]));
}
