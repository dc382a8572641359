/**
 * Response shapes of /api/v1/reviews, shared by the server (server/src/api/reviews) and the client.
 */
import type { DepositDetail } from "./deposit";

export interface QueueItem {
  versionId: number;
  datasetId: number;
  accession: string | null;
  number: number;
  state: "submitted" | "changes_requested" | "published" | "declined" | "withdrawn";
  title: string;
  depositor: string;
  ownerId: number;
  submittedAt: string;
  /** Last change of state or content. */
  updatedAt: string;
  networkCount: number;
  resubmission: boolean;
  ownDeposit: boolean;
}

export interface HistoryEntry {
  id: number;
  at: string;
  action: string;
  actor: string | null;
  details: Record<string, unknown>;
}

export interface ReviewDetail extends DepositDetail {
  depositor: { id: number; displayName: string; email: string };
  ownDeposit: boolean;
  /** Full submission validation (what would stop publication). */
  problems: Array<{ path?: string; message: string; network?: number }>;
  /** Networks whose file (same SHA-256) is already published in another dataset. */
  duplicates: Array<{ networkId: number; position: number; sha256: string; publishedAs: string[] }>;
  history: HistoryEntry[];
}

/** One field whose value differs between two submissions (dotted path, e.g. `locality.placeName`). */
export interface FieldChange {
  path: string;
  before: unknown;
  after: unknown;
}

/** What a network was in one submission: its file and its size. */
export interface NetworkSide {
  networkId: number;
  position: number;
  name: string;
  originalName: string;
  sha256: string;
  kind: "bipartite" | "unipartite";
  directed: boolean;
  format: "matrix" | "edgelist";
  nRows: number | null;
  nCols: number | null;
  nNodes: number;
  nLinks: number;
  totalWeight: number;
}

/** A cell whose value differs: `before`/`after` null where there was no link. */
export interface CellChange {
  row: string;
  col: string;
  before: number | null;
  after: number | null;
}

/** The matrices of two submissions of one network compared cell by cell, matched by node names. */
export interface CellDiff {
  rowsAdded: string[];
  rowsRemoved: string[];
  /** One-mode networks: empty (their nodes are in `rows…`). */
  colsAdded: string[];
  colsRemoved: string[];
  /** Counts of each node list (the lists are cut to the first 50 names). */
  counts: { rowsAdded: number; rowsRemoved: number; colsAdded: number; colsRemoved: number };
  linksAdded: number;
  linksRemoved: number;
  weightsChanged: number;
  linksUnchanged: number;
  /** The first changed cells in row order (at most 40). */
  examples: CellChange[];
  /** An undirected one-mode network: each link counted once. */
  undirectedPairs: boolean;
}

export interface NetworkChange {
  status: "added" | "removed" | "changed" | "unchanged";
  before: NetworkSide | null;
  after: NetworkSide | null;
  /** The file, kind, direction, layout and reading options (sheet, meaning of NA and blank cells). */
  reading: FieldChange[];
  /** Network metadata fields. */
  fields: FieldChange[];
  /** Null when the parsed networks are identical, or one side is missing, or too large to compare. */
  cells: CellDiff | null;
  /** Why cells were not compared although the networks differ. */
  cellsNote?: string;
}

/**
 * Between the latest submission of a version and what came before it: the previous submission of the same
 * version (a resubmission), or else the dataset's latest published version (a new version).
 */
export interface SubmissionDiff {
  base: { kind: "submission"; round: number; at: string } | { kind: "published-version"; number: number; at: string | null };
  current: { round: number; at: string };
  study: FieldChange[];
  networks: NetworkChange[];
}

export interface SubmissionDiffResponse {
  /** Submissions of this version so far (1 = first submission). */
  rounds: number;
  /** Null when there is nothing to compare with (a first submission of a first version). */
  diff: SubmissionDiff | null;
}

/** One entry of a submission's conversation, oldest first. */
export type ThreadEntry =
  | { kind: "comment"; id: number; at: string; side: "depositor" | "curator"; author: string; body: string; round: number; own: boolean }
  | { kind: "decision"; id: number; at: string; decision: "publish" | "request_changes" | "decline"; author: string; body: string | null }
  | { kind: "submitted"; id: number; at: string; round: number; author: string };

export interface ThreadResponse {
  entries: ThreadEntry[];
  /** The viewer may add a comment now (the version has been submitted; owner or curator). */
  canComment: boolean;
  /** The side the viewer writes for on this submission. */
  side: "depositor" | "curator";
}
