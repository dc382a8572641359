/**
 * /compare?refs=TB-000001/v1/1,…&null=curveball — networks side by side: Q or z (toggle) against connectance
 * and against S, coloured by interaction type; z, Q_rel and p against one chosen null model (named in the
 * table and the export); the figure adjusted to the selection's mean size and connectance (utils/adjust.ts,
 * method stated on the page); a metrics table; CSV and SVG exports. The selection lives in the URL
 * (`refs=…`, or `collection=TBC-…&revision=N` to open a collection). References that cannot be plotted
 * (malformed, unknown, withdrawn) are listed beside the charts with their reason and a Remove button while
 * the others are plotted; "Add" takes a network, a whole dataset version or a collection.
 */
import { useState, type FormEvent } from "react";
import { Link, useSearchParams } from "react-router-dom";
import type { CompareUnavailable, NetworkCompareRow } from "@shared/types/network-view";
import { ApiClientError } from "../../../lib/api-client";
import { paths } from "../../../config/paths";
import { ChartFigure } from "../../../components/charts/chart-figure";
import { Legend } from "../../../components/charts/legend";
import { Scatter, type ScatterPoint } from "../../../components/charts/scatter";
import { interactionTypeColour, interactionTypeLabel } from "../../../components/charts/theme";
import { useCompareRows } from "../api/get-compare-rows";
import { expandCollection, expandDataset, useCompareCollection } from "../api/expand-reference";
import { MAX_COMPARE, mergeRefs, parseCompareInput } from "../utils/compare-input";
import { compareCsv } from "../utils/export";
import { downloadText } from "../../../lib/download";
import { adjustForSizeAndConnectance, MIN_ADJUST_NETWORKS } from "../utils/adjust";
import { FigureCautions, NullBadge, fmtPFloor, fmtZ, isLiberal, nullInfo, nullLabel } from "../../../components/figures/significance";
import { NULL_MODELS } from "@shared/network/null-models/index";

type Measure = "Q" | "z";
const fmt = (v: number | null | undefined, d = 3) => (v === null || v === undefined || !Number.isFinite(v) ? "—" : v.toFixed(d));
const btn = "rounded border border-moss-700 px-3 py-1.5 text-sm font-semibold text-moss-700 hover:bg-moss-50";

function figureOf(r: NetworkCompareRow, model: string) {
  return r.metrics.nulls?.find((f) => f.model === model) ?? null;
}

function measureOf(r: NetworkCompareRow, m: Measure, model: string): number | null {
  const v = m === "Q" ? r.metrics.Q : figureOf(r, model)?.z;
  return v === null || v === undefined || !Number.isFinite(v) ? null : v;
}

const REASON_LABEL: Record<CompareUnavailable["reason"], string> = { malformed: "not a reference", unknown: "not found", withdrawn: "withdrawn" };

