import type { Request, Response } from "express";
import type { Role } from "../../models/user.model";
import * as service from "./users.service";

/** Query checked and coerced by validate(userListSchema). */
export async function list(req: Request, res: Response) {
  const q = req.query as unknown as { role?: Role; email?: string; page: number; pageSize: number };
  res.json(await service.listUsers({ role: q.role, email: q.email?.trim().slice(0, 254) || undefined, page: q.page, pageSize: q.pageSize }));
}

/** Id and body checked by validate(roleChangeSchema). */
export async function changeRole(req: Request, res: Response) {
  const { id } = req.params as unknown as { id: number };
  res.json(await service.changeRole(req.user!.id, id, (req.body as { role: Role }).role));
}
