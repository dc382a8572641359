/**
 * What changed between the latest submission of a version and what came before it, for the review page:
 * the previous submission of the same version (a resubmission after changes were requested), or else the
 * dataset's latest earlier published version (a new version). Both sides come from stored snapshots
 * (deposits.snapshots.ts) or from a published version's rows, which never change; so a diff never changes
 * either and is kept in a small cache.
 *
 * - Study and network metadata: field by field, as dotted paths (`locality.placeName`, `creators[0].name`).
 * - Networks are matched by id (edited in place), else by file hash, else by file name; the rest are
 *   added or removed.
 * - A matched network whose parsed form differs is compared cell by cell by node names: nodes added and
 *   removed, links added, removed and reweighted, with the first changed cells as examples. An undirected
 *   one-mode network counts each link once.
 */
import { QueryTypes } from "sequelize";
import { sequelize } from "../../db/sequelize";
import type { CanonicalNetworkJson } from "@shared/network/parse/serialize";
import type { CellChange, CellDiff, FieldChange, NetworkChange, NetworkSide, SubmissionDiff, SubmissionDiffResponse } from "@shared/types/review";
import type { Viewer } from "../datasets/datasets.service";
import { loadVisibleVersion } from "../deposits/deposits.access";

/** A network as a snapshot records it. */
export interface SnapshotNetwork {
  networkId: number;
  position: number;
  originalName: string;
  sha256: string;
  format: "matrix" | "edgelist";
  kind: "bipartite" | "unipartite";
  directed: boolean;
  weighted: boolean;
  nRows: number | null;
  nCols: number | null;
  nNodes: number;
  nLinks: number;
  totalWeight: number;
  metadata: Record<string, unknown>;
  readOptions: Record<string, unknown>;
  canonicalSha256: string;
}

/** Networks with more links than this are compared by their counts only. */
export const MAX_CELL_DIFF_LINKS = 2_000_000;
const NAMES_SHOWN = 50;
const EXAMPLES_PER_KIND = 15;

// ---------------------------------------------------------------------------------------------- fields

function flatten(value: unknown, prefix: string, out: Map<string, unknown>): void {
  if (value === undefined) return;
  if (Array.isArray(value)) {
    if (value.some((x) => x !== null && typeof x === "object")) value.forEach((x, i) => flatten(x, `${prefix}[${i}]`, out));
    else out.set(prefix, value);
    return;
  }
  if (value !== null && typeof value === "object") {
    for (const [k, v] of Object.entries(value as Record<string, unknown>)) flatten(v, prefix ? `${prefix}.${k}` : k, out);
    return;
  }
  out.set(prefix, value);
}

/** Fields whose values differ, in the order they appear (before's fields first, then new ones). */
export function fieldChanges(before: unknown, after: unknown): FieldChange[] {
  const a = new Map<string, unknown>();
  const b = new Map<string, unknown>();
  flatten(before ?? {}, "", a);
  flatten(after ?? {}, "", b);
  const paths = [...a.keys(), ...[...b.keys()].filter((k) => !a.has(k))];
  const out: FieldChange[] = [];
  for (const p of paths) {
    const x = a.has(p) ? a.get(p) : null;
    const y = b.has(p) ? b.get(p) : null;
    if (JSON.stringify(x) !== JSON.stringify(y)) out.push({ path: p, before: x, after: y });
  }
  return out;
}

// ----------------------------------------------------------------------------------------------- cells

function cellMap(c: CanonicalNetworkJson): Map<string, number> {
  const cols = c.cols ?? c.rows;
  const pairs = c.kind === "unipartite" && !c.directed;
  const m = new Map<string, number>();
  for (let i = 0; i < c.rows.length; i++) {
    for (let p = c.ptr[i]; p < c.ptr[i + 1]; p++) {
      const j = c.idx[p];
      if (pairs && j < i) continue;
      const [r, k] = pairs && cols[j] < c.rows[i] ? [cols[j], c.rows[i]] : [c.rows[i], cols[j]];
      m.set(`${r}\u0000${k}`, c.w ? c.w[p] : 1);
    }
  }
  return m;
}

