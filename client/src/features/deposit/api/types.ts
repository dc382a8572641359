/** Response shapes of /api/v1/deposits (server/src/api/deposits/deposits.service.ts). */
import type { DatasetDetail, VersionState } from "../../../../../shared/types/dataset";

export interface FieldFinding {
  path: string;
  message: string;
}

export interface DepositDetail extends DatasetDetail {
  versionId: number;
  lockVersion: number;
  updatedAt: string;
  editable: boolean;
  findings: { study: FieldFinding[]; networks: Array<{ networkId: number; position: number; findings: FieldFinding[] }> };
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
  canStartNewVersion: boolean;
}

export const depositKeys = {
  all: ["deposits"] as const,
  lists: () => [...depositKeys.all, "list"] as const,
  details: () => [...depositKeys.all, "detail"] as const,
  detail: (id: number) => [...depositKeys.details(), id] as const,
  canonical: (versionId: number, networkId: number) => [...depositKeys.all, "canonical", versionId, networkId] as const,
};

export const STATE_LABELS: Record<VersionState, string> = {
  draft: "Draft",
  submitted: "Submitted, awaiting review",
  changes_requested: "Changes requested",
  published: "Published",
  declined: "Declined",
  withdrawn: "Withdrawn",
};
