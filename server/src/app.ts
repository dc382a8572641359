/**
 * createApp() builds the Express app (exported for supertest); index.ts only listens.
 */
import { existsSync, readFileSync } from "node:fs";
import { join } from "node:path";
import express, { type Express } from "express";
import helmet from "helmet";
import session from "express-session";
import connectPgSimple from "connect-pg-simple";
import pg from "pg";
import { pinoHttp } from "pino-http";
import { config } from "./config/env";
import { CLIENT_DIST, SCHEMAS_DIR } from "./config/paths";
import { initModels } from "./models";
import { authenticate } from "./middlewares/authenticate";
import { csrfProtection } from "./middlewares/csrf";
import { apiBody } from "./middlewares/body";
import { apiNotFound, errorHandler } from "./middlewares/error-handler";
import { apiRouter } from "./api";
import { logger } from "./lib/logger";
import { datasetHtmlRenderer, datasetPageMissing } from "./api/datasets/datasets.html";


/** Server-side renderers for specific client routes (e.g. JSON-LD on dataset pages); return null to skip. */
export type HtmlRenderer = (path: string, indexHtml: string) => Promise<string | null>;
export const htmlRenderers: HtmlRenderer[] = [datasetHtmlRenderer];

let sessionPool: pg.Pool | undefined;
export async function closeSessionPool(): Promise<void> {
  const p = sessionPool;
  sessionPool = undefined;
  await p?.end();
}

export function createApp(): Express {
  const cfg = config();
  initModels();
  const app = express();
  app.disable("x-powered-by");
  app.set("trust proxy", "loopback");

  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", "data:", "blob:"],
          fontSrc: ["'self'"],
          connectSrc: ["'self'"],
          objectSrc: ["'none'"],
          frameAncestors: ["'none'"],
          baseUri: ["'self'"],
          formAction: ["'self'"],
        },
      },
      crossOriginEmbedderPolicy: false,
    }),
  );
  app.use(pinoHttp({ logger, autoLogging: { ignore: (req) => req.url === "/api/v1/health" } }));

  if (!sessionPool) {
    // connectionTimeoutMillis: during an outage a request gets its 503 in seconds instead of hanging.
    sessionPool = new pg.Pool({ connectionString: cfg.databaseUrl, max: 5, connectionTimeoutMillis: 5_000, application_name: "tanglebank-sessions" });
    // An idle client whose connection drops (database restart, failover, a terminated backend, an idle
    // timeout) emits 'error' on the pool; without a listener Node treats it as fatal and the whole server
    // stops. The pool discards that client and opens a new one for the next request.
    sessionPool.on("error", (err) => logger.warn({ err: { message: err.message, code: (err as { code?: string }).code } }, "session store: a database connection was lost; it will be replaced"));
  }
  const PgStore = connectPgSimple(session);
  const sessionMw = session({
    store: new PgStore({
      pool: sessionPool,
      tableName: "session",
      createTableIfMissing: false,
      pruneSessionInterval: 15 * 60,
      // The hourly prune fails while the database is away: a warning, not console noise; the next one runs as usual.
      errorLog: (...args: unknown[]) => logger.warn({ err: args.find((a) => a instanceof Error)?.message }, String(args[0])),
    }),
    name: "tb.sid",
    secret: cfg.sessionSecret,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    cookie: { httpOnly: true, sameSite: "lax", secure: cfg.publicUrl.startsWith("https://"), maxAge: 14 * 24 * 3600 * 1000 },
  });

  // Public JSON Schemas at stable URLs for depositors who prepare metadata by script.
  app.use("/schemas", express.static(SCHEMAS_DIR, { index: false, extensions: ["json"], fallthrough: true }));

  const api = express.Router();
  api.use(...apiBody("2mb"));
  api.use((req, res, next) => (req.headers.authorization ? next() : sessionMw(req, res, next)));
  api.use(authenticate);
  api.use(csrfProtection);
  api.use(apiRouter());
  api.use(apiNotFound);
  app.use("/api/v1", api);
  app.use("/api", apiNotFound);

  // The built client, with the single-page-app fallback.
  if (existsSync(CLIENT_DIST)) {
    app.use(express.static(CLIENT_DIST, { index: false, maxAge: "1h", setHeaders: (res, p) => { if (p.includes("/assets/")) res.setHeader("Cache-Control", "public, max-age=31536000, immutable"); } }));
  }
  app.get(/.*/, async (req, res, next) => {
    const indexPath = join(CLIENT_DIST, "index.html");
    if (!existsSync(indexPath)) {
      res.status(503).type("text").send("The client is not built yet: run `npm run build`.");
      return;
    }
    try {
      const html = readFileSync(indexPath, "utf8");
      for (const render of htmlRenderers) {
        const out = await render(req.path, html);
        if (out !== null) {
          res.type("html").send(out);
          return;
        }
      }
      // an address of a dataset, version or network that does not exist (or is a draft): a real 404
      if (await datasetPageMissing(req.path)) {
        res.status(404).type("html").send(html.replace(/<\/head>/i, () => `<meta name="robots" content="noindex">\n</head>`));
        return;
      }
      res.type("html").send(html);
    } catch (err) {
      next(err);
    }
  });

  app.use(errorHandler);
  return app;
}
