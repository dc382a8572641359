/**
 * Step 2's upload: choose one or more network files (CSV/TSV, .xlsx workbooks, or one zip), say how to read
 * them, see an instant preview parsed in the browser by the same engine the server uses (the server's parse
 * is authoritative), answer what it asks (which sheet of a workbook; what NA-like and blank cells mean;
 * whether a two-mode edge list should be read as bipartite), then upload with those answers.
 */
import { useState } from "react";
import { basicMetrics, parseNetworkFile, NetworkParseError, type CellMeaning, type ParseResult } from "@shared/network";
import { ApiClientError } from "../../../lib/api-client";
import { MatrixPreview } from "../../../components/network/matrix-preview";
import { Alert, Button } from "../../../components/ui/form";
import { uploadNetworks, useDepositMutation, type FileReadOptions } from "../api/mutations";

interface Preview {
  name: string;
  result?: ParseResult;
  error?: string;
  code?: string;
  extra?: Record<string, unknown>;
  zip?: boolean;
}

const PREVIEW_MAX_BYTES = 20 * 1024 * 1024;

async function previewFile(file: File, kind: "bipartite" | "unipartite", directed: boolean, read: FileReadOptions): Promise<Preview> {
  if (/\.zip$/i.test(file.name)) return { name: file.name, zip: true };
  if (file.size > PREVIEW_MAX_BYTES) return { name: file.name, error: "Too large for an instant preview; the server will parse it." };
  try {
    const bytes = new Uint8Array(await file.arrayBuffer());
    return { name: file.name, result: await parseNetworkFile(bytes, { fileName: file.name, kind, directed: kind === "unipartite" && directed, ...read }) };
  } catch (e) {
    if (e instanceof NetworkParseError) return { name: file.name, error: e.message, code: e.code, extra: e.extra };
    return { name: file.name, error: String(e) };
  }
}

const MEANINGS: Array<[CellMeaning, string]> = [
  ["no-interaction", "no interaction (0)"],
  ["not-observed", "not observed"],
];

/** A radio question: what some cells mean. */
function MeaningQuestion({ legend, name, value, onChange }: { legend: string; name: string; value: CellMeaning | undefined; onChange: (v: CellMeaning) => void }) {
  return (
    <fieldset className="mt-2 rounded bg-stone-50 p-2 ring-1 ring-lichen-400">
      <legend className="px-1 text-sm font-semibold text-stone-900">{legend}</legend>
      <div className="flex flex-wrap gap-4">
        {MEANINGS.map(([v, label]) => (
          <label key={v} className="flex items-center gap-1.5">
            <input type="radio" name={name} value={v} checked={value === v} onChange={() => onChange(v)} />
            {label}
          </label>
        ))}
      </div>
      <p className="mt-1 text-xs text-stone-700">Either way these cells hold no link in the network; the answer is recorded in the network's metadata and shown with the data.</p>
    </fieldset>
  );
}

/** What a preview still needs from the depositor before the file can be uploaded. */
export function openQuestion(p: Preview): string | null {
  if (p.code === "choose-sheet") return `${p.name}: choose the sheet`;
  if (p.code === "missing-values") return `${p.name}: say what the ${((p.extra?.markers as string[]) ?? []).join(", ")} cells mean`;
  return null;
}

