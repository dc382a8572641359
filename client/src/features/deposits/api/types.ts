/** Response shapes of /api/v1/deposits (server/src/api/deposits/deposits.detail.ts and beside it). */
import type { VersionState } from "@shared/types/dataset";

export type { DepositDetail, DepositListItem } from "@shared/types/deposit";
export type { FieldError as FieldFinding } from "@shared/validation/messages";

export const depositKeys = {
  all: ["deposits"] as const,
  lists: () => [...depositKeys.all, "list"] as const,
  details: () => [...depositKeys.all, "detail"] as const,
  detail: (id: number) => [...depositKeys.details(), id] as const,
  canonical: (versionId: number, networkId: number) => [...depositKeys.all, "canonical", versionId, networkId] as const,
  thread: (versionId: number) => [...depositKeys.all, "thread", versionId] as const,
};

export const STATE_LABELS: Record<VersionState, string> = {
  draft: "Draft",
  submitted: "Submitted, awaiting review",
  changes_requested: "Changes requested",
  published: "Published",
  declined: "Declined",
  withdrawn: "Withdrawn",
};
