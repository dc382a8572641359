/**
 * The network's metrics, each with the formula of the variant computed and its source; significance
 * against every null model of the run, each row naming its model (primary first, liberal ones marked),
 * with Monte Carlo errors and NODF against the same nulls; what each figure controls for and what not,
 * and the resolution limit next to the module count. A failed or newer run is noted above the figures,
 * which stay those of the last successful run.
 */
import type { ReactNode } from "react";
import type { NetworkView } from "@shared/types/network-view";
import { fmt, objectiveName } from "../utils/format";
import { FigureCautions, NODF_CAUTION, NullBadge, fmtPFloor, fmtZ, nullInfo, nullLabel, RESOLUTION_LIMIT_CAUTION } from "../../../components/figures/significance";

function Row({ name, value, formula, source }: { name: ReactNode; value: ReactNode; formula?: ReactNode; source?: string }) {
  return (
    <tr className="border-b border-stone-200 align-top">
      <th scope="row" className="py-2 pr-4 text-left font-semibold text-stone-800">
        {name}
      </th>
      <td className="py-2 pr-4 font-mono tabular-nums text-stone-900">{value}</td>
      <td className="py-2 text-sm text-stone-700">
        {formula && <span className="font-serif">{formula}</span>}
        {source && <span className="block text-xs text-stone-600">{source}</span>}
      </td>
    </tr>
  );
}

function Connectance({ view }: { view: NetworkView }) {
  if (view.kind === "bipartite") {
    return (
      <>
        C = L / (I · J) = {view.nLinks} / ({view.nRows} · {view.nCols})
      </>
    );
  }
  if (view.directed) return <>C = L / S² (cannibal links counted)</>;
  return <>C = 2L / (S (S − 1))</>;
}

function ModularityFormula({ objective }: { objective?: string }) {
  if (objective === "barber") {
    return (
      <>
        Q<sub>B</sub> = (1/m) Σ<sub>i</sub> Σ<sub>j</sub> [A<sub>ij</sub> − k<sub>i</sub> d<sub>j</sub> / m] δ(g<sub>i</sub>, h<sub>j</sub>), i rows, j columns, k and d their
        degrees (strengths), m links (total weight)
      </>
    );
  }
  if (objective === "newman-directed") {
    return (
      <>
        Q<sub>d</sub> = (1/m) Σ<sub>ij</sub> [A<sub>ij</sub> − k<sub>i</sub><sup>out</sup> k<sub>j</sub><sup>in</sup> / m] δ(c<sub>i</sub>, c<sub>j</sub>)
      </>
    );
  }
  return (
    <>
      Q = Σ<sub>c</sub> [L<sub>c</sub>/m − (K<sub>c</sub>/2m)²], L<sub>c</sub> links inside module c, K<sub>c</sub> the sum of its degrees
    </>
  );
}

const modularitySource: Record<string, string> = {
  barber: "Barber 2007, Phys Rev E 76:066102; weighted form: Dormann & Strauss 2014, Methods Ecol Evol 5:90",
  newman: "Newman & Girvan 2004, Phys Rev E 69:026113; weighted: Newman 2004, Phys Rev E 70:056131",
  "newman-directed": "Leicht & Newman 2008, Phys Rev Lett 100:118703",
};

