/**
 * What a bundle holds: explicit network references (`TB-000042/v2/3`, any published version) or every
 * network matching a catalogue filter (latest published versions). Withdrawn and unpublished networks
 * are never included. At most BUNDLE_LIMIT networks.
 */
import { QueryTypes } from "sequelize";
import { sequelize } from "../../db/sequelize";
import { ApiError, type ErrorDetail } from "../../lib/api-error";
import { matchCatalogue } from "../catalogue/catalogue.service";
import { readCatalogueFilter, type CatalogueQuery } from "../catalogue/catalogue.schemas";
import { DEFAULT_PARTS, type BundlePart } from "./bundles.parts";

export const BUNDLE_LIMIT = 5000;

export type Selection = { kind: "refs"; refs: string[] } | { kind: "filter"; query: CatalogueQuery };

/**
 * The selection of a checked request (bundles.schemas.ts, collections.schemas.ts): `refs` (repeats
 * counted once), else the catalogue filters (`filter`, or the other fields), read by the catalogue's schema.
 */
export function parseSelection(input: Record<string, unknown>): Selection {
  const { refs, filter, ...rest } = input;
  if (refs !== undefined) {
    const list = [...new Set(refs as string[])];
    if (list.length > BUNDLE_LIMIT) throw tooMany(list.length, "refs");
    return { kind: "refs", refs: list };
  }
  const query = filter !== undefined ? readCatalogueFilter(filter as Record<string, unknown>, "/filter") : readCatalogueFilter(rest);
  return { kind: "filter", query: { ...query, page: 1, pageSize: BUNDLE_LIMIT } };
}

function tooMany(n: number, path: "refs" | "filter"): ApiError {
  const message = `A bundle holds at most ${BUNDLE_LIMIT.toLocaleString("en")} networks; this selection has ${n.toLocaleString("en")}. Narrow the filter or split the selection.`;
  return new ApiError(413, "bundle_too_large", message, [{ path, message, limit: BUNDLE_LIMIT, count: n }]);
}

export interface SelectedNetwork {
  networkId: number;
  ref: string;
  accession: string;
  version: number;
  position: number;
  kind: "bipartite" | "unipartite";
  nNodes: number;
  nRows: number | null;
  nCols: number | null;
  nLinks: number;
  weighted: boolean;
}

/** A reference that cannot be bundled, and why. */
export interface UnavailableRef {
  ref: string;
  reason: "withdrawn" | "not_published";
  message: string;
}

/**
 * The networks of a selection, in catalogue order (refs: in the order given). References that cannot be
 * bundled (withdrawn, or not a published network) are an error (422 naming each), unless `unavailable` is
 * given: then they are collected there and left out.
 */
