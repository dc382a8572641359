import type { Request, Response } from "express";
import { ApiError } from "../../lib/api-error";
import { hasRole } from "../../middlewares/require-role";
import { getPublishedDetail, getPublishedNetworkFile } from "./datasets.service";
import { startNewVersion } from "./datasets.versions";
import { withdrawDataset } from "./datasets.withdrawal";
import { originalFileType } from "../../lib/file-type";
import { sendPublicAnswer } from "../../lib/public-answers";

/** The answer depends on who asks (owner and curators see exact coordinates and the contact e-mail): no shared caches. */
function perViewer(res: Response): void {
  res.setHeader("Cache-Control", "private, no-cache");
  res.vary("Authorization");
  res.vary("Cookie");
}

export async function show(req: Request, res: Response) {
  perViewer(res);
  const number = req.query.version as unknown as number | undefined; // checked by datasetSchema
  const accession = String(req.params.accession);
  await sendPublicAnswer(req, res, accession, `dataset/${number ?? "latest"}`, () => getPublishedDetail(accession, number, req.user));
}

export async function showVersion(req: Request, res: Response) {
  perViewer(res);
  const accession = String(req.params.accession);
  const number = req.params.n as unknown as number;
  await sendPublicAnswer(req, res, accession, `dataset/${number}`, () => getPublishedDetail(accession, number, req.user));
}

export async function networkFile(req: Request, res: Response) {
  const p = req.params as unknown as { accession: string; n: number; pos: number };
  const f = await getPublishedNetworkFile(p.accession, p.n, p.pos);
  res.setHeader("Digest", `sha-256=${Buffer.from(f.sha256, "hex").toString("base64")}`);
  res.attachment(f.name).type(originalFileType(f.name, f.bytes)).send(f.bytes);
}

export async function newVersion(req: Request, res: Response) {
  res.status(201).json(await startNewVersion(String(req.params.accession), req.user!));
}

export async function withdraw(req: Request, res: Response) {
  if (!hasRole(req.user, "curator")) throw ApiError.forbidden("Only curators and admins withdraw datasets.");
  res.json(await withdrawDataset(String(req.params.accession), req.user!, (req.body as { reason: string }).reason));
}