export function MetricsPanel({ view }: { view: NetworkView }) {
  const m = view.metrics;
  const prov = view.provenance;
  const state = m.status;
  return (
    <section aria-labelledby="metrics-h" className="rounded-lg bg-white p-4 ring-1 ring-stone-200">
      <h2 id="metrics-h" className="text-lg font-bold text-moss-700">
        Metrics
      </h2>
      {state === "succeeded" && m.newer && (
        <p className="mt-2 rounded border border-amber-300 bg-amber-50 p-3 text-sm text-stone-900" role="status">
          {m.newer.status === "failed"
            ? `A newer computation failed (run ${m.newer.runId}${m.newer.errorKind === "configuration" ? ", a setting that does not fit this network" : ""}); figures shown are from run ${m.runId}.`
            : `A newer computation (run ${m.newer.runId}) is ${m.newer.status === "running" ? "running" : "waiting"}; figures shown are from run ${m.runId} until it succeeds.`}
          {m.newer.error && <span className="mt-1 block font-mono text-xs text-red-900">Error (shown to curators and admins): {m.newer.error}</span>}
        </p>
      )}
      {state === "succeeded" && m.currentSettings === false && !m.newer && (
        <p className="mt-2 rounded border border-stone-300 bg-stone-50 p-3 text-sm text-stone-800" role="status">
          These figures come from run {m.runId}, computed with earlier pipeline settings; the current settings have not been run on this network yet.
        </p>
      )}
      {state !== "succeeded" && (
        <p className="mt-2 rounded border border-lichen-400 bg-lichen-300/30 p-3 text-stone-800" role="status">
          {state === "queued" && "The metrics pipeline has queued this network; modularity and its significance will appear here when the run finishes."}
          {state === "running" && "The metrics pipeline is computing this network now."}
          {state === "failed" && `The last metrics run failed${m.error ? `: ${m.error}` : ""}. An administrator can run it again from the metrics pipeline.`}
          {state === "none" && "No metrics have been computed for this network yet."}
        </p>
      )}
      <table className="mt-3 w-full text-sm">
        <caption className="sr-only">Metrics of {view.ref} with formulas and sources</caption>
        <tbody>
          <Row name="Nodes S" value={view.nNodes} formula={view.kind === "bipartite" ? <>S = I + J = {view.nRows} + {view.nCols}</> : undefined} />
          <Row name="Links L" value={view.nLinks} formula="non-zero cells" />
          {view.weighted && <Row name="Total weight" value={fmt(view.totalWeight, 2)} formula={view.metadata.weightMeaning} />}
          <Row name="Connectance C" value={fmt(view.connectance, 4)} formula={<Connectance view={view} />} source={view.kind === "unipartite" && view.directed ? "Martinez 1992" : "definition"} />
          {m.Q !== undefined && (
            <Row
              name={<>{objectiveName[m.objective ?? "newman"] ?? "Modularity"}</>}
              value={fmt(m.Q, 4)}
              formula={<ModularityFormula objective={m.objective} />}
              source={modularitySource[m.objective ?? "newman"]}
            />
          )}
          {m.modules !== undefined && (
            <Row
              name="Modules"
              value={m.modules ?? "—"}
              formula={`modules of linked nodes in the best partition found${m.isolatedNodes ? `; ${m.isolatedNodes} isolated node${m.isolatedNodes === 1 ? "" : "s"} not counted` : " (isolated nodes are not counted)"}`}
              source={RESOLUTION_LIMIT_CAUTION}
            />
          )}
          {prov.restarts && (
            <Row
              name="Spread over restarts"
              value={`${fmt(prov.restarts.min, 4)} – ${fmt(prov.restarts.max, 4)}`}
              formula={`best of ${prov.restarts.n} seeded restarts; median ${fmt(prov.restarts.median, 4)}; ${prov.restarts.bestShare !== null ? `${Math.round(prov.restarts.bestShare * 100)} % of restarts reached the reported Q (after annealing)` : ""}`}
            />
          )}
          {m.nodf !== undefined && m.nodf !== null && <Row name="Nestedness NODF" value={fmt(m.nodf, 2)} formula="0–100; compared with the same null networks below" source="Almeida-Neto et al. 2008, Oikos 117:1227" />}
        </tbody>
      </table>
      {m.nulls && m.nulls.length > 0 && (
        <div className="mt-4 overflow-x-auto">
          <table className="w-full text-sm">
            <caption className="mb-1 text-left font-semibold text-stone-800">
              Significance against each null model ({m.nulls[0].n} null networks each, optimized the same way as the observed one)
            </caption>
            <thead>
              <tr className="border-b border-stone-300 text-left text-stone-700">
                <th scope="col" className="py-1 pr-3">Null model</th>
                <th scope="col" className="py-1 pr-3 text-right">null Q mean ± sd</th>
                <th scope="col" className="py-1 pr-3 text-right">z ± MC error</th>
                <th scope="col" className="py-1 pr-3 text-right">Q<sub>rel</sub></th>
                <th scope="col" className="py-1 pr-3 text-right">ΔQ</th>
                <th scope="col" className="py-1 pr-3 text-right">p</th>
                <th scope="col" className="py-1 text-right">NODF: null mean, z, p</th>
              </tr>
            </thead>
            <tbody>
              {m.nulls.map((f) => (
                <tr key={f.model} className="border-b border-stone-200 align-top">
                  <th scope="row" className="py-1 pr-3 text-left font-normal">
                    <span className="font-semibold text-stone-900">{nullLabel(f.model)}</span>
                    <NullBadge model={f.model} primary={f.primary} withTitle={false} />
                    <span className="block text-xs text-stone-600">keeps {nullInfo(f.model)?.keeps ?? "—"}; not {nullInfo(f.model)?.doesNotKeep ?? "—"}</span>
                    {f.unstable && <span className="block text-xs text-amber-900">z unstable: {f.unstableReason}</span>}
                  </th>
                  <td className="py-1 pr-3 text-right font-mono tabular-nums">{fmt(f.mean, 4)} ± {fmt(f.sd, 4)}</td>
                  <td className="py-1 pr-3 text-right font-mono tabular-nums">{fmtZ(f.z, f.zSe)}</td>
                  <td className="py-1 pr-3 text-right font-mono tabular-nums">{fmt(f.qRel, 3)}</td>
                  <td className="py-1 pr-3 text-right font-mono tabular-nums">{fmt(f.deltaQ, 4)}</td>
                  <td className="py-1 pr-3 text-right font-mono tabular-nums">{fmtPFloor(f.p, f.pAtFloor)}</td>
                  <td className="py-1 text-right font-mono tabular-nums">
                    {f.nodfMean === null ? "—" : `${fmt(f.nodfMean, 1)}, ${fmt(f.nodfZ, 2)}, ${fmtPFloor(f.nodfP)}`}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          <p className="mt-1 text-xs text-stone-600">
            z = (Q − mean Q<sub>null</sub>) / sd Q<sub>null</sub>; Q<sub>rel</sub> = (Q − mean)/mean; ΔQ = Q − mean; p = (1 + #{"{"}Q<sub>null</sub> ≥ Q{"}"}) / (N + 1), one-sided,
            shown as “≤” when no null reached Q (the floor of N nulls). MC error of z: √(1/N + z²/(2(N − 1))). Liberal models call some non-modular networks
            modular (hover for where); the primary null is the one to read first. {NODF_CAUTION}
          </p>
        </div>
      )}
      {m.zUnstable && (
        <p className="mt-3 rounded border border-lichen-600 bg-lichen-300/40 p-3 text-sm text-stone-900">
          <strong>z is unstable here:</strong> the null Q values barely vary (sd close to 0) or the matrix is small and dense, with few distinct
          randomizations. Read z with care; Q<sub>rel</sub> and p are less sensitive to this.
        </p>
      )}
      <div className="mt-3 rounded border-l-4 border-moss-500 bg-moss-50 p-3 text-sm text-stone-800">
        <p className="font-semibold text-moss-700">How to read these figures</p>
        <FigureCautions modules className="mt-1" />
        <ul className="mt-1 list-disc space-y-1 pl-5">
          <li>Modularity maxima are degenerate: partitions of near-equal Q can differ a lot, so read single module memberships with care.</li>
          {view.kind === "bipartite" && <li>Newman's Q of a bipartite network treated as one-mode is a different number from Barber's Q_B; the objective is named above.</li>}
        </ul>
      </div>
      {prov.algorithm && (
        <p className="mt-3 text-xs text-stone-600">
          Computed by {prov.algorithm.name} {prov.algorithm.version}, seed {prov.algorithm.seed}
          {prov.finishedAt && `, finished ${new Date(prov.finishedAt).toISOString().slice(0, 16).replace("T", " ")} UTC`}
          {prov.runId !== null && ` (run ${prov.runId})`}.
        </p>
      )}
    </section>
  );
}
