/** Mounts every resource router under /api/v1. One line per resource. */
import { Router } from "express";
import { healthRouter } from "./health/health.routes";
import { authRouter } from "./auth/auth.routes";

export function apiRouter(): Router {
  const r = Router();
  r.use("/health", healthRouter);
  r.use("/auth", authRouter);
  return r;
}
