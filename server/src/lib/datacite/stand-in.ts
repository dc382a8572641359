/**
 * A local stand-in for DataCite's REST API, run by `npm start` and by the tests (like the mail catcher),
 * so DOIs are registered through the real protocol offline. It speaks the subset Tanglebank uses:
 *
 *   POST /dois                 create (JSON:API; event publish → findable, register/hide → registered, none → draft)
 *   PUT  /dois/{prefix}/{suffix}  update the attributes given (and move the state by `event`)
 *   GET  /dois/{prefix}/{suffix}  read one DOI; GET /dois?prefix=… lists them; GET /heartbeat
 *   GET  /resolve/{doi}        what a DOI resolver does: 302 to the registered URL (404 for drafts and unknown DOIs)
 *
 * Writes need HTTP Basic authentication with the repository account, and the DOI must carry the account's
 * prefix (DataCite's test prefix 10.5072 by default, so a demo DOI can never be mistaken for a real one).
 * Registered and findable DOIs are validated against the fields DataCite requires (required-fields.ts);
 * errors are DataCite-shaped: `{ errors: [{ status, source, title }] }` with 401, 404 or 422. A DOI is
 * never deleted. `failNext(n)` makes the next n writes answer 503 (tests of retries).
 */
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import type { Server } from "node:http";
import { dirname } from "node:path";
import express, { type Request, type Response } from "express";
import { Ajv } from "ajv";
import { dataciteAttributesSchema } from "./required-fields";

export interface StandInDoi {
  id: string;
  type: "dois";
  attributes: Record<string, unknown> & { doi: string; prefix: string; suffix: string; state: "draft" | "registered" | "findable"; created: string; updated: string; registered: string | null };
}

export interface StandInOptions {
  repositoryId: string;
  password: string;
  prefix: string;
  /** A JSON file that keeps the DOIs across restarts (npm start). */
  storeFile?: string;
}

type ErrorItem = { status: string; source?: string; title: string };

const ajv = new Ajv({ allErrors: true, strict: false });
const validateAttributes = ajv.compile(dataciteAttributesSchema);

