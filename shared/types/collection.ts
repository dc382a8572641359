/**
 * The contract of /api/v1/collections: saved, citable sets of networks (exact dataset versions).
 * A collection's code is `TBC-` + six digits; its revision rises with every change of its members, and
 * the members of any revision can be listed again (`?revision=N`), so a citation never drifts.
 */
export type CollectionVisibility = "public" | "private";

export interface CollectionSummary {
  code: string;
  name: string;
  description: string;
  visibility: CollectionVisibility;
  owner: { id: number; displayName: string; affiliation: string | null };
  /** The current revision (members change → +1). */
  revision: number;
  createdAt: string;
  updatedAt: string;
  /** Members in the current revision, withdrawn ones included. */
  memberCount: number;
  withdrawnCount: number;
}

export interface CollectionMemberView {
  /** e.g. "TB-000042/v2/3" (an exact version) */
  ref: string;
  accession: string;
  version: number;
  position: number;
  name: string;
  datasetTitle: string;
  interactionType: string | null;
  kind: "bipartite" | "unipartite";
  nNodes: number;
  nLinks: number;
  connectance: number | null;
  state: "published" | "withdrawn";
  /** The tombstone of a withdrawn member's version. */
  withdrawal: { at: string; reason: string } | null;
  /** The dataset's newest published version, when newer than the member's (null otherwise). */
  newerVersion: number | null;
  addedAt: string;
  addedRevision: number;
}

export interface CollectionDetail extends CollectionSummary {
  /** The revision listed (the current one unless `?revision=` asked for an earlier one). */
  shownRevision: number;
  members: CollectionMemberView[];
  /** What it was saved from: the selection, or a catalogue filter (its parameters). */
  savedFrom: { kind: "selection" } | { kind: "filter"; filter: Record<string, string> } | null;
  /** Whether the signed-in user owns it (may edit). */
  isOwner: boolean;
}

export interface CollectionInput {
  name: string;
  description?: string;
  visibility?: CollectionVisibility;
  /** Members: explicit references, or every network matching a catalogue filter (latest versions, frozen). */
  refs?: string[];
  filter?: Record<string, string>;
}
