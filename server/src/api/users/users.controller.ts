import type { Request, Response } from "express";
import * as v from "./users.validation";
import * as service from "./users.service";

export async function list(req: Request, res: Response) {
  res.json(await service.listUsers(v.validateUserListQuery(req.query as Record<string, unknown>)));
}

export async function changeRole(req: Request, res: Response) {
  const id = v.validateUserId(req.params.id);
  const { role } = v.validateRoleChange(req.body);
  res.json(await service.changeRole(req.user!.id, id, role));
}
