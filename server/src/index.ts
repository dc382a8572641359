/** Starts the HTTP server (the app itself is built in app.ts); main.ts and scripts/run.ts are the processes that call it. */
import type { Server, ServerResponse } from "node:http";
import type { Socket } from "node:net";
import { createApp, closeSessionPool } from "./app";
import { config } from "./config/env";
import { closeSequelize } from "./db/sequelize";
import { closeParsePool } from "./lib/parse/pool";
import { sweepUploadTmp } from "./lib/upload-storage";

export async function startServer(port = config().port, host = config().host): Promise<{ server: Server; url: string; close: () => Promise<void> }> {
  const app = createApp();
  // temporary upload folders a killed server left behind
  void sweepUploadTmp().catch(() => undefined);
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(port, host, () => resolve(s));
    s.once("error", reject);
  });
  applyTimeouts(server);
  const addr = server.address();
  const actualPort = typeof addr === "object" && addr ? addr.port : port;
  return {
    server,
    url: `http://${host}:${actualPort}`,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

/**
 * Time limits of a connection, so a stalled client never holds a request open for long: the headers must
 * arrive within TB_HEADERS_TIMEOUT_SECONDS and the whole request within TB_REQUEST_TIMEOUT_SECONDS (Node
 * answers 408 itself), and a connection silent for TB_IDLE_TIMEOUT_SECONDS while its request is still
 * arriving (an upload that stopped sending) is answered 408 naming the limit, then closed; one whose answer
 * had begun (a client that stopped reading a download) is closed. A request received whole and still being
 * worked on (a large file being parsed, under its own time limit) is left alone.
 */
export function applyTimeouts(server: Server): void {
  const cfg = config();
  server.headersTimeout = cfg.headersTimeoutSeconds * 1000;
  server.requestTimeout = cfg.requestTimeoutSeconds * 1000;
  server.setTimeout(cfg.idleTimeoutSeconds * 1000, (socket: Socket) => {
    const res = (socket as Socket & { _httpMessage?: ServerResponse })._httpMessage;
    if (res && !res.headersSent && res.req?.complete) return; // the server is still working on it
    if (res && !res.headersSent && !socket.destroyed) {
      const body = JSON.stringify({
        code: "request_timeout",
        message: `Nothing arrived for ${cfg.idleTimeoutSeconds} seconds (the server's idle limit), so the request was stopped. Nothing was stored; send it again.`,
      });
      socket.end(`HTTP/1.1 408 Request Timeout\r\nContent-Type: application/json; charset=utf-8\r\nContent-Length: ${Buffer.byteLength(body)}\r\nConnection: close\r\n\r\n${body}`);
      setTimeout(() => socket.destroy(), 1000).unref();
    } else {
      socket.destroy();
    }
  });
}

export async function shutdownServerResources(): Promise<void> {
  await closeSessionPool();
  await closeParsePool();
  await closeSequelize();
}
