/** Response shapes of /api/v1/reviews (server/src/api/reviews/reviews.service.ts). */
import type { DatasetDetail } from "../../../../../shared/types/dataset";

export interface QueueItem {
  versionId: number;
  datasetId: number;
  accession: string | null;
  number: number;
  title: string;
  depositor: string;
  ownerId: number;
  submittedAt: string;
  networkCount: number;
  resubmission: boolean;
  ownDeposit: boolean;
}

export interface ReviewDetail extends DatasetDetail {
  versionId: number;
  lockVersion: number;
  editable: boolean;
  reviews: Array<{ id: number; decision: string; comment: string | null; curator: string; at: string }>;
  depositor: { id: number; displayName: string; email: string };
  ownDeposit: boolean;
  problems: Array<{ path?: string; message: string; network?: number }>;
  duplicates: Array<{ networkId: number; position: number; sha256: string; publishedAs: string[] }>;
  history: Array<{ id: number; at: string; action: string; actor: string | null; details: Record<string, unknown> }>;
}

export const reviewKeys = {
  all: ["reviews"] as const,
  queue: () => [...reviewKeys.all, "queue"] as const,
  details: () => [...reviewKeys.all, "detail"] as const,
  detail: (id: number) => [...reviewKeys.details(), id] as const,
  canonical: (versionId: number, networkId: number) => [...reviewKeys.all, "canonical", versionId, networkId] as const,
};
