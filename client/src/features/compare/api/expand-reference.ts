/**
 * The networks a dataset version or a collection holds, for "Add" in the compare view and for opening a
 * collection in it: GET /api/v1/datasets/:accession[/versions/:n] and GET /api/v1/collections/:code.
 */
import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { DatasetDetail } from "@shared/types/dataset";
import type { CollectionDetail } from "@shared/types/collection";
import { compareKeys } from "./get-compare-rows";

export interface ExpandedSet {
  /** What was expanded, as people write it ("TB-000042 v2", "TBC-000007 “Name” revision 3"). */
  label: string;
  refs: string[];
  /** Members already withdrawn (collections keep them listed). */
  withdrawn: string[];
}

export async function expandDataset(accession: string, version: number | null): Promise<ExpandedSet> {
  const d = await apiFetch<DatasetDetail>(version === null ? `/datasets/${encodeURIComponent(accession)}` : `/datasets/${encodeURIComponent(accession)}/versions/${version}`);
  return { label: `${accession} v${d.version.number}`, refs: d.networks.map((n) => n.ref).filter((r): r is string => !!r), withdrawn: [] };
}

export async function expandCollection(code: string, revision: number | null): Promise<ExpandedSet & { name: string; shownRevision: number }> {
  const c = await apiFetch<CollectionDetail>(`/collections/${encodeURIComponent(code)}${revision ? `?revision=${revision}` : ""}`);
  return {
    label: `${c.code} “${c.name}” (revision ${c.shownRevision})`,
    name: c.name,
    shownRevision: c.shownRevision,
    refs: c.members.map((m) => m.ref),
    withdrawn: c.members.filter((m) => m.state === "withdrawn").map((m) => m.ref),
  };
}

export const getCompareCollectionQueryOptions = (code: string, revision: number | null) =>
  queryOptions({ queryKey: compareKeys.collection(code, revision), queryFn: () => expandCollection(code, revision), staleTime: 60_000, retry: false });

export function useCompareCollection(code: string | null, revision: number | null) {
  return useQuery({ ...getCompareCollectionQueryOptions(code ?? "", revision), enabled: !!code });
}
