/** Admin: the list of accounts and role changes. */
import { Router } from "express";
import { requireRole } from "../../middlewares/require-role";
import { validate } from "../../middlewares/validate";
import * as c from "./users.controller";
import { roleChangeSchema, userListSchema } from "./users.schemas";

export const usersRouter = Router();

usersRouter.get("/", requireRole("admin"), validate(userListSchema), c.list);
usersRouter.patch("/:id/role", requireRole("admin"), validate(roleChangeSchema), c.changeRole);
