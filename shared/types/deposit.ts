/**
 * Response shapes of /api/v1/deposits, shared by the server (server/src/api/deposits) and the client.
 */
import type { DatasetDetail, VersionState } from "./dataset";
import type { FieldError } from "../validation/messages";

export interface DepositDetail extends DatasetDetail {
  versionId: number;
  lockVersion: number;
  updatedAt: string;
  /** The owner may edit now (draft or changes requested). */
  editable: boolean;
  /** Schema findings of the current metadata (drafts may be incomplete). */
  findings: { study: FieldError[]; networks: Array<{ networkId: number; position: number; findings: FieldError[] }> };
  reviews: Array<{ id: number; decision: string; comment: string | null; curator: string; at: string }>;
}

export interface DepositListItem {
  versionId: number;
  datasetId: number;
  accession: string | null;
  number: number;
  state: VersionState;
  title: string;
  networkCount: number;
  updatedAt: string;
  submittedAt: string | null;
  publishedAt: string | null;
  lastReview: { decision: string; comment: string | null; at: string } | null;
  /** A published version whose dataset has no open draft: a new version may be started from it. */
  canStartNewVersion: boolean;
}

/** A value problem of an uploaded metadata sheet, by its cell (PUT /deposits/:id/metadata-sheet answers a list). */
export interface SheetCellProblem {
  row: number;
  column: number | null;
  columnName: string;
  field: string;
  network: number;
  message: string;
}
