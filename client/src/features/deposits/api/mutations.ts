/**
 * The deposit's write endpoints (one function each) and a hook that runs one and refreshes the caches.
 * POST /deposits, PUT /deposits/:id/metadata, POST /deposits/:id/networks (multipart), PATCH and DELETE
 * /deposits/:id/networks/:nid, PUT /deposits/:id/networks/order, POST /deposits/:id/submit,
 * DELETE /deposits/:id, POST /datasets/:accession/versions.
 */
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "../../../lib/api-client";
import type { SheetCellProblem } from "@shared/types/deposit";
import { depositKeys, type DepositDetail } from "./types";

export const createDeposit = (metadata: unknown) => apiFetch<DepositDetail>("/deposits", { method: "POST", json: { metadata } });
export const updateStudyMetadata = (id: number, metadata: unknown) => apiFetch<DepositDetail>(`/deposits/${id}/metadata`, { method: "PUT", json: { metadata } });
/** Per file: the workbook sheet and what NA-like and blank cells mean (the upload's `fileOptions`). */
export interface FileReadOptions {
  sheet?: string;
  missing?: "no-interaction" | "not-observed";
  blank?: "no-interaction" | "not-observed";
}

export const uploadNetworks = (id: number, files: File[], opts: { kind: string; directed: boolean; fileOptions?: Record<string, FileReadOptions> }) => {
  const form = new FormData();
  form.set("kind", opts.kind);
  form.set("directed", String(opts.directed));
  if (opts.fileOptions && Object.keys(opts.fileOptions).length) form.set("fileOptions", JSON.stringify(opts.fileOptions));
  for (const f of files) form.append("files", f, f.name);
  return apiFetch<{ networks: Array<{ id: number; position: number; originalName: string }>; deposit: DepositDetail }>(`/deposits/${id}/networks`, { method: "POST", body: form });
};
export const updateNetwork = (id: number, networkId: number, changes: { metadata?: unknown; kind?: string; directed?: boolean } & FileReadOptions) =>
  apiFetch<DepositDetail>(`/deposits/${id}/networks/${networkId}`, { method: "PATCH", json: changes });
export const uploadMetadataSheet = (id: number, csv: string) => apiFetch<{ deposit: DepositDetail; cells: SheetCellProblem[]; rows: number }>(`/deposits/${id}/metadata-sheet`, { method: "PUT", json: { csv } });
export type BlockName = "locality" | "habitat" | "dates" | "sampling";
export const applyBlocks = (id: number, from: number, blocks: BlockName[]) => apiFetch<DepositDetail>(`/deposits/${id}/networks/apply`, { method: "POST", json: { from, blocks } });
export const deleteNetwork = (id: number, networkId: number) => apiFetch<DepositDetail>(`/deposits/${id}/networks/${networkId}`, { method: "DELETE" });
export const reorderNetworks = (id: number, order: number[]) => apiFetch<DepositDetail>(`/deposits/${id}/networks/order`, { method: "PUT", json: { order } });
/** `reply`: a message to the curators sent with the (re)submission; it joins the conversation. */
export const submitDeposit = (id: number, reply?: string) => apiFetch<DepositDetail>(`/deposits/${id}/submit`, { method: "POST", json: reply?.trim() ? { reply } : {} });
export const deleteDeposit = (id: number) => apiFetch<void>(`/deposits/${id}`, { method: "DELETE" });
export const startNewVersion = (accession: string) => apiFetch<DepositDetail>(`/datasets/${encodeURIComponent(accession)}/versions`, { method: "POST", json: {} });

/** Runs a deposit write; the returned detail replaces the cached one; the list is refreshed. */
export function useDepositMutation<A>(fn: (a: A) => Promise<DepositDetail | { deposit: DepositDetail } | void>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: (res) => {
      const d = res && "deposit" in res ? res.deposit : (res as DepositDetail | undefined);
      if (d && "versionId" in d) qc.setQueryData(depositKeys.detail(d.versionId), d);
      void qc.invalidateQueries({ queryKey: depositKeys.lists() });
      // A network read again has a new parsed form.
      void qc.invalidateQueries({ queryKey: [...depositKeys.all, "canonical"] });
      // A submission (and a reply sent with it) joins the conversation.
      void qc.invalidateQueries({ queryKey: [...depositKeys.all, "thread"] });
    },
  });
}
