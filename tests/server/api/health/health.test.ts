import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { resetDatabase } from "../../../setup/db";

const app = createApp();
beforeAll(resetDatabase);
afterAll(shutdownServerResources);

describe("server basics", () => {
  it("GET /api/v1/health reports the database connection", async () => {
    const res = await request(app).get("/api/v1/health");
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: "ok", database: { status: "ok" } });
  });

  it("answers unknown API routes with a JSON 404", async () => {
    const res = await request(app).get("/api/v1/no-such-thing");
    expect(res.status).toBe(404);
    expect(res.body).toEqual({ code: "not_found", message: "No API route GET /api/v1/no-such-thing" });
  });

  it("sets a Content-Security-Policy that allows only our own origin", async () => {
    const res = await request(app).get("/api/v1/health");
    const csp = res.headers["content-security-policy"];
    expect(csp).toContain("default-src 'self'");
    expect(csp).toContain("script-src 'self'");
    expect(csp).not.toMatch(/https?:/);
  });

  it("refuses a state-changing request without the CSRF token", async () => {
    const res = await request(app).post("/api/v1/auth/sign-out").send({});
    expect(res.status).toBe(403);
    expect(res.body.code).toBe("csrf_failed");
  });

  it("answers malformed JSON with 400", async () => {
    const agent = request.agent(app);
    const s = await agent.get("/api/v1/auth/session");
    const res = await agent.post("/api/v1/auth/sign-in").set("x-csrf-token", s.body.csrfToken).set("content-type", "application/json").send("{bad json");
    expect(res.status).toBe(400);
    expect(res.body.code).toBe("malformed_json");
  });
});
