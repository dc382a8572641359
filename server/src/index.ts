/** Starts the HTTP server (the app itself is built in app.ts); main.ts and scripts/run.ts are the processes that call it. */
import type { Server } from "node:http";
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
  const addr = server.address();
  const actualPort = typeof addr === "object" && addr ? addr.port : port;
  return {
    server,
    url: `http://${host}:${actualPort}`,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

export async function shutdownServerResources(): Promise<void> {
  await closeSessionPool();
  await closeParsePool();
  await closeSequelize();
}
