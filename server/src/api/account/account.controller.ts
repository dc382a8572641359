import type { Request, Response } from "express";
import * as service from "./account.service";
import { normalizeOrcid } from "./account.schemas";

// Bodies are checked by validate() with account.schemas.ts in account.routes.ts; here they are normalized.

export async function show(req: Request, res: Response) {
  res.json(await service.getProfile(req.user!.id));
}

export async function update(req: Request, res: Response) {
  const b = req.body as { displayName?: string; affiliation?: string | null; orcid?: string | null };
  const patch: { displayName?: string; affiliation?: string | null; orcid?: string | null } = {};
  if (b.displayName !== undefined) patch.displayName = b.displayName.trim().replace(/\s+/g, " ");
  if (b.affiliation !== undefined) patch.affiliation = b.affiliation?.trim() || null;
  if (b.orcid !== undefined) patch.orcid = b.orcid?.trim() ? normalizeOrcid(b.orcid) : null;
  res.json(await service.updateProfile(req.user!.id, patch));
}

export async function changePassword(req: Request, res: Response) {
  const { currentPassword, newPassword } = req.body as { currentPassword: string; newPassword: string };
  await service.changePassword(req.user!.id, currentPassword, newPassword, req.sessionID);
  res.status(204).end();
}

export async function unlinkOrcid(req: Request, res: Response) {
  res.json(await service.unlinkOrcid(req.user!.id));
}