function setDiff(a: string[], b: string[]): string[] {
  const s = new Set(b);
  return a.filter((x) => !s.has(x));
}

/** Two parsed forms of a network compared by node names. */
export function cellDiff(before: CanonicalNetworkJson, after: CanonicalNetworkJson): CellDiff {
  const a = cellMap(before);
  const b = cellMap(after);
  const split = (key: string): [string, string] => {
    const k = key.indexOf("\u0000");
    return [key.slice(0, k), key.slice(k + 1)];
  };
  const added: CellChange[] = [];
  const removed: CellChange[] = [];
  const reweighted: CellChange[] = [];
  let linksAdded = 0;
  let linksRemoved = 0;
  let weightsChanged = 0;
  let linksUnchanged = 0;
  for (const [key, w] of a) {
    const w2 = b.get(key);
    if (w2 === undefined) {
      linksRemoved++;
      if (removed.length < EXAMPLES_PER_KIND) removed.push({ row: split(key)[0], col: split(key)[1], before: w, after: null });
    } else if (w2 !== w) {
      weightsChanged++;
      if (reweighted.length < EXAMPLES_PER_KIND) reweighted.push({ row: split(key)[0], col: split(key)[1], before: w, after: w2 });
    } else linksUnchanged++;
  }
  for (const [key, w] of b) {
    if (a.has(key)) continue;
    linksAdded++;
    if (added.length < EXAMPLES_PER_KIND) added.push({ row: split(key)[0], col: split(key)[1], before: null, after: w });
  }
  const bip = before.kind === "bipartite" && after.kind === "bipartite";
  const rowsAdded = setDiff(after.rows, before.rows);
  const rowsRemoved = setDiff(before.rows, after.rows);
  const colsAdded = bip ? setDiff(after.cols ?? [], before.cols ?? []) : [];
  const colsRemoved = bip ? setDiff(before.cols ?? [], after.cols ?? []) : [];
  return {
    rowsAdded: rowsAdded.slice(0, NAMES_SHOWN),
    rowsRemoved: rowsRemoved.slice(0, NAMES_SHOWN),
    colsAdded: colsAdded.slice(0, NAMES_SHOWN),
    colsRemoved: colsRemoved.slice(0, NAMES_SHOWN),
    counts: { rowsAdded: rowsAdded.length, rowsRemoved: rowsRemoved.length, colsAdded: colsAdded.length, colsRemoved: colsRemoved.length },
    linksAdded,
    linksRemoved,
    weightsChanged,
    linksUnchanged,
    examples: [...reweighted, ...added, ...removed],
    undirectedPairs: after.kind === "unipartite" && !after.directed,
  };
}

// -------------------------------------------------------------------------------------------- networks

function side(n: SnapshotNetwork): NetworkSide {
  return {
    networkId: n.networkId,
    position: n.position,
    name: typeof n.metadata?.name === "string" && n.metadata.name ? n.metadata.name : n.originalName,
    originalName: n.originalName,
    sha256: n.sha256,
    kind: n.kind,
    directed: n.directed,
    format: n.format,
    nRows: n.nRows,
    nCols: n.nCols,
    nNodes: n.nNodes,
    nLinks: n.nLinks,
    totalWeight: n.totalWeight,
  };
}

