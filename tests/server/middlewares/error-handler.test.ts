/**
 * The error pipeline: the caller's mistakes that Express and body-parser detect (a path that is not valid
 * percent-encoding, an unsupported charset) are 4xx, not server errors; real server errors say nothing
 * of the internals in production.
 */
import express from "express";
import request from "supertest";
import { afterAll, describe, expect, it, vi } from "vitest";
import { createApp } from "../../../server/src/app";
import { shutdownServerResources } from "../../../server/src/index";
import { resetConfig } from "../../../server/src/config/env";
import { errorHandler } from "../../../server/src/middlewares/error-handler";
import { sequelize } from "../../../server/src/db/sequelize";
import { ConnectionRefusedError, DatabaseError, UniqueConstraintError } from "sequelize";
import { isDatabaseUnavailable } from "../../../server/src/lib/db-errors";

const app = createApp();
afterAll(shutdownServerResources);

/**
 * The smallest valid production configuration (a long session secret; DOIs and ORCID sign-in off, since
 * production refuses the local stand-ins' settings). Returns a function that puts the environment back.
 */
function productionConfig(): () => void {
  const keys = ["NODE_ENV", "SESSION_SECRET", "TB_DOI", "TB_ORCID"] as const;
  const saved = Object.fromEntries(keys.map((k) => [k, process.env[k]]));
  Object.assign(process.env, { NODE_ENV: "production", SESSION_SECRET: "x".repeat(40), TB_DOI: "off", TB_ORCID: "off" });
  resetConfig();
  return () => {
    for (const k of keys) {
      if (saved[k] === undefined) delete process.env[k];
      else process.env[k] = saved[k];
    }
    resetConfig();
  };
}

describe("error pipeline", () => {
  it.each(["/api/v1/datasets/%E0%A4%A", "/api/v1/network-views/TB-000001/v1/%ZZ", "/api/v1/networks/TB-000001/v1/%ZZ"])("%s: a path that is not valid percent-encoding is a 400", async (path) => {
    const res = await request(app).get(path);
    expect(res.status).toBe(400);
    expect(res.body.code).toBe("bad_request");
  });

  it("an unsupported request charset is a 415", async () => {
    const res = await request(app).post("/api/v1/bundles/estimate").set("Authorization", "Bearer not-a-token").set("Content-Type", "application/json; charset=latin9").send('{"refs":[]}');
    // the bad token is checked after the body is read: the charset answers first
    expect(res.status).toBe(415);
    expect(res.body.code).toBe("unsupported_media_type");
  });

  it("in production the health check does not pass on the database driver's message", async () => {
    const restore = productionConfig();
    const spy = vi.spyOn(sequelize(), "query").mockRejectedValueOnce(new Error('password authentication failed for user "tanglebank" at 10.1.2.3:5432'));
    try {
      const res = await request(app).get("/api/v1/health");
      expect(res.status).toBe(503);
      expect(res.body.database.status).toBe("unreachable");
      expect(JSON.stringify(res.body)).not.toMatch(/tanglebank|10\.1\.2\.3|password/);
    } finally {
      spy.mockRestore();
      restore();
    }
  });

  it("in production a server error says nothing of the internals", async () => {
    const restore = productionConfig();
    try {
      const mini = express();
      mini.get("/boom", () => {
        throw new Error("relation \"secret_table\" does not exist at /srv/app/server.js:42");
      });
      mini.use(errorHandler);
      const res = await request(mini).get("/boom");
      expect(res.status).toBe(500);
      expect(JSON.stringify(res.body)).not.toMatch(/secret_table|\/srv\/app/);
      expect(res.body).toEqual({ code: "internal", message: "Something went wrong on our side." });
    } finally {
      restore();
    }
  });

  it("the database unreachable, however the error is wrapped, is a 503 with a plain message on API routes and pages", async () => {
    const refused = Object.assign(new Error("connect ECONNREFUSED 127.0.0.1:54329"), { code: "ECONNREFUSED" });
    const shutdown = Object.assign(new Error("terminating connection due to administrator command"), { code: "57P01" });
    const cases: unknown[] = [
      new ConnectionRefusedError(refused),
      new DatabaseError(Object.assign(shutdown, { sql: "SELECT 1" })),
      new DatabaseError(Object.assign(new Error("Connection terminated unexpectedly"), { sql: "SELECT 1" })),
      shutdown, // from the session store's pool
      Object.assign(new Error("the database system is starting up"), { code: "57P03" }),
    ];
    for (const err of cases) {
      expect(isDatabaseUnavailable(err)).toBe(true);
      const mini = express();
      mini.get(["/api/v1/x", "/page"], () => {
        throw err;
      });
      mini.use(errorHandler);
      const api = await request(mini).get("/api/v1/x");
      expect(api.status).toBe(503);
      expect(api.headers["retry-after"]).toBe("10");
      expect(api.body.code).toBe("database_unavailable");
      expect(api.text).not.toMatch(/ECONNREFUSED|127\.0\.0\.1|administrator|terminated|starting up/);
      const page = await request(mini).get("/page");
      expect(page.status).toBe(503);
      expect(page.headers["content-type"]).toMatch(/html/);
    }
    // ordinary database errors are not outages
    expect(isDatabaseUnavailable(new UniqueConstraintError({}))).toBe(false);
    expect(isDatabaseUnavailable(new DatabaseError(Object.assign(new Error('invalid input syntax for type integer: "x"'), { code: "22P02", sql: "" })))).toBe(false);
  });
});
