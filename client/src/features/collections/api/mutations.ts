import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { CollectionDetail, CollectionInput, CollectionVisibility } from "@shared/types/collection";
import { collectionKeys } from "./get-collections";

export function createCollection(input: CollectionInput): Promise<CollectionDetail> {
  return apiFetch("/collections", { method: "POST", json: input });
}

export function updateCollection(code: string, patch: { name?: string; description?: string; visibility?: CollectionVisibility }): Promise<CollectionDetail> {
  return apiFetch(`/collections/${code}`, { method: "PATCH", json: patch });
}

export function deleteCollection(code: string): Promise<void> {
  return apiFetch(`/collections/${code}`, { method: "DELETE" });
}

export function addMembers(code: string, refs: string[]): Promise<CollectionDetail> {
  return apiFetch(`/collections/${code}/members`, { method: "POST", json: { refs } });
}

export function removeMember(code: string, ref: string): Promise<CollectionDetail> {
  return apiFetch(`/collections/${code}/members/${ref}`, { method: "DELETE" });
}

/** Every mutation refreshes the lists and the collection it changed. */
function useCollectionMutation<A, R extends CollectionDetail | void>(fn: (a: A) => Promise<R>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: (data) => {
      if (data) qc.setQueryData(collectionKeys.detail(data.code), data);
      void qc.invalidateQueries({ queryKey: collectionKeys.all });
    },
  });
}

export const useCreateCollection = () => useCollectionMutation(createCollection);
export const useUpdateCollection = () => useCollectionMutation((a: { code: string; patch: Parameters<typeof updateCollection>[1] }) => updateCollection(a.code, a.patch));
export const useDeleteCollection = () => useCollectionMutation(deleteCollection);
export const useAddMembers = () => useCollectionMutation((a: { code: string; refs: string[] }) => addMembers(a.code, a.refs));
export const useRemoveMember = () => useCollectionMutation((a: { code: string; ref: string }) => removeMember(a.code, a.ref));
