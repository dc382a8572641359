/**
 * What changed since the previous submission (or the published version a new version follows): study
 * fields, then each network — added, removed, or changed with its file and reading, its size, its
 * metadata fields, and its cells compared by node names (nodes added and removed, links added, removed
 * and reweighted, the first changed cells).
 */
import type { CellDiff, FieldChange, NetworkChange } from "@shared/types/review";
import { Alert } from "../../../components/ui/form";
import { useReviewDiff } from "../api/get-review-diff";
import { formatNames, formatShape, formatValue } from "../utils/diff-format";

const STATUS: Record<NetworkChange["status"], { label: string; cls: string }> = {
  added: { label: "added", cls: "bg-green-100 text-green-900 ring-green-300" },
  removed: { label: "removed", cls: "bg-red-100 text-red-900 ring-red-300" },
  changed: { label: "changed", cls: "bg-amber-100 text-amber-900 ring-amber-300" },
  unchanged: { label: "unchanged", cls: "bg-stone-100 text-stone-800 ring-stone-300" },
};

const READING_LABELS: Record<string, string> = {
  file: "File",
  kind: "Kind",
  directed: "Directed",
  format: "Layout",
  sheet: "Workbook sheet",
  missing: "Cells marked NA, - …",
  blank: "Empty cells",
};

