/**
 * Metadata for many networks at once: download the sheet (one row per network, one column per field, made
 * from the schema and pre-filled), fill it in a spreadsheet, upload it back. Problems come back per cell.
 * Also a status line per network: saved, or saved with N problems.
 */
import { useState } from "react";
import { ApiClientError } from "../../../lib/api-client";
import { Alert, Button } from "../../../components/ui/form";
import type { SheetCellProblem } from "@shared/types/deposit";
import { uploadMetadataSheet, useDepositMutation } from "../api/mutations";
import type { DepositDetail } from "../api/types";

export function networkStatus(d: DepositDetail, networkId: number): { problems: number; label: string } {
  const n = d.findings.networks.find((x) => x.networkId === networkId)?.findings.length ?? 0;
  return { problems: n, label: n === 0 ? "saved, complete" : `saved with ${n} problem${n === 1 ? "" : "s"}` };
}

export function MetadataSheetPanel({ deposit }: { deposit: DepositDetail }) {
  const [file, setFile] = useState<File | null>(null);
  const [cells, setCells] = useState<SheetCellProblem[] | null>(null);
  const [inputKey, setInputKey] = useState(0);
  const upload = useDepositMutation(async (f: File) => {
    const res = await uploadMetadataSheet(deposit.versionId, await f.text());
    setCells(res.cells);
    return res;
  });
  const err = upload.error instanceof ApiClientError ? upload.error : null;
  return (
    <section aria-labelledby="sheet-heading" className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-stone-200">
      <h3 id="sheet-heading" className="text-lg font-bold text-moss-700">
        Metadata of all networks in one sheet
      </h3>
      <p className="mt-1 text-sm text-stone-700">
        For many networks: download the sheet (one row per network, one column per field, filled with what is entered so far), complete it in a spreadsheet, save it as CSV and upload it here. Leave a cell empty for a field you do not have, and say why in its <code>notRecorded.…</code> column.
      </p>
      <div className="mt-3 flex flex-wrap items-end gap-3">
        <a className="rounded border border-moss-700 px-3 py-1.5 text-sm font-semibold text-moss-700 hover:bg-moss-50" href={`/api/v1/deposits/${deposit.versionId}/metadata-sheet`} download>
          Download the metadata sheet (CSV)
        </a>
        {deposit.editable && (
          <>
            <label className="text-sm">
              <span className="block font-semibold text-stone-800">Filled-in sheet</span>
              <input key={inputKey} type="file" accept=".csv,text/csv" onChange={(e) => { setFile(e.target.files?.[0] ?? null); setCells(null); }} className="mt-1 block text-sm file:mr-3 file:rounded file:border file:border-moss-700 file:bg-white file:px-3 file:py-1.5 file:font-semibold file:text-moss-700" />
            </label>
            <Button type="button" disabled={!file} busy={upload.isPending} onClick={() => file && upload.mutate(file, { onSuccess: () => { setFile(null); setInputKey((k) => k + 1); } })}>
              Upload the sheet
            </Button>
          </>
        )}
      </div>
      {err && (
        <div className="mt-3">
          <Alert tone="error" title={err.message}>
            <ul className="list-disc pl-5">{err.details?.map((d, i) => <li key={i}>{d.message}</li>)}</ul>
          </Alert>
        </div>
      )}
      {cells && upload.isSuccess && (
        <div className="mt-3">
          {cells.length === 0 ? (
            <Alert tone="success" title="Sheet read: every network is saved and complete." />
          ) : (
            <Alert tone="info" title={`Sheet read and saved. ${cells.length} cell${cells.length === 1 ? "" : "s"} to fix:`}>
              <table className="mt-1 text-left text-sm">
                <caption className="sr-only">Problems in the uploaded sheet, by cell</caption>
                <thead>
                  <tr>
                    <th scope="col" className="pr-3">Row</th>
                    <th scope="col" className="pr-3">Column</th>
                    <th scope="col" className="pr-3">Network</th>
                    <th scope="col">Problem</th>
                  </tr>
                </thead>
                <tbody>
                  {cells.map((c, i) => (
                    <tr key={i} className="align-top">
                      <td className="pr-3 tabular-nums">{c.row}</td>
                      <td className="pr-3">{c.column ? `${c.column} (${c.columnName})` : c.columnName}</td>
                      <td className="pr-3 tabular-nums">{c.network}</td>
                      <td>{c.message}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </Alert>
          )}
        </div>
      )}
      {deposit.networks.length > 0 && (
        <ul className="mt-3 flex flex-wrap gap-2 text-sm" aria-label="Status of each network">
          {deposit.networks.map((n) => {
            const s = networkStatus(deposit, n.id);
            return (
              <li key={n.id} className={`rounded px-2 py-0.5 ring-1 ${s.problems ? "bg-lichen-300/40 ring-lichen-600" : "bg-moss-50 ring-moss-200"}`}>
                Network {n.position}: {s.label}
              </li>
            );
          })}
        </ul>
      )}
    </section>
  );
}
