/**
 * Step 2's upload: choose one or more CSV/TSV files (or one zip), say how to read them, see an instant
 * preview parsed in the browser by the same engine the server uses (the server's parse is authoritative),
 * then upload.
 */
import { useState } from "react";
import { basicMetrics, parseNetworkText, NetworkParseError, type ParseResult } from "../../../../../shared/network";
import { ApiClientError } from "../../../lib/api-client";
import { MatrixPreview } from "../../../components/network/matrix-preview";
import { Alert, Button } from "../../../components/ui/form";
import { uploadNetworks, useDepositMutation } from "../api/mutations";

interface Preview {
  name: string;
  result?: ParseResult;
  error?: string;
  zip?: boolean;
}

const PREVIEW_MAX_BYTES = 20 * 1024 * 1024;

async function previewFile(file: File, kind: "bipartite" | "unipartite", directed: boolean): Promise<Preview> {
  if (/\.zip$/i.test(file.name)) return { name: file.name, zip: true };
  if (file.size > PREVIEW_MAX_BYTES) return { name: file.name, error: "Too large for an instant preview; the server will parse it." };
  try {
    const bytes = new Uint8Array(await file.arrayBuffer());
    return { name: file.name, result: parseNetworkText(bytes, { fileName: file.name, kind, directed: kind === "unipartite" && directed }) };
  } catch (e) {
    return { name: file.name, error: e instanceof NetworkParseError ? e.message : String(e) };
  }
}

export function PreviewCard({ p }: { p: Preview }) {
  if (p.zip) return <li className="rounded bg-stone-50 p-3 text-sm ring-1 ring-stone-200">{p.name}: a zip; its files are previewed after upload.</li>;
  if (p.error || !p.result)
    return (
      <li className="rounded border-l-4 border-red-800 bg-red-50 p-3 text-sm text-red-900">
        <strong>{p.name}</strong>: {p.error}
      </li>
    );
  const net = p.result.network;
  const m = basicMetrics(net);
  return (
    <li className="flex gap-4 rounded bg-white p-3 text-sm ring-1 ring-stone-200">
      <MatrixPreview matrix={{ nRows: net.rowLabels.length, nCols: net.colLabels.length, rowPtr: net.rowPtr, colIdx: net.colIdx, weights: net.weighted ? net.weights : null }} label={`Matrix picture of ${p.name}`} size={120} />
      <div>
        <p className="font-semibold text-stone-900">{p.name}</p>
        <p>
          {p.result.format === "matrix" ? "matrix" : "edge list"} · {net.kind}
          {net.directed ? ", directed" : ""} · {m.rows !== null ? `${m.rows} rows × ${m.cols} columns` : `${m.nodes} nodes`} · {m.links} links · connectance {m.connectance === null ? "—" : m.connectance.toFixed(3)}
          {net.weighted ? " · weighted" : ""}
        </p>
        {p.result.warnings.length > 0 && (
          <ul className="mt-1 list-disc pl-5 text-lichen-600">
            {p.result.warnings.map((w, i) => (
              <li key={i} className="text-stone-800">
                Warning: {w.message}
              </li>
            ))}
          </ul>
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
  const [inputKey, setInputKey] = useState(0);
  const upload = useDepositMutation((a: { files: File[] }) => uploadNetworks(versionId, a.files, { kind, directed }));

  async function choose(list: File[], k = kind, d = directed) {
    setFiles(list);
    setPreviews(await Promise.all(list.map((f) => previewFile(f, k, d))));
  }

  const err = upload.error instanceof ApiClientError ? upload.error : null;
  return (
    <section aria-labelledby="upload-heading" className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-stone-200">
      <h3 id="upload-heading" className="text-lg font-bold text-moss-700">
        Add network files
      </h3>
      <p className="mt-1 text-sm text-stone-700">
        One network per file: an incidence matrix (first row names the columns, first column names the rows; blank means 0), a square adjacency matrix, or an edge list with a header <code>source,target</code> and optional <code>weight</code>. CSV or TSV, UTF-8. Or one zip holding such files (at the top level or in one folder).
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
            accept=".csv,.tsv,.txt,.zip,text/csv,text/tab-separated-values,application/zip"
            onChange={(e) => void choose(Array.from(e.target.files ?? []))}
            className="mt-1 block w-full text-sm file:mr-3 file:rounded file:border file:border-moss-700 file:bg-white file:px-3 file:py-1.5 file:font-semibold file:text-moss-700"
          />
        </div>
        <fieldset>
          <legend className="text-sm font-semibold text-stone-800">Kind of network</legend>
          <div className="mt-1 flex gap-4 text-sm">
            {(["bipartite", "unipartite"] as const).map((k) => (
              <label key={k} className="flex items-center gap-1.5">
                <input type="radio" name="kind" value={k} checked={kind === k} onChange={() => { setKind(k); if (k === "bipartite") setDirected(false); void choose(files, k, k === "bipartite" ? false : directed); }} />
                {k === "bipartite" ? "bipartite (two levels)" : "one-mode (e.g. food web)"}
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
          <ul className="mt-2 grid gap-2">{previews.map((p) => <PreviewCard key={p.name} p={p} />)}</ul>
        </div>
      )}
      {err && (
        <div className="mt-4">
          <Alert tone="error" title={err.message}>
            {err.details && err.details.length > 0 && (
              <ul className="list-disc pl-5">
                {err.details.map((d, i) => (
                  <li key={i}>
                    {d.message}
                    {d.row ? ` (row ${d.row}${d.column ? `, column ${d.column}` : ""})` : ""}
                  </li>
                ))}
              </ul>
            )}
          </Alert>
        </div>
      )}
      <div className="mt-4">
        <Button
          type="button"
          busy={upload.isPending}
          disabled={!files.length}
          onClick={() =>
            upload.mutate(
              { files },
              {
                onSuccess: () => {
                  setFiles([]);
                  setPreviews([]);
                  setInputKey((k) => k + 1);
                },
              },
            )
          }
        >
          Upload {files.length > 1 ? `${files.length} files` : "file"}
        </Button>
      </div>
    </section>
  );
}
