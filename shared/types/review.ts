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
