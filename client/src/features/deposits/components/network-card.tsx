/** One uploaded network of a deposit: summary, matrix picture, warnings, metadata form, order and delete. */
import { useEffect, useState } from "react";
import type { NetworkSummary } from "@shared/types/dataset";
import { MatrixPreview, matrixFromCanonical } from "../../../components/network/matrix-preview";
import { NetworkForm, type NetworkDraft } from "../../../components/metadata/network-form";
import { networkErrors, prune, visibleErrors } from "../../../components/metadata/validate";
import { Alert, Button } from "../../../components/ui/form";
import { useNetworkCanonical } from "../api/get-network-canonical";
import { applyBlocks, deleteNetwork, updateNetwork, useDepositMutation, type BlockName } from "../api/mutations";
import type { DepositDetail } from "../api/types";
import { networkStatus } from "./metadata-sheet-panel";

export function NetworkSummaryLine({ n }: { n: NetworkSummary }) {
  return (
    <p className="text-sm text-stone-700">
      {n.originalName} · {n.format === "matrix" ? "matrix" : "edge list"} · {n.kind}
      {n.directed ? ", directed" : ""} · {n.nRows !== null ? `${n.nRows} × ${n.nCols}` : `${n.nNodes} nodes`} · {n.nLinks} links · connectance {n.connectance === null ? "—" : n.connectance.toFixed(3)}
      {n.weighted ? " · weighted" : ""}
    </p>
  );
}

export function NetworkPicture({ versionId, n }: { versionId: number; n: NetworkSummary }) {
  const { data } = useNetworkCanonical(versionId, n.id);
  if (!data) return <div className="h-[120px] w-[120px] animate-pulse rounded bg-stone-100" aria-hidden="true" />;
  return <MatrixPreview matrix={matrixFromCanonical(data)} label={`Matrix picture of network ${n.position}, ${n.originalName}`} size={120} />;
}

/** Read the stored file again as another kind of network (e.g. a food web uploaded as bipartite). */
function ReadAs({ versionId, n }: { versionId: number; n: NetworkSummary }) {
  const [kind, setKind] = useState(n.kind);
  const [directed, setDirected] = useState(n.directed);
  const m = useDepositMutation(() => updateNetwork(versionId, n.id, { kind, directed: kind === "unipartite" && directed }));
  const changed = kind !== n.kind || (kind === "unipartite" && directed !== n.directed);
  return (
    <details className="mt-2 text-sm">
      <summary className="cursor-pointer font-semibold text-moss-700">How the file is read</summary>
      <div className="mt-2 flex flex-wrap items-center gap-4">
        <label className="flex items-center gap-1.5">
          <input type="radio" name={`kind-${n.id}`} checked={kind === "bipartite"} onChange={() => setKind("bipartite")} /> bipartite
        </label>
        <label className="flex items-center gap-1.5">
          <input type="radio" name={`kind-${n.id}`} checked={kind === "unipartite"} onChange={() => setKind("unipartite")} /> one-mode
        </label>
        <label className="flex items-center gap-1.5">
          <input type="checkbox" checked={kind === "unipartite" && directed} disabled={kind === "bipartite"} onChange={(e) => setDirected(e.target.checked)} /> directed
        </label>
        <Button type="button" variant="secondary" className="px-3 py-1 text-sm" disabled={!changed} busy={m.isPending} onClick={() => m.mutate(undefined)}>
          Read the file again
        </Button>
      </div>
      {m.error && <p role="alert" className="mt-1 text-red-800">{m.error.message}</p>}
    </details>
  );
}

/** Answers about the file that can change after upload: two-mode data read as one-mode, what NA-like or blank cells mean. */
function FileQuestions({ versionId, n }: { versionId: number; n: NetworkSummary }) {
  const m = useDepositMutation((changes: Parameters<typeof updateNetwork>[2]) => updateNetwork(versionId, n.id, changes));
  const twoMode = n.kind === "unipartite" && n.warnings.some((w) => w.code === "two-mode");
  const mv = n.metadata.missingValues;
  const other = (v: string | undefined) => (v === "not-observed" ? "no-interaction" : "not-observed");
  const label = (v: string | undefined) => (v === "not-observed" ? "not observed" : "no interaction (0)");
  if (!twoMode && !mv) return null;
  return (
    <div className="mt-2 flex flex-wrap items-center gap-2 text-sm">
      {twoMode && (
        <Button type="button" variant="secondary" className="px-3 py-1 text-sm" busy={m.isPending} onClick={() => m.mutate({ kind: "bipartite" })}>
          Read as bipartite
        </Button>
      )}
      {mv?.markerCells ? (
        <span>
          {mv.markerCells} cell(s) marked {(mv.markers ?? []).join(", ")}: {label(mv.markerMeaning)}.{" "}
          <button type="button" className="font-semibold text-moss-700 underline" onClick={() => m.mutate({ missing: other(mv.markerMeaning) })}>
            Read them as {label(other(mv.markerMeaning))}
          </button>
        </span>
      ) : null}
      {mv && mv.blankCells > 0 ? (
        <span>
          {mv.blankCells} empty cell(s): {label(mv.blankMeaning)}.{" "}
          <button type="button" className="font-semibold text-moss-700 underline" onClick={() => m.mutate({ blank: other(mv.blankMeaning) })}>
            Read them as {label(other(mv.blankMeaning))}
          </button>
        </span>
      ) : null}
      {m.error && <p role="alert" className="w-full text-red-800">{m.error.message}</p>}
    </div>
  );
}