export function PreviewCard({ p, read, onRead, onBipartite }: { p: Preview; read: FileReadOptions; onRead: (r: FileReadOptions) => void; onBipartite?: () => void }) {
  if (p.zip) return <li className="rounded bg-stone-50 p-3 text-sm ring-1 ring-stone-200">{p.name}: a zip; its files are previewed after upload.</li>;
  const sheets = (p.code === "choose-sheet" ? (p.extra?.sheets as string[] | undefined) : p.result?.workbook?.sheets) ?? [];
  const sheetChoice = sheets.length > 1 && (
    <label className="mt-2 flex items-center gap-2 text-sm">
      <span className="font-semibold text-stone-900">Sheet of {p.name}</span>
      <select value={read.sheet ?? ""} onChange={(e) => onRead({ ...read, sheet: e.target.value || undefined })} className="rounded border border-stone-400 bg-white px-2 py-1">
        <option value="">Choose a sheet…</option>
        {sheets.map((s) => (
          <option key={s} value={s}>
            {s}
          </option>
        ))}
      </select>
    </label>
  );
  if (p.error || !p.result) {
    const asking = p.code === "choose-sheet" || p.code === "missing-values";
    const markers = (p.extra?.markers as string[] | undefined) ?? [];
    return (
      <li className={`rounded p-3 text-sm ${asking ? "bg-white ring-2 ring-lichen-400" : "border-l-4 border-red-800 bg-red-50 text-red-900"}`}>
        <strong>{p.name}</strong>: {asking ? (p.code === "choose-sheet" ? "the workbook has several sheets with data; which one holds the network?" : `${String(p.extra?.cells)} cell(s) hold ${markers.map((m) => `“${m}”`).join(", ")} instead of a number. What do they mean?`) : p.error}
        {sheetChoice}
        {p.code === "missing-values" && <MeaningQuestion legend={`Cells marked ${markers.join(", ")} mean`} name={`missing-${p.name}`} value={read.missing} onChange={(v) => onRead({ ...read, missing: v })} />}
      </li>
    );
  }
  const net = p.result.network;
  const m = basicMetrics(net);
  const miss = p.result.missing;
  const twoMode = p.result.warnings.some((w) => w.code === "two-mode");
  return (
    <li className="flex gap-4 rounded bg-white p-3 text-sm ring-1 ring-stone-200">
      <MatrixPreview matrix={{ nRows: net.rowLabels.length, nCols: net.colLabels.length, rowPtr: net.rowPtr, colIdx: net.colIdx, weights: net.weighted ? net.weights : null }} label={`Matrix picture of ${p.name}`} size={120} />
      <div className="min-w-0 flex-1">
        <p className="font-semibold text-stone-900">
          {p.name}
          {p.result.workbook ? ` · sheet “${p.result.workbook.sheet}”` : ""}
        </p>
        <p>
          {p.result.format === "matrix" ? "matrix" : "edge list"} · {net.kind}
          {net.directed ? ", directed" : ""} · {m.rows !== null ? `${m.rows} rows × ${m.cols} columns` : `${m.nodes} nodes`} · {m.links} links · connectance {m.connectance === null ? "—" : m.connectance.toFixed(3)}
          {net.weighted ? " · weighted" : ""}
        </p>
        {sheetChoice}
        {miss.markerCells > 0 && <MeaningQuestion legend={`${miss.markerCells} cell(s) marked ${miss.markers.join(", ")} mean`} name={`missing-${p.name}`} value={read.missing} onChange={(v) => onRead({ ...read, missing: v })} />}
        {miss.blankCells > 0 && (
          <MeaningQuestion legend={`${miss.blankCells} empty cell(s) mean (the format reads them as no interaction)`} name={`blank-${p.name}`} value={read.blank ?? "no-interaction"} onChange={(v) => onRead({ ...read, blank: v })} />
        )}
        {p.result.warnings.length > 0 && (
          <ul className="mt-1 list-disc pl-5 text-lichen-600">
            {p.result.warnings.map((w, i) => (
              <li key={i} className="text-stone-800">
                Warning: {w.message}
              </li>
            ))}
          </ul>
        )}
        {twoMode && onBipartite && (
          <Button type="button" variant="secondary" className="mt-2 px-3 py-1 text-sm" onClick={onBipartite}>
            Read as bipartite (sources as rows, targets as columns)
          </Button>
        )}
      </div>
    </li>
  );
}

