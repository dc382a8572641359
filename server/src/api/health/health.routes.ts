import { Router } from "express";
import { sequelize } from "../../db/sequelize";
import { DATABASE_UNAVAILABLE_MESSAGE } from "../../lib/db-errors";

export const healthRouter = Router();

/** GET /api/v1/health — reports whether the database answers. */
healthRouter.get("/", async (req, res) => {
  const started = Date.now();
  try {
    await sequelize().query("SELECT 1");
    res.json({ status: "ok", database: { status: "ok", latencyMs: Date.now() - started } });
  } catch (err) {
    // The driver's message names hosts, ports and users: it goes to the log, never to the caller.
    req.log?.error({ err }, "health check: database unreachable");
    res.status(503).set("Retry-After", "10").json({ status: "degraded", database: { status: "unreachable", message: DATABASE_UNAVAILABLE_MESSAGE } });
  }
});
