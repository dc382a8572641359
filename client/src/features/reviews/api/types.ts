/** Response shapes of /api/v1/reviews (server/src/api/reviews/reviews.service.ts). */

export type { HistoryEntry, QueueItem, ReviewDetail } from "@shared/types/review";

export const reviewKeys = {
  all: ["reviews"] as const,
  queue: () => [...reviewKeys.all, "queue"] as const,
  details: () => [...reviewKeys.all, "detail"] as const,
  detail: (id: number) => [...reviewKeys.details(), id] as const,
  canonical: (versionId: number, networkId: number) => [...reviewKeys.all, "canonical", versionId, networkId] as const,
  thread: (versionId: number) => [...reviewKeys.all, "thread", versionId] as const,
  diff: (versionId: number, submittedAt: string | null) => [...reviewKeys.all, "diff", versionId, submittedAt] as const,
};
