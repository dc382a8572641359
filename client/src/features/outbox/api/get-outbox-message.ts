import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import { outboxKeys, type OutboxMessage } from "./get-outbox";

export function getOutboxMessage(id: number): Promise<OutboxMessage> {
  return apiFetch(`/outbox/${id}`);
}

export const getOutboxMessageQueryOptions = (id: number) => queryOptions({ queryKey: outboxKeys.detail(id), queryFn: () => getOutboxMessage(id) });

export function useOutboxMessage(id: number) {
  return useQuery(getOutboxMessageQueryOptions(id));
}
