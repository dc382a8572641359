/**
 * /compare?refs=TB-000001/v1/1,… — networks side by side: Q or z (toggle) against connectance and against
 * S, coloured by interaction type; a metrics table; CSV and SVG exports. The selection lives in the URL.
 */
import { useRef, useState, type FormEvent } from "react";
import { Link, useSearchParams } from "react-router-dom";
import type { NetworkCompareRow } from "../../../../../shared/types/network-view";
import { paths } from "../../../config/paths";
import { ChartFigure } from "../../../components/charts/chart-figure";
import { Legend } from "../../../components/charts/legend";
import { Scatter, type ScatterPoint } from "../../../components/charts/scatter";
import { interactionTypeColour, interactionTypeLabel } from "../../../components/charts/theme";
import { useCompareRows } from "../api/get-compare-rows";
import { compareCsv, downloadText, serializeSvg } from "../utils/export";

type Measure = "Q" | "z";
const REF_RE = /^TB-\d{6}\/v\d+\/\d+$/;
const fmt = (v: number | null | undefined, d = 3) => (v === null || v === undefined || !Number.isFinite(v) ? "—" : v.toFixed(d));
const btn = "rounded border border-moss-700 px-3 py-1.5 text-sm font-semibold text-moss-700 hover:bg-moss-50";

function measureOf(r: NetworkCompareRow, m: Measure): number | null {
  const v = m === "Q" ? r.metrics.Q : r.metrics.z;
  return v === null || v === undefined || !Number.isFinite(v) ? null : v;
}