const BLOCK_LABELS: Array<[BlockName, string]> = [
  ["locality", "locality"],
  ["habitat", "habitat"],
  ["dates", "dates"],
  ["sampling", "sampling protocol and effort"],
];

/** Copies chosen blocks of this network's saved metadata to every other network of the deposit. */
function ApplyToAll({ versionId, n, count }: { versionId: number; n: NetworkSummary; count: number }) {
  const [blocks, setBlocks] = useState<BlockName[]>(["locality", "sampling"]);
  const m = useDepositMutation(() => applyBlocks(versionId, n.id, blocks));
  if (count < 2) return null;
  return (
    <details className="mt-3 text-sm">
      <summary className="cursor-pointer font-semibold text-moss-700">Apply to all networks</summary>
      <fieldset className="mt-2 flex flex-wrap items-center gap-4">
        <legend className="sr-only">Blocks to copy from network {n.position}</legend>
        {BLOCK_LABELS.map(([b, label]) => (
          <label key={b} className="flex items-center gap-1.5">
            <input type="checkbox" checked={blocks.includes(b)} onChange={(e) => setBlocks(e.target.checked ? [...blocks, b] : blocks.filter((x) => x !== b))} /> {label}
          </label>
        ))}
        <Button type="button" variant="secondary" className="px-3 py-1 text-sm" disabled={!blocks.length} busy={m.isPending} onClick={() => m.mutate(undefined)}>
          Copy the saved {blocks.length ? blocks.join(", ") : "blocks"} of network {n.position} to the other {count - 1}
        </Button>
      </fieldset>
      {m.isSuccess && <p role="status" className="mt-1 text-moss-700">Copied to the other networks (their other fields are unchanged).</p>}
      {m.error && <p role="alert" className="mt-1 text-red-800">{m.error.message}</p>}
    </details>
  );
}

export function NetworkCard({ deposit, n, count, editable, showAll, onMove }: { deposit: DepositDetail; n: NetworkSummary; count: number; editable: boolean; showAll: boolean; onMove: (dir: -1 | 1) => void }) {
  const versionId = deposit.versionId;
  const [draft, setDraft] = useState<NetworkDraft>(n.metadata as NetworkDraft);
  const [saved, setSaved] = useState(false);
  const status = networkStatus(deposit, n.id);
  useEffect(() => setDraft(n.metadata as NetworkDraft), [n.id, n.metadata]);
  const save = useDepositMutation((meta: unknown) => updateNetwork(versionId, n.id, { metadata: meta }));
  const del = useDepositMutation(() => deleteNetwork(versionId, n.id));
  const errors = visibleErrors(networkErrors(draft, { kind: n.kind, directed: n.directed }), draft, showAll || saved);
  return (
    <li className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-stone-200">
      <div className="flex flex-wrap items-start gap-4">
        <NetworkPicture versionId={versionId} n={n} />
        <div className="min-w-0 flex-1">
          <h3 className="text-lg font-bold text-moss-700">
            Network {n.position}: {draft.name || n.originalName}
          </h3>
          <NetworkSummaryLine n={n} />
          {editable && <ReadAs key={`${n.kind}-${n.directed}`} versionId={versionId} n={n} />}
          {editable && <FileQuestions versionId={versionId} n={n} />}
          {n.warnings.length > 0 && (
            <ul className="mt-1 list-disc pl-5 text-sm text-stone-800">
              {n.warnings.map((w, i) => (
                <li key={i}>Warning: {w.message}</li>
              ))}
            </ul>
          )}
        </div>
        {editable && (
          <div className="flex gap-2">
            <button type="button" disabled={n.position === 1} onClick={() => onMove(-1)} className="rounded border border-stone-400 px-2 py-1 text-sm disabled:opacity-40">
              Move up<span className="sr-only"> network {n.position}</span>
            </button>
            <button type="button" disabled={n.position === count} onClick={() => onMove(1)} className="rounded border border-stone-400 px-2 py-1 text-sm disabled:opacity-40">
              Move down<span className="sr-only"> network {n.position}</span>
            </button>
            <button type="button" onClick={() => { if (window.confirm(`Remove network ${n.position} (${n.originalName}) from this deposit?`)) del.mutate(undefined); }} className="rounded border border-red-800 px-2 py-1 text-sm text-red-800">
              Remove<span className="sr-only"> network {n.position}</span>
            </button>
          </div>
        )}
      </div>
      <form
        className="mt-4"
        aria-label={`Metadata of network ${n.position}`}
        onSubmit={(e) => {
          e.preventDefault();
          setSaved(false);
          save.mutate(prune(draft), { onSuccess: () => setSaved(true) });
        }}
      >
        <NetworkForm value={draft} onChange={(v) => { setDraft(v); setSaved(false); }} errors={errors} kind={n.kind} directed={n.directed} disabled={!editable} />
        {editable && (
          <div className="mt-4 flex items-center gap-3">
            <Button busy={save.isPending}>Save network {n.position}</Button>
            {saved && (
              <span role="status" className={`text-sm font-semibold ${status.problems ? "text-stone-900" : "text-moss-700"}`}>
                {status.problems ? `Saved with ${status.problems} problem${status.problems === 1 ? "" : "s"} (marked above).` : "Saved, complete."}
              </span>
            )}
          </div>
        )}
        {save.error && <div className="mt-3"><Alert tone="error" title={save.error.message} /></div>}
      </form>
      {editable && <ApplyToAll versionId={versionId} n={n} count={count} />}
    </li>
  );
}