function FieldTable({ caption, rows, labels }: { caption: string; rows: FieldChange[]; labels?: Record<string, string> }) {
  return (
    <table className="mt-2 w-full text-left text-sm">
      <caption className="text-left font-semibold text-stone-800">{caption}</caption>
      <thead>
        <tr className="border-b border-stone-300">
          <th scope="col" className="py-1 pr-3 font-semibold">Field</th>
          <th scope="col" className="py-1 pr-3 font-semibold">Before</th>
          <th scope="col" className="py-1 font-semibold">Now</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((f) => (
          <tr key={f.path} className="border-b border-stone-100 align-top">
            <th scope="row" className="py-1 pr-3 font-normal">
              {labels?.[f.path] ?? <code>{f.path}</code>}
            </th>
            <td className="break-all py-1 pr-3 text-red-900">
              <del className="decoration-red-400">{formatValue(f.before)}</del>
            </td>
            <td className="break-all py-1 text-green-900">
              <ins className="no-underline">{formatValue(f.after)}</ins>
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

function Cells({ c, n }: { c: CellDiff; n: NetworkChange }) {
  const bip = n.after?.kind === "bipartite";
  const nodes = bip ? ["Row nodes", "Column nodes"] : ["Nodes", ""];
  const rowsLine = [formatNames("+", c.rowsAdded, c.counts.rowsAdded), formatNames("−", c.rowsRemoved, c.counts.rowsRemoved)].filter(Boolean).join("; ");
  const colsLine = [formatNames("+", c.colsAdded, c.counts.colsAdded), formatNames("−", c.colsRemoved, c.counts.colsRemoved)].filter(Boolean).join("; ");
  return (
    <div className="mt-2 text-sm" data-testid="cell-diff">
      <p className="font-semibold text-stone-800">Cells, matched by node names</p>
      <ul className="mt-1 list-disc pl-5">
        <li>
          {nodes[0]}: {rowsLine || "the same"}
        </li>
        {bip && (
          <li>
            {nodes[1]}: {colsLine || "the same"}
          </li>
        )}
        <li>
          Links: <strong>{c.linksAdded}</strong> added, <strong>{c.linksRemoved}</strong> removed, <strong>{c.weightsChanged}</strong> with a new weight, {c.linksUnchanged} unchanged
          {c.undirectedPairs ? " (each undirected link counted once)" : ""}.
        </li>
      </ul>
      {c.examples.length > 0 && (
        <table className="mt-2 text-left text-sm">
          <caption className="text-left text-stone-700">Changed cells{c.examples.length < c.linksAdded + c.linksRemoved + c.weightsChanged ? " (the first of each kind)" : ""}</caption>
          <thead>
            <tr className="border-b border-stone-300">
              <th scope="col" className="py-1 pr-4 font-semibold">{bip ? "Row" : "Node"}</th>
              <th scope="col" className="py-1 pr-4 font-semibold">{bip ? "Column" : "Node"}</th>
              <th scope="col" className="py-1 pr-4 text-right font-semibold">Before</th>
              <th scope="col" className="py-1 text-right font-semibold">Now</th>
            </tr>
          </thead>
          <tbody>
            {c.examples.map((e) => (
              <tr key={`${e.row}\u0000${e.col}`} className="border-b border-stone-100">
                <td className="py-0.5 pr-4">{e.row}</td>
                <td className="py-0.5 pr-4">{e.col}</td>
                <td className="py-0.5 pr-4 text-right tabular-nums">{e.before ?? "no link"}</td>
                <td className="py-0.5 text-right tabular-nums">{e.after ?? "no link"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </div>
  );
}

function NetworkDiff({ n }: { n: NetworkChange }) {
  const s = n.after ?? n.before!;
  const st = STATUS[n.status];
  const moved = n.before && n.after && n.before.position !== n.after.position;
  return (
    <li className="rounded border border-stone-200 p-3" data-testid="network-diff">
      <p className="flex flex-wrap items-center gap-2">
        <span className={`rounded px-2 py-0.5 text-xs font-semibold uppercase tracking-wide ring-1 ${st.cls}`}>{st.label}</span>
        <span className="font-semibold text-stone-900">
          Network {s.position}: {s.name}
        </span>
        <span className="text-sm text-stone-700">({s.originalName})</span>
      </p>
      {n.before && n.after && (
        <p className="mt-1 text-sm text-stone-800">
          {formatShape(n.before) === formatShape(n.after) ? formatShape(n.after) : `${formatShape(n.before)} → ${formatShape(n.after)}`}
          {moved ? ` · moved from position ${n.before.position} to ${n.after.position}` : ""}
        </p>
      )}
      {!n.before && n.after && <p className="mt-1 text-sm text-stone-800">New in this submission: {formatShape(n.after)}.</p>}
      {n.before && !n.after && <p className="mt-1 text-sm text-stone-800">Left out of this submission (it had {formatShape(n.before)}).</p>}
      {n.reading.length > 0 && <FieldTable caption="File and how it is read" rows={n.reading} labels={READING_LABELS} />}
      {n.fields.length > 0 && <FieldTable caption="Network metadata" rows={n.fields} />}
      {n.cells && <Cells c={n.cells} n={n} />}
      {n.cellsNote && <p className="mt-2 text-sm text-stone-700">{n.cellsNote}</p>}
    </li>
  );
}

export function SubmissionDiffSection({ versionId, submittedAt }: { versionId: number; submittedAt: string | null }) {
  const { data, error, isPending } = useReviewDiff(versionId, submittedAt);
  let body: React.ReactNode;
  if (isPending) body = <p role="status" className="mt-2 text-stone-700">Comparing with the previous submission…</p>;
  else if (error) body = <div className="mt-2"><Alert tone="error" title={error.message} /></div>;
  else if (!data.diff) body = <p className="mt-2 text-stone-700">{data.rounds === 0 ? "No earlier submission of this version is recorded." : "This is the first submission of this dataset: nothing to compare with."}</p>;
  else {
    const d = data.diff;
    const changedNets = d.networks.filter((n) => n.status !== "unchanged");
    const unchanged = d.networks.length - changedNets.length;
    body = (
      <>
        <p className="mt-1 text-stone-700">
          Submission {d.current.round} ({new Date(d.current.at).toLocaleString()}) compared with{" "}
          {d.base.kind === "submission" ? `submission ${d.base.round} (${new Date(d.base.at).toLocaleString()})` : `published version ${d.base.number}${d.base.at ? ` (${new Date(d.base.at).toLocaleDateString()})` : ""}`}, as the depositor sent them (curators’ corrections are in the history).
        </p>
        <h3 className="mt-3 font-bold text-stone-900">Study</h3>
        {d.study.length ? <FieldTable caption={`${d.study.length} field${d.study.length === 1 ? "" : "s"} changed`} rows={d.study} /> : <p className="text-sm text-stone-700">No study field changed.</p>}
        <h3 className="mt-3 font-bold text-stone-900">Networks</h3>
        {changedNets.length === 0 && <p className="text-sm text-stone-700">No network changed.</p>}
        <ul className="mt-2 grid gap-3">{changedNets.map((n) => <NetworkDiff key={`${n.before?.networkId ?? "x"}-${n.after?.networkId ?? "x"}`} n={n} />)}</ul>
        {unchanged > 0 && changedNets.length > 0 && <p className="mt-2 text-sm text-stone-700">{unchanged} other network{unchanged === 1 ? " is" : "s are"} unchanged.</p>}
      </>
    );
  }
  return (
    <section aria-labelledby="diff-h" className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-stone-200">
      <h2 id="diff-h" className="text-xl font-bold text-moss-700">
        Changes since {data?.diff?.base.kind === "published-version" ? "the published version" : "the previous submission"}
      </h2>
      {body}
    </section>
  );
}