export function UploadPanel({ versionId }: { versionId: number }) {
  const [files, setFiles] = useState<File[]>([]);
  const [kind, setKind] = useState<"bipartite" | "unipartite">("bipartite");
  const [directed, setDirected] = useState(false);
  const [previews, setPreviews] = useState<Preview[]>([]);
  const [reads, setReads] = useState<Record<string, FileReadOptions>>({});
  const [inputKey, setInputKey] = useState(0);
  const upload = useDepositMutation((a: { files: File[] }) => uploadNetworks(versionId, a.files, { kind, directed, fileOptions: reads }));

  async function choose(list: File[], k = kind, d = directed, r = reads) {
    setFiles(list);
    setPreviews(await Promise.all(list.map((f) => previewFile(f, k, d, r[f.name] ?? {}))));
  }
  function answer(name: string, read: FileReadOptions) {
    const next = { ...reads, [name]: read };
    setReads(next);
    void choose(files, kind, directed, next);
  }
  const questions = previews.map(openQuestion).filter((q): q is string => q !== null);

  const err = upload.error instanceof ApiClientError ? upload.error : null;
  return (
    <section aria-labelledby="upload-heading" className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-stone-200">
      <h3 id="upload-heading" className="text-lg font-bold text-moss-700">
        Add network files
      </h3>
      <p className="mt-1 text-sm text-stone-700">
        One network per file: an incidence matrix (first row names the columns, first column names the rows; blank means 0), a square adjacency matrix, or an edge list with a header <code>source,target</code> and optional <code>weight</code>. CSV or TSV in UTF-8 (R&rsquo;s <code>write.csv</code> and <code>write.table</code> output and spreadsheet CSV exports are fine), or an Excel workbook (.xlsx, one sheet per network). Or one zip holding such files (at the top level or in one folder).
      </p>
      <div className="mt-4 grid gap-4 md:grid-cols-3">
        <div>
          <label htmlFor="network-files" className="block text-sm font-semibold text-stone-800">
            Files
          </label>
          <input
            key={inputKey}
            id="network-files"
            type="file"
            multiple
            accept=".csv,.tsv,.txt,.xlsx,.zip,text/csv,text/tab-separated-values,application/zip,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet"
            onChange={(e) => {
              setReads({});
              void choose(Array.from(e.target.files ?? []), kind, directed, {});
            }}
            className="mt-1 block w-full text-sm file:mr-3 file:rounded file:border file:border-moss-700 file:bg-white file:px-3 file:py-1.5 file:font-semibold file:text-moss-700"
          />
        </div>
        <fieldset>
          <legend className="text-sm font-semibold text-stone-800">Kind of network</legend>
          <div className="mt-1 flex gap-4 text-sm">
            {(["bipartite", "unipartite"] as const).map((k) => (
              <label key={k} className="flex items-center gap-1.5">
                <input type="radio" name="kind" value={k} checked={kind === k} onChange={() => { setKind(k); if (k === "bipartite") setDirected(false); void choose(files, k, k === "bipartite" ? false : directed); }} />
                {k === "bipartite" ? "bipartite (row nodes and column nodes of two kinds)" : "one-mode (e.g. food web)"}
              </label>
            ))}
          </div>
        </fieldset>
        <label className={`flex items-center gap-2 text-sm ${kind === "bipartite" ? "text-stone-500" : "text-stone-800"}`}>
          <input type="checkbox" checked={directed} disabled={kind === "bipartite"} onChange={(e) => { setDirected(e.target.checked); void choose(files, kind, e.target.checked); }} />
          Directed (cell row → column is a link; say what it means in the network's metadata)
        </label>
      </div>
      {previews.length > 0 && (
        <div className="mt-4">
          <h4 className="text-sm font-semibold text-stone-800">Instant preview (parsed in your browser)</h4>
          <ul className="mt-2 grid gap-2">
            {previews.map((p) => (
              <PreviewCard
                key={p.name}
                p={p}
                read={reads[p.name] ?? {}}
                onRead={(r) => answer(p.name, r)}
                onBipartite={() => {
                  setKind("bipartite");
                  setDirected(false);
                  void choose(files, "bipartite", false);
                }}
              />
            ))}
          </ul>
        </div>
      )}
      {err && (
        <div className="mt-4">
          <Alert tone="error" title={err.message}>
            {err.details && err.details.length > 0 && (
              <ul className="list-disc pl-5">
                {err.details.map((d, i) => (
                  <li key={i}>{d.message}</li>
                ))}
              </ul>
            )}
          </Alert>
        </div>
      )}
      <div className="mt-4 flex flex-wrap items-center gap-3">
        <Button
          type="button"
          busy={upload.isPending}
          disabled={!files.length || questions.length > 0}
          onClick={() =>
            upload.mutate(
              { files },
              {
                onSuccess: () => {
                  setFiles([]);
                  setPreviews([]);
                  setReads({});
                  setInputKey((k) => k + 1);
                },
              },
            )
          }
        >
          Upload {files.length > 1 ? `${files.length} files` : "file"}
        </Button>
        {questions.length > 0 && <p className="text-sm text-stone-800">Answer first: {questions.join("; ")}.</p>}
      </div>
    </section>
  );
}
