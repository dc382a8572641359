/** Admin: the list of accounts and role changes. */
import { Router } from "express";
import { requireRole } from "../../middlewares/require-role";
import * as c from "./users.controller";

export const usersRouter = Router();

usersRouter.get("/", requireRole("admin"), c.list);
usersRouter.patch("/:id/role", requireRole("admin"), c.changeRole);