export function ComparePage() {
  const [params, setParams] = useSearchParams();
  const refs = (params.get("refs") ?? "").split(",").map((s) => s.trim()).filter(Boolean);
  const measure: Measure = params.get("y") === "z" ? "z" : "Q";
  const q = useCompareRows(refs);
  const [input, setInput] = useState("");
  const [inputError, setInputError] = useState<string | null>(null);
  const svgC = useRef<SVGSVGElement>(null);
  const svgS = useRef<SVGSVGElement>(null);

  function setRefs(next: string[]) {
    const p = new URLSearchParams(params);
    if (next.length) p.set("refs", next.join(","));
    else p.delete("refs");
    setParams(p);
  }
  function setMeasure(m: Measure) {
    const p = new URLSearchParams(params);
    p.set("y", m);
    setParams(p, { replace: true });
  }
  function add(e: FormEvent) {
    e.preventDefault();
    const r = input.trim();
    if (!REF_RE.test(r)) return setInputError("Write a network reference like TB-000042/v2/3.");
    if (refs.includes(r)) return setInputError(`${r} is already in the comparison.`);
    setInputError(null);
    setInput("");
    setRefs([...refs, r]);
  }

  const rows = q.data ?? [];
  const types = [...new Set(rows.map((r) => r.interactionType))].sort();
  const yLabel = measure === "Q" ? "Optimized modularity Q (unitless)" : "Modularity z-score (null-model sd units)";
  const withY = rows.filter((r) => measureOf(r, measure) !== null);
  const point = (x: number): ((r: NetworkCompareRow) => ScatterPoint) => (r) => ({
    id: r.ref,
    x: x === 0 ? (r.connectance ?? 0) : r.nNodes,
    y: measureOf(r, measure)!,
    colour: interactionTypeColour[r.interactionType] ?? "#000",
    title: `${r.ref} ${r.name} (${interactionTypeLabel[r.interactionType] ?? r.interactionType}): ${measure} = ${fmt(measureOf(r, measure), measure === "Q" ? 3 : 2)}, C = ${fmt(r.connectance, 3)}, S = ${r.nNodes}`,
  });
  const byC = withY.filter((r) => r.connectance !== null).map(point(0));
  const byS = withY.map(point(1));
  const coincident = (pts: ScatterPoint[]) => pts.length - new Set(pts.map((p) => `${p.x}|${p.y}`)).size;
  const overlapNote = (pts: ScatterPoint[]) => (coincident(pts) > 0 ? ` ${coincident(pts)} point(s) sit exactly on another one (identical values); the table lists them all.` : "");
  const objectives = new Set(rows.map((r) => r.metrics.objective).filter(Boolean));

  return (
    <div className="space-y-6">
      <header>
        <h1 className="text-2xl font-bold text-moss-700">Compare networks</h1>
        <p className="mt-1 max-w-3xl text-stone-700">
          Networks side by side. Raw Q depends on size, connectance and sampling effort, so plot z (or read Q<sub>rel</sub> in the table) when the networks
          differ in those.
        </p>
      </header>

      <section aria-labelledby="sel-h" className="rounded-lg bg-white p-4 ring-1 ring-stone-200">
        <h2 id="sel-h" className="text-lg font-bold text-moss-700">
          Selection ({refs.length})
        </h2>
        {refs.length === 0 && (
          <p className="mt-2 text-stone-700">
            No networks chosen yet. Pick them in the{" "}
            <Link className="text-moss-700 underline" to={paths.catalogue.href()}>
              catalogue
            </Link>{" "}
            or add a reference below.
          </p>
        )}
        <ul className="mt-2 flex flex-wrap gap-2">
          {refs.map((r) => (
            <li key={r} className="flex items-center gap-1 rounded-full bg-moss-50 py-0.5 pr-1 pl-3 text-sm ring-1 ring-moss-200">
              <span className="font-mono">{r}</span>
              <button type="button" className="rounded-full px-2 text-moss-700 hover:bg-moss-100" aria-label={`Remove ${r}`} onClick={() => setRefs(refs.filter((x) => x !== r))}>
                ×
              </button>
            </li>
          ))}
        </ul>
        <form className="mt-3 flex flex-wrap items-end gap-2" onSubmit={add} noValidate>
          <div>
            <label htmlFor="add-ref" className="block text-sm font-semibold text-stone-800">
              Add a network
            </label>
            <input
              id="add-ref"
              value={input}
              onChange={(e) => setInput(e.target.value)}
              placeholder="TB-000042/v2/3"
              aria-invalid={inputError ? true : undefined}
              aria-describedby={inputError ? "add-ref-error" : undefined}
              className="mt-1 rounded border border-stone-400 px-2 py-1 font-mono"
            />
          </div>
          <button type="submit" className={btn}>
            Add
          </button>
          {inputError && (
            <p id="add-ref-error" className="w-full text-sm text-red-800">
              {inputError}
            </p>
          )}
        </form>
      </section>

      {q.isError && (
        <p role="alert" className="rounded border border-red-300 bg-red-50 p-3 text-red-900">
          {q.error.message}
        </p>
      )}
      {q.isFetching && <p className="text-stone-700">Loading metrics…</p>}

      {rows.length > 0 && (
        <>
          <fieldset className="flex flex-wrap items-center gap-4 rounded-lg bg-white p-3 ring-1 ring-stone-200">
            <legend className="sr-only">Measure on the vertical axis</legend>
            <span className="font-semibold text-stone-800" aria-hidden="true">
              Vertical axis:
            </span>
            {(["Q", "z"] as const).map((m) => (
              <label key={m} className="flex items-center gap-1.5">
                <input type="radio" name="measure" value={m} checked={measure === m} onChange={() => setMeasure(m)} />
                {m === "Q" ? "modularity Q" : "z-score against the null model"}
              </label>
            ))}
            <span className="ml-auto flex flex-wrap gap-2">
              <button type="button" className={btn} onClick={() => downloadText("tanglebank-compare.csv", "text/csv", compareCsv(rows))}>
                Export table (CSV)
              </button>
              <button type="button" className={btn} onClick={() => svgC.current && downloadText(`tanglebank-compare-${measure}-vs-connectance.svg`, "image/svg+xml", serializeSvg(svgC.current))}>
                Export chart vs C (SVG)
              </button>
              <button type="button" className={btn} onClick={() => svgS.current && downloadText(`tanglebank-compare-${measure}-vs-size.svg`, "image/svg+xml", serializeSvg(svgS.current))}>
                Export chart vs S (SVG)
              </button>
            </span>
          </fieldset>
          {objectives.size > 1 && measure === "Q" && (
            <p className="rounded border border-lichen-600 bg-lichen-300/40 p-2 text-sm text-stone-900">
              These networks were scored with different modularity objectives ({[...objectives].join(", ")}): their Q values are different quantities. Compare z instead.
            </p>
          )}
          {withY.length < rows.length && (
            <p className="text-sm text-stone-700">{rows.length - withY.length} network(s) have no {measure} yet (metrics queued, running or undefined) and are not plotted.</p>
          )}
          <div className="grid gap-6 lg:grid-cols-2">
            <ChartFigure
              id="cmp-c"
              title={`${measure} against connectance`}
              caption={`${byC.length} networks; colour shows the interaction type. Connectance uses each network's own variant (bipartite L/(I·J), directed L/S², undirected 2L/(S(S−1))).${overlapNote(byC)}`}
              table={{ caption: `${measure} and connectance`, columns: ["network", "C", measure], rows: byC.map((p) => [p.id, fmt(p.x, 4), fmt(p.y, 3)]) }}
            >
              <Scatter ref={svgC} points={byC} xLabel="Connectance C (proportion of possible links)" yLabel={yLabel} label={`Scatter plot of ${measure} against connectance`} focusable radius={5} title={`${measure} against connectance`} />
              <Legend title="Interaction type" items={types.map((t) => ({ label: interactionTypeLabel[t] ?? t, colour: interactionTypeColour[t] ?? "#000" }))} />
            </ChartFigure>
            <ChartFigure
              id="cmp-s"
              title={`${measure} against size S`}
              caption={`${byS.length} networks; S counts all nodes (I + J for bipartite networks).${overlapNote(byS)}`}
              table={{ caption: `${measure} and size`, columns: ["network", "S", measure], rows: byS.map((p) => [p.id, p.x, fmt(p.y, 3)]) }}
            >
              <Scatter ref={svgS} points={byS} xLabel="Network size S (nodes)" yLabel={yLabel} label={`Scatter plot of ${measure} against network size`} focusable radius={5} title={`${measure} against size S`} />
              <Legend title="Interaction type" items={types.map((t) => ({ label: interactionTypeLabel[t] ?? t, colour: interactionTypeColour[t] ?? "#000" }))} />
            </ChartFigure>
          </div>
          <section aria-labelledby="cmp-table-h" className="rounded-lg bg-white p-4 ring-1 ring-stone-200">
            <h2 id="cmp-table-h" className="text-lg font-bold text-moss-700">
              Metrics
            </h2>
            <div className="mt-2 overflow-x-auto">
              <table className="min-w-full text-left text-sm">
                <caption className="sr-only">Metrics of the compared networks</caption>
                <thead>
                  <tr className="border-b border-stone-300">
                    {["Network", "Type", "S", "L", "C", "Objective", "Q", "Modules", "z", "Qrel", "p", "NODF"].map((h) => (
                      <th key={h} scope="col" className="px-2 py-1">
                        {h === "Qrel" ? (
                          <>
                            Q<sub>rel</sub>
                          </>
                        ) : (
                          h
                        )}
                      </th>
                    ))}
                  </tr>
                </thead>
                <tbody>
                  {rows.map((r) => {
                    const [acc, v, pos] = r.ref.split("/");
                    const m = r.metrics;
                    return (
                      <tr key={r.ref} className="border-b border-stone-100">
                        <td className="px-2 py-1">
                          <Link className="font-semibold text-moss-700 underline" to={paths.networkView.href(acc, Number(v.slice(1)), Number(pos))}>
                            {r.name}
                          </Link>
                          <span className="block font-mono text-xs text-stone-600">{r.ref}</span>
                        </td>
                        <td className="px-2 py-1">{interactionTypeLabel[r.interactionType] ?? r.interactionType}</td>
                        <td className="px-2 py-1 tabular-nums">{r.nNodes}</td>
                        <td className="px-2 py-1 tabular-nums">{r.nLinks}</td>
                        <td className="px-2 py-1 tabular-nums">{fmt(r.connectance, 3)}</td>
                        <td className="px-2 py-1">{m.objective ?? "—"}</td>
                        <td className="px-2 py-1 tabular-nums">{m.status === "succeeded" ? fmt(m.Q, 3) : m.status}</td>
                        <td className="px-2 py-1 tabular-nums">{m.modules ?? "—"}</td>
                        <td className="px-2 py-1 tabular-nums">
                          {fmt(m.z, 2)}
                          {m.zUnstable ? " (unstable)" : ""}
                        </td>
                        <td className="px-2 py-1 tabular-nums">{fmt(m.qRel, 2)}</td>
                        <td className="px-2 py-1 tabular-nums">{m.p === null || m.p === undefined ? "—" : m.p.toFixed(3)}</td>
                        <td className="px-2 py-1 tabular-nums">{fmt(m.nodf, 1)}</td>
                      </tr>
                    );
                  })}
                </tbody>
              </table>
            </div>
          </section>
        </>
      )}
    </div>
  );
}
