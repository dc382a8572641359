/**
 * Public answers kept ready: the JSON of a dataset, a network view and a network's metrics as everyone
 * without special rights sees them, serialized once and sent again while nothing they are built from has
 * changed. A dataset's answer is built from a dozen queries (versions, networks, current runs, null
 * figures, DOIs, verified ORCID iDs); checking that none of it changed is one query.
 *
 * The check (`datasetStamp`) reads, in one statement, a stamp of every row an answer about the dataset can
 * depend on: the dataset, its owner, its versions, their networks, those networks' metric runs and null
 * figures, its DOIs, the verified ORCID iDs and the pipeline settings. Each part is the row count and the
 * sum of the rows' `xmin` (the id of the transaction that last wrote the row): any insert, update or
 * delete that has committed changes it, whatever the writer did to `updated_at`, and writes not yet
 * committed are not seen (nor are they by the answer). So a kept answer is never sent after a change has
 * committed; at worst a write that changes nothing shown (a run's heartbeat, a sign-in) costs a rebuild.
 *
 * The stamp is read before the answer is built: an answer built from newer rows than its stamp is only
 * ever replaced sooner. Owners, curators and admins are never served from here (they see exact
 * coordinates, drafts, error texts); only 200 answers are kept (404 and 410 are built each time).
 * Bounded: at most MAX_ENTRIES answers and MAX_BYTES in all, least recently used dropped first; an answer
 * over MAX_ENTRY_BYTES is not kept.
 */
import { createHash } from "node:crypto";
import type { Request, Response } from "express";
import { QueryTypes } from "sequelize";
import { sequelize } from "../db/sequelize";
import { hasRole } from "@shared/types/auth";
import type { AuthUser } from "../types";

const MAX_ENTRIES = 2000;
const MAX_BYTES = 64 * 1024 * 1024;
const MAX_ENTRY_BYTES = 8 * 1024 * 1024;

export interface DatasetStamp {
  datasetId: number;
  ownerId: number;
  stamp: string;
}

const part = (rows: string, alias: string) => `(SELECT count(*) || ':' || coalesce(sum(${alias}.xmin::text::bigint), 0) FROM ${rows})`;
const VERSIONS = `dataset_versions v WHERE v.dataset_id = d.id`;
const NETWORKS = `networks n JOIN dataset_versions v ON v.id = n.version_id WHERE v.dataset_id = d.id`;
const RUNS = `metric_runs r JOIN networks n ON n.id = r.network_id JOIN dataset_versions v ON v.id = n.version_id WHERE v.dataset_id = d.id`;
const NULLS = `metric_run_nulls f JOIN metric_runs r ON r.id = f.run_id JOIN networks n ON n.id = r.network_id JOIN dataset_versions v ON v.id = n.version_id WHERE v.dataset_id = d.id`;
const STAMP_SQL = `
  SELECT d.id AS dataset_id, d.owner_id, concat_ws('/',
           d.xmin::text,
           (SELECT u.xmin::text FROM users u WHERE u.id = d.owner_id),
           ${part(VERSIONS, "v")},
           ${part(NETWORKS, "n")},
           ${part(RUNS, "r")},
           ${part(NULLS, "f")},
           ${part("dataset_dois o WHERE o.dataset_id = d.id", "o")},
           ${part("users u WHERE u.orcid_verified_at IS NOT NULL", "u")},
           ${part("app_settings s", "s")}) AS stamp
    FROM datasets d WHERE d.accession = :accession`;

/** The stamp of everything a public answer about the dataset depends on; null for an unknown accession. */
export async function datasetStamp(accession: string): Promise<DatasetStamp | null> {
  const [row] = await sequelize().query<{ dataset_id: number; owner_id: number; stamp: string }>(STAMP_SQL, { replacements: { accession }, type: QueryTypes.SELECT });
  return row ? { datasetId: row.dataset_id, ownerId: row.owner_id, stamp: row.stamp } : null;
}

interface Entry {
  stamp: string;
  body: Buffer;
  etag: string;
}

export class AnswerCache {
  private entries = new Map<string, Entry>();
  private building = new Map<string, Promise<Entry>>();
  private bytes = 0;
  hits = 0;
  misses = 0;

  constructor(
    private maxEntries = MAX_ENTRIES,
    private maxBytes = MAX_BYTES,
    private maxEntryBytes = MAX_ENTRY_BYTES,
  ) {}

  get(key: string, stamp: string): Entry | undefined {
    const e = this.entries.get(key);
    if (!e || e.stamp !== stamp) {
      this.misses++;
      return undefined;
    }
    // most recently used last
    this.entries.delete(key);
    this.entries.set(key, e);
    this.hits++;
    return e;
  }

  set(key: string, stamp: string, value: unknown): Entry {
    const body = Buffer.from(JSON.stringify(value), "utf8");
    const e: Entry = { stamp, body, etag: `W/"${body.length.toString(16)}-${createHash("sha1").update(body).digest("base64url").slice(0, 27)}"` };
    this.drop(key);
    if (body.length > this.maxEntryBytes) return e;
    this.entries.set(key, e);
    this.bytes += body.length;
    for (const [k] of this.entries) {
      if (this.entries.size <= this.maxEntries && this.bytes <= this.maxBytes) break;
      this.drop(k);
    }
    return e;
  }

  /** The kept answer of `key` at `stamp`, or the one `build` makes (built once for requests arriving together). */
  async answer(key: string, stamp: string, build: () => Promise<unknown>): Promise<Entry> {
    const kept = this.get(key, stamp);
    if (kept) return kept;
    const pendingKey = `${key}\u0000${stamp}`;
    let p = this.building.get(pendingKey);
    if (!p) {
      p = build()
        .then((value) => this.set(key, stamp, value))
        .finally(() => this.building.delete(pendingKey));
      this.building.set(pendingKey, p);
    }
    return p;
  }

  private drop(key: string): void {
    const old = this.entries.get(key);
    if (!old) return;
    this.bytes -= old.body.length;
    this.entries.delete(key);
  }

  get size(): { entries: number; bytes: number } {
    return { entries: this.entries.size, bytes: this.bytes };
  }

  clear(): void {
    this.entries.clear();
    this.bytes = 0;
  }
}

/** The process's public answers. */
export const publicAnswers = new AnswerCache();

/** Owners, curators and admins get answers built for them, never kept ones. */
export function seesMoreThanPublic(user: AuthUser | undefined, ownerId: number): boolean {
  return !!user && (user.id === ownerId || hasRole(user, "curator"));
}

/**
 * Sends the public answer `key` about dataset `accession`: the kept one while the dataset's stamp is
 * unchanged, else built by `build` (and kept when it succeeds). Anyone who may see more than the public
 * gets `build`'s answer directly, as does a request for an unknown accession (build answers the 404).
 */
export async function sendPublicAnswer(req: Request, res: Response, accession: string, key: string, build: () => Promise<unknown>): Promise<void> {
  const stamp = await datasetStamp(accession);
  if (!stamp || seesMoreThanPublic(req.user, stamp.ownerId)) {
    res.json(await build());
    return;
  }
  const entry = await publicAnswers.answer(`${accession}\u0000${key}`, stamp.stamp, build);
  // express answers 304 itself when the request's If-None-Match holds this ETag
  res.setHeader("ETag", entry.etag);
  res.type("application/json");
  res.send(entry.body);
}
