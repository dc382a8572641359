/**
 * A submitted network in full, with the matrix view of the network pages (no partition exists before
 * publication, so rows and columns are ordered by decreasing degree; large networks are drawn with several
 * cells per pixel). Drawn when opened, so a study of 40 networks does not draw 40 matrices at once.
 */
import { useMemo, useState } from "react";
import type { NetworkSummary } from "@shared/types/dataset";
import type { CanonicalNetworkJson } from "@shared/network/parse/serialize";
import { ModuleMatrix, type ModuleMatrixData } from "../../../components/network/module-matrix";
import { useReviewCanonical } from "../api/get-review";

function FullMatrix({ versionId, n }: { versionId: number; n: NetworkSummary }) {
  const { data, error } = useReviewCanonical(versionId, n.id);
  const view = useMemo<ModuleMatrixData | null>(() => (data ? fromCanonical(data, n) : null), [data, n]);
  if (error) return <p role="alert" className="text-red-800">The network could not be loaded: {error.message}</p>;
  if (!view) return <p role="status" className="text-stone-700">Loading the network…</p>;
  return <ModuleMatrix id={`review-matrix-${n.id}`} view={view} title={`Matrix of network ${n.position}, ordered by degree`} />;
}

function fromCanonical(c: CanonicalNetworkJson, n: NetworkSummary): ModuleMatrixData {
  return {
    kind: c.kind,
    directed: c.directed,
    nLinks: n.nLinks,
    rowLabels: c.rows,
    colLabels: c.cols ?? c.rows,
    cells: { ptr: c.ptr, idx: c.idx, w: c.w },
    rowModules: null,
    colModules: null,
    metadata: { rowLevel: n.metadata.rowLevel, colLevel: n.metadata.colLevel },
  };
}

export function ReviewMatrix({ versionId, n, initiallyOpen }: { versionId: number; n: NetworkSummary; initiallyOpen: boolean }) {
  const [open, setOpen] = useState(initiallyOpen);
  return (
    <details className="mt-4 border-t border-stone-200 pt-3" open={open} onToggle={(e) => setOpen(e.currentTarget.open)}>
      <summary className="cursor-pointer font-semibold text-moss-700">The whole matrix of network {n.position}</summary>
      <div className="mt-2">{open && <FullMatrix versionId={versionId} n={n} />}</div>
    </details>
  );
}