function readingChanges(a: SnapshotNetwork, b: SnapshotNetwork): FieldChange[] {
  const out: FieldChange[] = [];
  if (a.sha256 !== b.sha256) out.push({ path: "file", before: `${a.originalName} (SHA-256 ${a.sha256})`, after: `${b.originalName} (SHA-256 ${b.sha256})` });
  else if (a.originalName !== b.originalName) out.push({ path: "file", before: a.originalName, after: b.originalName });
  for (const k of ["kind", "directed", "format"] as const) if (a[k] !== b[k]) out.push({ path: k, before: a[k], after: b[k] });
  for (const k of ["sheet", "missing", "blank"]) {
    const x = a.readOptions?.[k] ?? null;
    const y = b.readOptions?.[k] ?? null;
    if (x !== y) out.push({ path: k, before: x, after: y });
  }
  return out;
}

/** Pairs the networks of two submissions: by id, then by file hash, then by file name. */
export function matchNetworks(before: SnapshotNetwork[], after: SnapshotNetwork[]): Array<[SnapshotNetwork | null, SnapshotNetwork | null]> {
  const left = new Set(before);
  const pairs = new Map<SnapshotNetwork, SnapshotNetwork>();
  for (const key of ["networkId", "sha256", "originalName"] as const) {
    for (const b of after) {
      if (pairs.has(b)) continue;
      const a = [...left].find((x) => x[key] === b[key]);
      if (a) {
        pairs.set(b, a);
        left.delete(a);
      }
    }
  }
  const out: Array<[SnapshotNetwork | null, SnapshotNetwork | null]> = after.map((b) => [pairs.get(b) ?? null, b]);
  for (const a of before) if (left.has(a)) out.push([a, null]);
  return out.sort((x, y) => (x[1]?.position ?? x[0]!.position) - (y[1]?.position ?? y[0]!.position) || (x[1] ? -1 : 1));
}

export async function networkChanges(before: SnapshotNetwork[], after: SnapshotNetwork[], canonical: (sha: string, networkId: number) => Promise<CanonicalNetworkJson | null>): Promise<NetworkChange[]> {
  const out: NetworkChange[] = [];
  for (const [a, b] of matchNetworks(before, after)) {
    if (!a || !b) {
      out.push({ status: a ? "removed" : "added", before: a && side(a), after: b && side(b), reading: [], fields: [], cells: null });
      continue;
    }
    const reading = readingChanges(a, b);
    const fields = fieldChanges(a.metadata, b.metadata);
    let cells: CellDiff | null = null;
    let cellsNote: string | undefined;
    if (a.canonicalSha256 !== b.canonicalSha256) {
      if (Math.max(a.nLinks, b.nLinks) > MAX_CELL_DIFF_LINKS) cellsNote = `Too large to compare cell by cell here (more than ${MAX_CELL_DIFF_LINKS.toLocaleString("en")} links); the counts show the change.`;
      else {
        const [x, y] = await Promise.all([canonical(a.canonicalSha256, a.networkId), canonical(b.canonicalSha256, b.networkId)]);
        if (x && y) cells = cellDiff(x, y);
        else cellsNote = "The earlier parsed form is not stored, so the cells cannot be compared.";
      }
    }
    const changed = reading.length > 0 || fields.length > 0 || a.canonicalSha256 !== b.canonicalSha256 || a.position !== b.position;
    out.push({ status: changed ? "changed" : "unchanged", before: side(a), after: side(b), reading, fields, cells, ...(cellsNote ? { cellsNote } : {}) });
  }
  return out;
}

// ----------------------------------------------------------------------------------------------- loads

interface SnapshotRow {
  round: number;
  submitted_at: Date;
  metadata: Record<string, unknown>;
  networks: SnapshotNetwork[];
}