/** DataCite-shaped messages for what the schema refused. */
export function requiredFieldErrors(attributes: Record<string, unknown>): ErrorItem[] {
  if (validateAttributes(attributes)) return [];
  return (validateAttributes.errors ?? []).map((e) => {
    const path = e.instancePath.replace(/^\//, "").replace(/\//g, ".");
    if (e.keyword === "required") {
      const field = (e.params as { missingProperty: string }).missingProperty;
      return { status: "422", source: path ? `${path}.${field}` : field, title: "can't be blank" };
    }
    if (e.keyword === "minItems") return { status: "422", source: path, title: "can't be blank" };
    return { status: "422", source: path || "attributes", title: e.keyword === "enum" ? `is not included in the list (${(e.params as { allowedValues: unknown[] }).allowedValues.slice(0, 6).join(", ")}…)` : (e.message ?? "is invalid") };
  });
}

export class DataciteStandIn {
  readonly dois = new Map<string, StandInDoi>();
  /** How many times each DOI was created (a second creation is refused, so this stays at 1). */
  readonly creations = new Map<string, number>();
  /** Every write received: method, DOI and status answered. */
  readonly writes: Array<{ method: string; doi: string; status: number }> = [];
  private failures = 0;
  private failStatus = 503;
  private server?: Server;
  port = 0;

  constructor(private readonly opts: StandInOptions) {
    if (opts.storeFile && existsSync(opts.storeFile)) {
      try {
        for (const d of JSON.parse(readFileSync(opts.storeFile, "utf8")) as StandInDoi[]) this.dois.set(d.id, d);
      } catch {
        /* an unreadable store starts empty */
      }
    }
  }

  get url(): string {
    return `http://127.0.0.1:${this.port}`;
  }

  /** The next `n` writes answer `status` (an outage) before anything is stored. */
  failNext(n: number, status = 503): void {
    this.failures = n;
    this.failStatus = status;
  }

  private persist(): void {
    if (!this.opts.storeFile) return;
    mkdirSync(dirname(this.opts.storeFile), { recursive: true });
    writeFileSync(this.opts.storeFile, JSON.stringify([...this.dois.values()], null, 1));
  }

  private authorised(req: Request): boolean {
    const m = /^Basic\s+(.+)$/i.exec(req.headers.authorization ?? "");
    if (!m) return false;
    const [user, ...rest] = Buffer.from(m[1], "base64").toString("utf8").split(":");
    return user === this.opts.repositoryId && rest.join(":") === this.opts.password;
  }

  private fail(res: Response, status: number, errors: ErrorItem[] | string, doi = "") {
    const list = typeof errors === "string" ? [{ status: String(status), title: errors }] : errors;
    if (doi) this.writes.push({ method: res.req.method, doi, status });
    res.status(status).type("application/vnd.api+json").json({ errors: list });
  }

  app(): express.Express {
    const app = express();
    app.use(express.json({ type: ["application/json", "application/vnd.api+json"], limit: "1mb" }));
    app.get("/heartbeat", (_req, res) => void res.type("text").send("OK"));

    // Express 5 gives a wildcard as its decoded path segments
    const doiOf = (req: Request) => {
      const p = (req.params as { doi?: string[] | string }).doi;
      return (Array.isArray(p) ? p.join("/") : String(p ?? "")).toLowerCase();
    };

    app.get("/dois", (req, res) => {
      const prefix = typeof req.query.prefix === "string" ? req.query.prefix : undefined;
      const data = [...this.dois.values()].filter((d) => !prefix || d.attributes.prefix === prefix);
      res.type("application/vnd.api+json").json({ data, meta: { total: data.length } });
    });
    app.get("/dois/*doi", (req, res) => {
      const d = this.dois.get(doiOf(req));
      if (!d) return this.fail(res, 404, "The resource you are looking for doesn't exist.");
      res.type("application/vnd.api+json").json({ data: d });
    });
    app.get("/resolve/*doi", (req, res) => {
      const d = this.dois.get(doiOf(req));
      if (!d || d.attributes.state === "draft" || typeof d.attributes.url !== "string") return void res.status(404).type("text").send("DOI not found");
      res.redirect(302, d.attributes.url);
    });

    const write = (req: Request, res: Response, existing: StandInDoi | undefined, doiFromPath?: string) => {
      if (!this.authorised(req)) return this.fail(res, 401, "Bad credentials.", doiFromPath ?? "?");
      const body = req.body as { data?: { type?: string; id?: string; attributes?: Record<string, unknown> } } | undefined;
      const attrs = body?.data?.attributes;
      if (!body?.data || body.data.type !== "dois" || !attrs || typeof attrs !== "object") {
        return this.fail(res, 422, [{ status: "422", source: "data", title: 'expected a JSON:API document { "data": { "type": "dois", "attributes": { … } } }' }], doiFromPath ?? "?");
      }
      const doi = String(doiFromPath ?? attrs.doi ?? body.data.id ?? "").toLowerCase();
      if (this.failures > 0) {
        this.failures--;
        return this.fail(res, this.failStatus, "The service is temporarily unavailable (stand-in outage).", doi || "?");
      }
      if (!doi) return this.fail(res, 422, [{ status: "422", source: "doi", title: "can't be blank" }], "?");
      const prefix = doi.split("/")[0];
      if (prefix !== this.opts.prefix) return this.fail(res, 403, [{ status: "403", source: "doi", title: `The prefix ${prefix} is not assigned to repository ${this.opts.repositoryId}.` }], doi);
      if (!existing && this.dois.has(doi)) return this.fail(res, 422, [{ status: "422", source: "doi", title: "This DOI has already been taken" }], doi);
      const { event, doi: _d, prefix: _p, suffix: _s, state: _st, ...given } = attrs as Record<string, unknown>;
      void _d; void _p; void _s; void _st;
      const before = existing?.attributes.state ?? "draft";
      let state = before;
      if (event === "publish") state = "findable";
      else if (event === "register" || event === "hide") state = "registered";
      else if (event !== undefined && event !== null) return this.fail(res, 422, [{ status: "422", source: "event", title: "must be publish, register or hide" }], doi);
      const merged: Record<string, unknown> = { ...(existing?.attributes ?? {}), ...given, doi };
      if (state !== "draft") {
        const errors = requiredFieldErrors(merged);
        if (!merged.url) errors.push({ status: "422", source: "url", title: "can't be blank" });
        if (errors.length) return this.fail(res, 422, errors, doi);
      }
      const now = new Date().toISOString();
      const record: StandInDoi = {
        id: doi,
        type: "dois",
        attributes: {
          ...merged,
          doi,
          prefix,
          suffix: doi.slice(prefix.length + 1),
          state,
          created: existing?.attributes.created ?? now,
          updated: now,
          registered: existing?.attributes.registered ?? (state !== "draft" ? now : null),
        },
      };
      this.dois.set(doi, record);
      if (!existing) this.creations.set(doi, (this.creations.get(doi) ?? 0) + 1);
      this.persist();
      const status = existing ? 200 : 201;
      this.writes.push({ method: req.method, doi, status });
      res.status(status).type("application/vnd.api+json").json({ data: record });
    };
    app.post("/dois", (req, res) => write(req, res, undefined));
    app.put("/dois/*doi", (req, res) => {
      const doi = doiOf(req);
      const existing = this.dois.get(doi);
      if (!existing) return this.fail(res, 404, "The resource you are looking for doesn't exist.", doi);
      write(req, res, existing, doi);
    });
    app.use((_req: Request, res: Response) => this.fail(res, 404, "The resource you are looking for doesn't exist."));
    return app;
  }

  listen(port: number, host = "127.0.0.1"): Promise<number> {
    return new Promise((resolve, reject) => {
      const s = this.app().listen(port, host, () => {
        const a = s.address();
        this.port = typeof a === "object" && a ? a.port : port;
        resolve(this.port);
      });
      s.once("error", reject);
      this.server = s;
    });
  }

  close(): Promise<void> {
    return new Promise((resolve) => (this.server ? this.server.close(() => resolve()) : resolve()));
  }
}