export async function resolveSelection(sel: Selection, opts: { enforceLimit?: boolean; unavailable?: UnavailableRef[] } = {}): Promise<SelectedNetwork[]> {
  let ids: number[];
  if (sel.kind === "filter") {
    const { matches } = await matchCatalogue(sel.query);
    ids = matches.map((m) => m.networkId);
    if (opts.enforceLimit !== false && ids.length > BUNDLE_LIMIT) throw tooMany(ids.length, "filter");
  } else {
    const refsOrder = new Map(sel.refs.map((r, i) => [r, i]));
    const rows = await sequelize().query<{ ref: string; network_id: number; state: string | null }>(
      `SELECT x.ref, n.id AS network_id, v.state
       FROM unnest(ARRAY[:refs]::text[]) WITH ORDINALITY AS x(ref, ord)
       LEFT JOIN datasets d ON d.accession = split_part(x.ref, '/', 1)
       LEFT JOIN dataset_versions v ON v.dataset_id = d.id AND v.number = CAST(substr(split_part(x.ref, '/', 2), 2) AS int)
       LEFT JOIN networks n ON n.version_id = v.id AND n.position = CAST(split_part(x.ref, '/', 3) AS int)
       ORDER BY x.ord`,
      { replacements: { refs: sel.refs }, type: QueryTypes.SELECT },
    );
    const errors: ErrorDetail[] = [];
    const bad = new Set<string>();
    for (const r of rows) {
      const u: UnavailableRef | null =
        r.state === "withdrawn"
          ? { ref: r.ref, reason: "withdrawn", message: `${r.ref} was withdrawn and cannot be bundled.` }
          : r.state !== "published" || r.network_id === null
            ? { ref: r.ref, reason: "not_published", message: `${r.ref} is not a published network.` }
            : null;
      if (!u) continue;
      bad.add(r.ref);
      errors.push({ path: `refs/${refsOrder.get(r.ref)}`, message: u.message });
      opts.unavailable?.push(u);
    }
    if (errors.length && !opts.unavailable) throw ApiError.unprocessable(`${errors.length} of the references cannot be bundled.`, errors.slice(0, 50));
    ids = rows.filter((r) => !bad.has(r.ref)).map((r) => r.network_id);
  }
  if (!ids.length) return [];
  const out: SelectedNetwork[] = [];
  for (let i = 0; i < ids.length; i += 1000) {
    const chunk = ids.slice(i, i + 1000);
    const rows = await sequelize().query<{
      network_id: number;
      accession: string;
      number: number;
      position: number;
      kind: "bipartite" | "unipartite";
      n_nodes: number;
      n_rows: number | null;
      n_cols: number | null;
      n_links: number;
      weighted: boolean;
    }>(
      `SELECT n.id AS network_id, d.accession, v.number, n.position, n.kind, n.n_nodes, n.n_rows, n.n_cols, n.n_links, n.weighted
       FROM networks n JOIN dataset_versions v ON v.id = n.version_id JOIN datasets d ON d.id = v.dataset_id
       WHERE n.id IN (:ids) AND v.state = 'published'`,
      { replacements: { ids: chunk }, type: QueryTypes.SELECT },
    );
    const byId = new Map(rows.map((r) => [r.network_id, r]));
    for (const id of chunk) {
      const r = byId.get(id);
      if (!r) continue; // withdrawn since the catalogue was read
      out.push({
        networkId: r.network_id,
        ref: `${r.accession}/v${r.number}/${r.position}`,
        accession: r.accession,
        version: r.number,
        position: r.position,
        kind: r.kind,
        nNodes: r.n_nodes,
        nRows: r.n_rows,
        nCols: r.n_cols,
        nLinks: r.n_links,
        weighted: r.weighted,
      });
    }
  }
  return out;
}

/**
 * Estimated size of a bundle's files before compression: each network's matrix CSV (cells of "0," plus
 * labels, weights written longer), one metrics and one metadata line per network, the fixed files, and
 * the optional parts: a line per node (partitions, roles), per null replicate (about 100), per link
 * (edges), and the original file (about as long as its edge list).
 */
export function estimateBytes(nets: SelectedNetwork[], parts: ReadonlySet<BundlePart> = new Set(DEFAULT_PARTS)): number {
  let total = 24_000; // README, datapackage header, CSV headers
  for (const n of nets) {
    total += matrixCsvBytes(n);
    total += 200 + 600 + 40 * ((n.nCols ?? n.nNodes) + 1) + 400; // metrics.csv line, networks.csv line, datapackage resource and schema, citation share
    if (parts.has("partitions")) total += 50 * n.nNodes;
    if (parts.has("roles")) total += 80 * n.nNodes;
    if (parts.has("nulls")) total += 100 * 70;
    if (parts.has("edges")) total += 50 * n.nLinks;
    if (parts.has("originals")) total += 400 + 30 * n.nLinks;
  }
  return total;
}

/** Matrix cells of a network: rows × columns, or nodes² for a one-mode network. */
export function matrixCells(n: SelectedNetwork): number {
  return (n.nRows ?? n.nNodes) * (n.nCols ?? n.nNodes);
}

/** Estimated size of a network's matrix CSV: cells of "0," plus labels, weights written longer. */
export function matrixCsvBytes(n: SelectedNetwork): number {
  const I = n.nRows ?? n.nNodes;
  const J = n.nCols ?? n.nNodes;
  return (I + 1) * (J + 1) * 2 + (I + J) * 18 + (n.weighted ? n.nLinks * 4 : 0);
}

export function fileNameOf(ref: string): string {
  return `networks/${ref.replace(/\//g, "_")}.csv`;
}
