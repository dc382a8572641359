import { Router } from "express";
import { sequelize } from "../../db/sequelize";
import { config } from "../../config/env";

export const healthRouter = Router();

/** GET /api/v1/health — reports whether the database answers. */
healthRouter.get("/", async (req, res) => {
  const started = Date.now();
  try {
    await sequelize().query("SELECT 1");
    res.json({ status: "ok", database: { status: "ok", latencyMs: Date.now() - started } });
  } catch (err) {
    // The driver's message names hosts, ports and users: only outside production does it go to the caller.
    req.log?.error({ err }, "health check: database unreachable");
    const message = config().nodeEnv === "production" ? "The database does not answer." : (err as Error).message;
    res.status(503).json({ status: "degraded", database: { status: "unreachable", message } });
  }
});
