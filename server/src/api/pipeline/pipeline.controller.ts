import type { Request, Response } from "express";
import type { PipelineSettings } from "@shared/types/pipeline";
import { getPipelineSettings, validateSettings } from "../../pipeline/settings";
import * as service from "./pipeline.service";

/** Ids, pages, filters and bodies are checked (and coerced) by validate() in pipeline.routes.ts. */
const idOf = (req: Request): number => (req.params as unknown as { id: number }).id;

/** Settings a body changes (checked by settingsSchema), merged over the current ones. */
async function withChanges(changes: Record<string, unknown> | undefined): Promise<PipelineSettings> {
  const current = await getPipelineSettings();
  if (!changes) return current;
  const { settings, errors } = validateSettings(changes, current);
  // the route's schema and the pipeline's reader accept the same settings: a difference is a defect
  if (!settings) throw new Error(`settings accepted by the route but refused by the pipeline: ${JSON.stringify(errors)}`);
  return settings;
}

export async function getSettings(_req: Request, res: Response) {
  res.json(await service.readSettings());
}

export async function putSettings(req: Request, res: Response) {
  res.json(await service.updateSettings(req.user!.id, await withChanges(req.body as Record<string, unknown>)));
}

export async function listBatches(req: Request, res: Response) {
  const { page, pageSize } = req.query as unknown as { page: number; pageSize: number };
  res.json(await service.listBatches(page, pageSize));
}

export async function currentBatch(_req: Request, res: Response) {
  res.json({ batch: await service.currentBatch() });
}

type BatchStart = { settings?: Record<string, unknown>; force: boolean };

export async function startBatch(req: Request, res: Response) {
  const { settings, force } = req.body as BatchStart;
  res.status(201).json(await service.startBatch(req.user!.id, await withChanges(settings), force));
}

export async function previewBatch(req: Request, res: Response) {
  const { settings, force } = req.body as BatchStart;
  res.json(await service.previewBatch(await withChanges(settings), force));
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
