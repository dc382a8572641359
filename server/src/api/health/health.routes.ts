import { Router } from "express";
import { sequelize } from "../../db/sequelize";

export const healthRouter = Router();

/** GET /api/v1/health — reports whether the database answers. */
healthRouter.get("/", async (_req, res) => {
  const started = Date.now();
  try {
    await sequelize().query("SELECT 1");
    res.json({ status: "ok", database: { status: "ok", latencyMs: Date.now() - started } });
  } catch (err) {
    res.status(503).json({ status: "degraded", database: { status: "unreachable", message: (err as Error).message } });
  }
});