export function ComparePage() {
  const [params, setParams] = useSearchParams();
  const urlRefs = (params.get("refs") ?? "").split(",").map((s) => s.trim()).filter(Boolean);
  const collectionCode = params.get("collection");
  const collectionRevision = /^\d{1,6}$/.test(params.get("revision") ?? "") ? Number(params.get("revision")) : null;
  const coll = useCompareCollection(collectionCode, collectionRevision);
  const allRefs = coll.data ? mergeRefs(coll.data.refs, urlRefs).next : urlRefs;
  const refs = allRefs.slice(0, MAX_COMPARE);
  const measure: Measure = params.get("y") === "z" ? "z" : "Q";
  const nullModel = (NULL_MODELS as readonly string[]).includes(params.get("null") ?? "") ? params.get("null")! : "curveball";
  const q = useCompareRows(refs);
  const [input, setInput] = useState("");
  const [inputError, setInputError] = useState<string | null>(null);
  const [addNote, setAddNote] = useState<string | null>(null);
  const [adding, setAdding] = useState(false);

  /** Any edit turns an opened collection into an explicit list of references (the link then names them). */
  function setRefs(next: string[]) {
    const p = new URLSearchParams(params);
    p.delete("collection");
    p.delete("revision");
    if (next.length) p.set("refs", next.join(","));
    else p.delete("refs");
    setParams(p);
  }
  function setMeasure(m: Measure) {
    const p = new URLSearchParams(params);
    p.set("y", m);
    setParams(p, { replace: true });
  }
  function setNullModel(m: string) {
    const p = new URLSearchParams(params);
    if (m === "curveball") p.delete("null");
    else p.set("null", m);
    setParams(p, { replace: true });
  }
  function addRefs(more: string[], what: string, withdrawnLeftOut = 0) {
    const { next, added } = mergeRefs(allRefs, more);
    const left = withdrawnLeftOut ? ` ${withdrawnLeftOut} withdrawn member${withdrawnLeftOut === 1 ? " was" : "s were"} left out.` : "";
    if (!added.length) {
      setInputError(more.length ? `Every network of ${what} is already in the comparison.${left}` : `${what} holds no network that can be compared.${left}`);
      return;
    }
    if (next.length > MAX_COMPARE) {
      setInputError(`${what} would make ${next.length} networks; the view compares at most ${MAX_COMPARE}. Remove some first.`);
      return;
    }
    setInput("");
    setAddNote(`Added ${added.length} network${added.length === 1 ? "" : "s"} of ${what}.${added.length < more.length ? ` ${more.length - added.length} ${more.length - added.length === 1 ? "was" : "were"} already here.` : ""}${left}`);
    setRefs(next);
  }
  async function add(e: FormEvent) {
    e.preventDefault();
    setAddNote(null);
    const parsed = parseCompareInput(input);
    if (!parsed) return setInputError("Write a network (TB-000042/v2/3), a dataset (TB-000042 or TB-000042/v2) or a collection (TBC-000007).");
    setInputError(null);
    if (parsed.kind === "network") {
      if (allRefs.includes(parsed.ref)) return setInputError(`${parsed.ref} is already in the comparison.`);
      return addRefs([parsed.ref], parsed.ref);
    }
    setAdding(true);
    try {
      if (parsed.kind === "dataset") {
        const set = await expandDataset(parsed.accession, parsed.version);
        addRefs(set.refs, set.label);
      } else {
        const set = await expandCollection(parsed.code, parsed.revision);
        const withdrawn = new Set(set.withdrawn);
        addRefs(set.refs.filter((r) => !withdrawn.has(r)), set.label, withdrawn.size);
      }
    } catch (err) {
      setInputError(err instanceof ApiClientError && err.status === 404 ? `${err.message} (it may be private or not yet published).` : (err as Error).message);
    } finally {
      setAdding(false);
    }
  }

  const unavailable = q.data?.meta.unavailable ?? [];
  const unavailableRefs = new Set(unavailable.map((u) => u.ref));
  const rows = q.data?.data ?? [];
  const types = [...new Set(rows.map((r) => r.interactionType))].sort();
  // file names of the chart downloads: z names its null model, like the chart's axis
  const chartName = measure === "Q" ? "Q" : `z-${nullModel}`;
  const yLabel = measure === "Q" ? "Optimized modularity Q (unitless)" : `z against ${nullLabel(nullModel)} (null sd units)`;
  const withY = rows.filter((r) => measureOf(r, measure, nullModel) !== null);
  const modelsPresent = NULL_MODELS.filter((m) => rows.some((r) => figureOf(r, m)));
  const adjusted = adjustForSizeAndConnectance(
    withY.filter((r) => r.connectance !== null).map((r) => ({ id: r.ref, y: measureOf(r, measure, nullModel)!, S: r.nNodes, C: r.connectance! })),
  );
  const measureName = measure === "Q" ? "Q" : `z (${nullLabel(nullModel)})`;
  const point = (x: number): ((r: NetworkCompareRow) => ScatterPoint) => (r) => ({
    id: r.ref,
    x: x === 0 ? (r.connectance ?? 0) : r.nNodes,
    y: measureOf(r, measure, nullModel)!,
    colour: interactionTypeColour[r.interactionType] ?? "#000",
    title: `${r.ref} ${r.name} (${interactionTypeLabel[r.interactionType] ?? r.interactionType}): ${measure} = ${fmt(measureOf(r, measure, nullModel), measure === "Q" ? 3 : 2)}, C = ${fmt(r.connectance, 3)}, S = ${r.nNodes}`,
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
          Networks side by side. Every z, Q<sub>rel</sub>, ΔQ and p is against the one null model chosen below and named in the table and the export. No
          figure is free of size or connectance, so the plots show them against S and C, and the table adds each figure adjusted to the selection&apos;s
          mean size and connectance (method below).
        </p>
      </header>

      <section aria-labelledby="sel-h" className="rounded-lg bg-white p-4 ring-1 ring-stone-200">
        <h2 id="sel-h" className="text-lg font-bold text-moss-700">
          Selection ({allRefs.length})
        </h2>
        {collectionCode && coll.data && (
          <p className="mt-1 text-sm text-stone-700" data-testid="compare-collection">
            The networks of collection{" "}
            <Link className="font-semibold text-moss-700 underline" to={paths.collection.href(collectionCode, collectionRevision ?? undefined)}>
              {coll.data.label}
            </Link>
            {urlRefs.length ? `, and ${urlRefs.length} more` : ""}. Changing the selection turns this link into a list of the networks.
          </p>
        )}
        {collectionCode && coll.isPending && <p className="mt-1 text-stone-700">Opening collection {collectionCode}…</p>}
        {collectionCode && coll.isError && (
          <p role="alert" className="mt-2 rounded border border-red-300 bg-red-50 p-2 text-sm text-red-900">
            Collection {collectionCode} could not be opened: {coll.error.message}
          </p>
        )}
        {allRefs.length === 0 && !(collectionCode && coll.isPending) && (
          <p className="mt-2 text-stone-700">
            No networks chosen yet. Pick them in the{" "}
            <Link className="text-moss-700 underline" to={paths.catalogue.href()}>
              catalogue
            </Link>{" "}
            or add a network, a dataset or a collection below.
          </p>
        )}
        {allRefs.length > MAX_COMPARE && (
          <p className="mt-2 rounded border border-lichen-600 bg-lichen-300/40 p-2 text-sm text-stone-900">
            The view compares at most {MAX_COMPARE} networks: the first {MAX_COMPARE} of these {allRefs.length} are shown.
          </p>
        )}
        <ul className="mt-2 flex flex-wrap gap-2" aria-label="Networks in the comparison">
          {allRefs.map((r) => (
            <li
              key={r}
              className={`flex items-center gap-1 rounded-full py-0.5 pr-1 pl-3 text-sm ring-1 ${unavailableRefs.has(r) ? "bg-red-50 text-red-900 ring-red-300" : "bg-moss-50 ring-moss-200"}`}
            >
              <span className="font-mono">{r}</span>
              {unavailableRefs.has(r) && <span className="text-xs">({REASON_LABEL[unavailable.find((u) => u.ref === r)!.reason]})</span>}
              <button type="button" className="rounded-full px-2 text-moss-700 hover:bg-moss-100" aria-label={`Remove ${r}`} onClick={() => setRefs(allRefs.filter((x) => x !== r))}>
                ×
              </button>
            </li>
          ))}
        </ul>
        <form className="mt-3 flex flex-wrap items-end gap-2" onSubmit={(e) => void add(e)} noValidate>
          <div className="min-w-0 flex-1 sm:flex-none">
            <label htmlFor="add-ref" className="block text-sm font-semibold text-stone-800">
              Add a network, a dataset or a collection
            </label>
            <input
              id="add-ref"
              value={input}
              onChange={(e) => setInput(e.target.value)}
              placeholder="TB-000042/v2/3, TB-000042 or TBC-000007"
              aria-invalid={inputError ? true : undefined}
              aria-describedby={inputError ? "add-ref-error" : "add-ref-hint"}
              className="mt-1 w-full rounded border border-stone-400 px-2 py-1 font-mono sm:w-[26rem]"
            />
          </div>
          <button type="submit" className={btn} disabled={adding} aria-busy={adding || undefined}>
            {adding ? "Adding…" : "Add"}
          </button>
          <p id="add-ref-hint" className="w-full text-xs text-stone-600">
            A dataset adds all networks of that version (the latest published one when no version is given); a collection adds its published members. Page addresses
            of datasets, networks and collections work too.
          </p>
          {inputError && (
            <p id="add-ref-error" role="alert" className="w-full text-sm text-red-800">
              {inputError}
            </p>
          )}
          {addNote && (
            <p role="status" className="w-full text-sm text-moss-700">
              {addNote}
            </p>
          )}
        </form>
      </section>

      {unavailable.length > 0 && (
        <section aria-labelledby="unplotted-h" className="rounded-lg border border-lichen-600 bg-lichen-300/30 p-4" data-testid="not-plotted">
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <h2 id="unplotted-h" className="text-lg font-bold text-stone-900">
              Not plotted ({unavailable.length} of {refs.length})
            </h2>
            {unavailable.length > 1 && (
              <button type="button" className={btn} onClick={() => setRefs(allRefs.filter((r) => !unavailableRefs.has(r)))}>
                Remove all {unavailable.length}
              </button>
            )}
          </div>
          <p className="mt-1 text-sm text-stone-800">
            {rows.length > 0 ? `The other ${rows.length} network${rows.length === 1 ? " is" : "s are"} plotted below.` : "No other network is left to plot."}
          </p>
          <ul className="mt-2 space-y-2">
            {unavailable.map((u) => (
              <li key={u.ref} className="flex flex-wrap items-start justify-between gap-2 rounded bg-white/70 p-2 text-sm">
                <div className="min-w-0 flex-1">
                  <p>
                    <span className="font-mono font-semibold">{u.ref}</span> — {REASON_LABEL[u.reason]}
                  </p>
                  {u.tombstone ? (
                    <p className="mt-0.5 text-stone-800">
                      Withdrawn on {u.tombstone.withdrawnAt.slice(0, 10)}: {u.tombstone.reason}{" "}
                      <Link className="text-moss-700 underline" to={paths.datasetVersion.href(u.tombstone.accession, u.tombstone.version)}>
                        What it was and how to cite it
                      </Link>
                    </p>
                  ) : (
                    <p className="mt-0.5 text-stone-800">{u.message}</p>
                  )}
                </div>
                <button type="button" className="rounded border border-stone-500 px-2 py-0.5 text-sm font-semibold text-stone-800 hover:bg-stone-100" aria-label={`Remove ${u.ref} from the comparison`} onClick={() => setRefs(allRefs.filter((x) => x !== u.ref))}>
                  Remove
                </button>
              </li>
            ))}
          </ul>
        </section>
      )}

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
                {m === "Q" ? "modularity Q" : "z against the chosen null model"}
              </label>
            ))}
            <label className="flex items-center gap-1.5">
              <span className="font-semibold text-stone-800">Null model:</span>
              <select value={nullModel} onChange={(e) => setNullModel(e.target.value)} className="rounded border border-stone-400 bg-white px-2 py-1 text-sm">
                {(modelsPresent.length ? modelsPresent : ["curveball"]).map((m) => (
                  <option key={m} value={m}>
                    {nullLabel(m)}
                    {isLiberal(m) ? ", liberal" : ""}
                  </option>
                ))}
              </select>
            </label>
            <span className="ml-auto flex flex-wrap gap-2">
              <button
                type="button"
                className={btn}
                onClick={() => downloadText("tanglebank-compare.csv", "text/csv", compareCsv(rows, nullModel, adjusted ? { measure: measureName, values: adjusted.adjusted } : null))}
              >
                Export table (CSV)
              </button>
            </span>
          </fieldset>
          {objectives.size > 1 && measure === "Q" && (
            <p className="rounded border border-lichen-600 bg-lichen-300/40 p-2 text-sm text-stone-900">
              These networks were scored with different modularity objectives ({[...objectives].join(", ")}): their Q values are different quantities; compare
              only networks of one objective, or their z against one null model (which still depends on size and connectance).
            </p>
          )}
          {withY.length < rows.length && (
            <p className="text-sm text-stone-700">{rows.length - withY.length} network(s) have no {measure} yet (metrics queued, running or undefined) and are not plotted.</p>
          )}
          <div className="grid gap-6 lg:grid-cols-2">
            <ChartFigure
              id="cmp-c"
              title={`${measure} against connectance`}
              download={`tanglebank-compare-${chartName}-vs-connectance`}
              caption={`${byC.length} networks; colour shows the interaction type. Connectance uses each network's own variant (bipartite L/(I·J), directed L/S², undirected 2L/(S(S−1))).${overlapNote(byC)}`}
              table={{ caption: `${measure} and connectance`, columns: ["network", "C", measure], rows: byC.map((p) => [p.id, fmt(p.x, 4), fmt(p.y, 3)]) }}
            >
              <Scatter points={byC} xLabel="Connectance C (proportion of possible links)" yLabel={yLabel} label={`Scatter plot of ${measure} against connectance`} focusable radius={5} title={`${measure} against connectance`} />
              <Legend title="Interaction type" items={types.map((t) => ({ label: interactionTypeLabel[t] ?? t, colour: interactionTypeColour[t] ?? "#000" }))} />
            </ChartFigure>
            <ChartFigure
              id="cmp-s"
              title={`${measure} against size S`}
              download={`tanglebank-compare-${chartName}-vs-size`}
              caption={`${byS.length} networks; S counts all nodes (I + J for bipartite networks).${overlapNote(byS)}`}
              table={{ caption: `${measure} and size`, columns: ["network", "S", measure], rows: byS.map((p) => [p.id, p.x, fmt(p.y, 3)]) }}
            >
              <Scatter points={byS} xLabel="Network size S (nodes)" yLabel={yLabel} label={`Scatter plot of ${measure} against network size`} focusable radius={5} title={`${measure} against size S`} />
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
                    {["Network", "Type", "S", "L", "C", "Objective", "Q", "Modules", "Null model", "z ± MC error", "Qrel", "p", "NODF", "Adjusted"].map((h) => (
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
                        <td className="px-2 py-1 text-xs">
                          {figureOf(r, nullModel) ? <NullBadge model={nullModel} primary={figureOf(r, nullModel)!.primary} /> : `no ${nullModel} figures`}
                        </td>
                        <td className="px-2 py-1 tabular-nums">
                          {fmtZ(figureOf(r, nullModel)?.z, figureOf(r, nullModel)?.zSe)}
                          {figureOf(r, nullModel)?.unstable ? " (unstable)" : ""}
                        </td>
                        <td className="px-2 py-1 tabular-nums">{fmt(figureOf(r, nullModel)?.qRel, 2)}</td>
                        <td className="px-2 py-1 tabular-nums">{fmtPFloor(figureOf(r, nullModel)?.p, figureOf(r, nullModel)?.pAtFloor)}</td>
                        <td className="px-2 py-1 tabular-nums">{fmt(m.nodf, 1)}</td>
                        <td className="px-2 py-1 tabular-nums">{adjusted?.adjusted.has(r.ref) ? fmt(adjusted.adjusted.get(r.ref), measure === "Q" ? 3 : 2) : "—"}</td>
                      </tr>
                    );
                  })}
                </tbody>
              </table>
            </div>
            <div className="mt-3 rounded border-l-4 border-moss-500 bg-moss-50 p-3 text-sm text-stone-800">
              <p className="font-semibold text-moss-700">Adjusted for size and connectance: {measureName}</p>
              {adjusted ? (
                <p className="mt-1">
                  Method: ordinary least squares of {measureName} on ln S and C over the {adjusted.n} networks of this selection that have it (
                  {measureName} = {fmt(adjusted.coefficients[0], 3)} {adjusted.coefficients[1] >= 0 ? "+" : "−"} {fmt(Math.abs(adjusted.coefficients[1]), 3)} ln S{" "}
                  {adjusted.coefficients[2] >= 0 ? "+" : "−"} {fmt(Math.abs(adjusted.coefficients[2]), 3)} C; R² = {fmt(adjusted.r2, 2)}). “Adjusted” is each network&apos;s
                  value at the selection&apos;s mean size (S = {fmt(Math.exp(adjusted.meanLnS), 0)}) and mean connectance (C = {fmt(adjusted.meanC, 3)}): its own
                  value minus the fitted effect of its distance from those means (covariate adjustment, as in the analysis of covariance). It removes the linear
                  trend of this selection only, not sampling effort or non-linear effects; a different selection gives different adjusted values.
                </p>
              ) : (
                <p className="mt-1">
                  Needs at least {MIN_ADJUST_NETWORKS} networks with {measureName} and some spread in S and C; until then compare only networks of similar size and
                  connectance.
                </p>
              )}
              {nullInfo(nullModel) && (
                <p className="mt-1">
                  {nullLabel(nullModel)} keeps {nullInfo(nullModel)!.keeps}; it does not keep {nullInfo(nullModel)!.doesNotKeep}.
                  {isLiberal(nullModel) ? ` Liberal: ${nullInfo(nullModel)!.caution}.` : ""}
                </p>
              )}
              <FigureCautions modules className="mt-1" />
            </div>
          </section>
        </>
      )}
    </div>
  );
}
