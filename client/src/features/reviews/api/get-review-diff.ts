/** GET /reviews/:id/diff — what changed since the previous submission (or the published version it follows). */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { SubmissionDiffResponse } from "@shared/types/review";
import { reviewKeys } from "./types";

export const getReviewDiff = (id: number) => apiFetch<SubmissionDiffResponse>(`/reviews/${id}/diff`);
export const getReviewDiffQueryOptions = (id: number, submittedAt: string | null) => queryOptions({ queryKey: reviewKeys.diff(id, submittedAt), queryFn: () => getReviewDiff(id), staleTime: Infinity });
/** The submission time keys the cache: a resubmission fetches a new diff. */
export const useReviewDiff = (id: number, submittedAt: string | null) => useQuery(getReviewDiffQueryOptions(id, submittedAt));
