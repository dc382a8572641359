/**
 * Request logs (pino-http with the app's logger settings) never carry credentials: the Bearer token, the
 * session cookie, the CSRF token and Set-Cookie are redacted, while the rest of the request is logged.
 */
import { Writable } from "node:stream";
import express from "express";
import request from "supertest";
import { pinoHttp } from "pino-http";
import { describe, expect, it, vi } from "vitest";
import { createLogger } from "../../../server/src/lib/logger";

describe("log redaction", () => {
  it("redacts Authorization, Cookie, X-CSRF-Token and Set-Cookie in request logs", async () => {
    const lines: string[] = [];
    const sink = new Writable({
      write(chunk: Buffer, _enc, cb) {
        lines.push(chunk.toString("utf8"));
        cb();
      },
    });
    const app = express();
    app.use(pinoHttp({ logger: createLogger({ level: "info", destination: sink }) }));
    app.get("/x", (_req, res) => {
      res.setHeader("Set-Cookie", "tb.sid=s%3Asession-secret-value; Path=/; HttpOnly");
      res.json({ ok: true });
    });
    await request(app).get("/x?probe=1").set("Authorization", "Bearer tb_tokensecretvalue").set("Cookie", "tb.sid=s%3Acookie-secret-value").set("X-CSRF-Token", "csrf-secret-value");
    // the request line is written when the answer finishes: wait for it
    await vi.waitFor(() => expect(lines.join("")).toContain("/x?probe=1"), { timeout: 5000, interval: 10 });
    const log = lines.join("");
    expect(log).toContain("[Redacted]");
    for (const secret of ["tb_tokensecretvalue", "cookie-secret-value", "csrf-secret-value", "session-secret-value"]) expect(log).not.toContain(secret);
  });
});
