import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { OutboxMessage, OutboxSummary } from "@shared/types/outbox";

export type { OutboxMessage, OutboxSummary };

export const outboxKeys = {
  all: ["outbox"] as const,
  lists: () => [...outboxKeys.all, "list"] as const,
  details: () => [...outboxKeys.all, "detail"] as const,
  detail: (id: number) => [...outboxKeys.details(), id] as const,
};

export function getOutbox(): Promise<{ data: OutboxSummary[]; meta: { total: number } }> {
  return apiFetch("/outbox");
}

export const getOutboxQueryOptions = () => queryOptions({ queryKey: outboxKeys.lists(), queryFn: getOutbox, staleTime: 0, refetchInterval: 5000 });

export function useOutbox() {
  return useQuery(getOutboxQueryOptions());
}