async function publishedSide(datasetId: number, beforeNumber: number): Promise<{ number: number; at: Date | null; metadata: Record<string, unknown>; networks: SnapshotNetwork[] } | null> {
  const [v] = (await sequelize().query(
    `SELECT id, number, published_at, metadata FROM dataset_versions
      WHERE dataset_id = :d AND number < :n AND state IN ('published', 'withdrawn') AND published_at IS NOT NULL
      ORDER BY number DESC LIMIT 1`,
    { replacements: { d: datasetId, n: beforeNumber }, type: QueryTypes.SELECT },
  )) as Array<{ id: number; number: number; published_at: Date | null; metadata: Record<string, unknown> }>;
  if (!v) return null;
  const networks = (await sequelize().query(
    `SELECT n.id AS "networkId", n.position, n.original_name AS "originalName", f.sha256, n.format, n.kind, n.directed, n.weighted,
            n.n_rows AS "nRows", n.n_cols AS "nCols", n.n_nodes AS "nNodes", n.n_links AS "nLinks", n.total_weight AS "totalWeight",
            n.metadata, n.read_options AS "readOptions", encode(sha256(convert_to(n.canonical::text, 'UTF8')), 'hex') AS "canonicalSha256"
       FROM networks n JOIN stored_files f ON f.id = n.file_id WHERE n.version_id = :v ORDER BY n.position`,
    { replacements: { v: v.id }, type: QueryTypes.SELECT },
  )) as SnapshotNetwork[];
  return { number: v.number, at: v.published_at, metadata: v.metadata, networks: networks.map((n) => ({ ...n, totalWeight: Number(n.totalWeight) })) };
}

/** A stored canonical form by its hash: from the snapshots, else from the network it was read from if it still has it. */
async function canonicalBySha(sha: string, networkId: number): Promise<CanonicalNetworkJson | null> {
  const [row] = (await sequelize().query(
    `(SELECT canonical FROM canonical_snapshots WHERE sha256 = :sha)
     UNION ALL
     (SELECT canonical FROM networks WHERE id = :id AND encode(sha256(convert_to(canonical::text, 'UTF8')), 'hex') = :sha)
     LIMIT 1`,
    { replacements: { sha, id: networkId }, type: QueryTypes.SELECT },
  )) as Array<{ canonical: CanonicalNetworkJson }>;
  return row?.canonical ?? null;
}

const cache = new Map<string, SubmissionDiffResponse>();
const CACHE_MAX = 64;

/** Forgets the kept diffs (tests: after the database was reset, ids start again). */
export function clearSubmissionDiffCache(): void {
  cache.clear();
}

/** The diff of a version's latest submission (curators). */
export async function submissionDiff(versionId: number, viewer: Viewer): Promise<SubmissionDiffResponse> {
  const { dataset, version } = await loadVisibleVersion(versionId, viewer);
  const snaps = (await sequelize().query(
    `SELECT round, submitted_at, metadata, networks FROM submission_snapshots WHERE version_id = :v ORDER BY round DESC LIMIT 2`,
    { replacements: { v: version.id }, type: QueryTypes.SELECT },
  )) as SnapshotRow[];
  const [current, previous] = snaps;
  if (!current) return { rounds: 0, diff: null };
  const key = `${version.id}:${current.round}`;
  const hit = cache.get(key);
  if (hit) return hit;
  let base: SubmissionDiff["base"];
  let baseMeta: Record<string, unknown>;
  let baseNets: SnapshotNetwork[];
  if (previous) {
    base = { kind: "submission", round: previous.round, at: new Date(previous.submitted_at).toISOString() };
    baseMeta = previous.metadata;
    baseNets = previous.networks;
  } else {
    const pub = await publishedSide(dataset.id, version.number);
    if (!pub) return { rounds: current.round, diff: null };
    base = { kind: "published-version", number: pub.number, at: pub.at ? new Date(pub.at).toISOString() : null };
    baseMeta = pub.metadata;
    baseNets = pub.networks;
  }
  const diff: SubmissionDiff = {
    base,
    current: { round: current.round, at: new Date(current.submitted_at).toISOString() },
    study: fieldChanges(baseMeta, current.metadata),
    networks: await networkChanges(baseNets, current.networks, canonicalBySha),
  };
  const res = { rounds: current.round, diff };
  if (cache.size >= CACHE_MAX) cache.delete(cache.keys().next().value!);
  cache.set(key, res);
  return res;
}
