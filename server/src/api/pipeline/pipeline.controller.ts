import type { Request, Response } from "express";
import { getPipelineSettings } from "../../pipeline/settings";
import * as service from "./pipeline.service";
import * as v from "./pipeline.validation";

/** Ids, pages and filters are checked and coerced by validate() in pipeline.routes.ts. */
const idOf = (req: Request): number => (req.params as unknown as { id: number }).id;

export async function getSettings(_req: Request, res: Response) {
  res.json(await service.readSettings());
}

export async function putSettings(req: Request, res: Response) {
  const settings = v.parseSettings(req.body, await getPipelineSettings());
  res.json(await service.updateSettings(req.user!.id, settings));
}

export async function listBatches(req: Request, res: Response) {
  const { page, pageSize } = req.query as unknown as { page: number; pageSize: number };
  res.json(await service.listBatches(page, pageSize));
}

export async function currentBatch(_req: Request, res: Response) {
  res.json({ batch: await service.currentBatch() });
}

export async function startBatch(req: Request, res: Response) {
  const { settings, force } = v.parseBatchStart(req.body, await getPipelineSettings());
  res.status(201).json(await service.startBatch(req.user!.id, settings, force));
}

export async function previewBatch(req: Request, res: Response) {
  const { settings, force } = v.parseBatchStart(req.body, await getPipelineSettings());
  res.json(await service.previewBatch(settings, force));
}

export async function getBatch(req: Request, res: Response) {
  res.json(await service.getBatch(idOf(req)));
}

export async function batchFailures(req: Request, res: Response) {
  res.json(await service.batchFailures(idOf(req)));
}

export async function retryFailed(req: Request, res: Response) {
  res.json(await service.retryFailed(req.user!.id, idOf(req)));
}

export async function listRuns(req: Request, res: Response) {
  res.json(await service.listRuns(req.query as unknown as { status?: string; batchId?: number; page: number; pageSize: number }));
}

export async function networkMetrics(req: Request, res: Response) {
  res.json(await service.networkMetrics(idOf(req)));
}

export async function queueProgress(_req: Request, res: Response) {
  res.json(await service.queueProgress());
}
