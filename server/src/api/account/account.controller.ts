import type { Request, Response } from "express";
import * as v from "./account.validation";
import * as service from "./account.service";

export async function show(req: Request, res: Response) {
  res.json(await service.getProfile(req.user!.id));
}

export async function update(req: Request, res: Response) {
  res.json(await service.updateProfile(req.user!.id, v.validateProfilePatch(req.body)));
}

export async function changePassword(req: Request, res: Response) {
  const { currentPassword, newPassword } = v.validatePasswordChange(req.body);
  await service.changePassword(req.user!.id, currentPassword, newPassword, req.sessionID);
  res.status(204).end();
}

export async function unlinkOrcid(req: Request, res: Response) {
  res.json(await service.unlinkOrcid(req.user!.id));
}
