/** The dataset page's networks table: size, connectance, modularity and its significance, data downloads. */
import { Link } from "react-router-dom";
import type { DatasetDetail, NetworkSummary } from "@shared/types/dataset";
import { FigureCautions, fmtPFloor, fmtZ, nullLabel } from "../../../components/figures/significance";
import { interactionTypeColour, interactionTypeLabel } from "../../../components/charts/theme";
import { ValueOrNotRecorded } from "../../../components/metadata/not-recorded";
import { paths } from "../../../config/paths";
import { sectionCard, sectionHeading } from "./section-card";

const fmt = (v: number | null | undefined, d = 3) => (v === null || v === undefined || !Number.isFinite(v) ? "—" : v.toFixed(d));

function MetricsCell({ n }: { n: NetworkSummary }) {
  const m = n.metrics;
  if (!m || m.status === "none") return <span className="text-stone-700">not computed</span>;
  if (m.status === "queued") return <span className="rounded bg-lichen-300/60 px-1.5 text-stone-900">queued</span>;
  if (m.status === "running") return <span className="rounded bg-moss-100 px-1.5 text-stone-900">running</span>;
  if (m.status === "failed") return <span className="rounded bg-red-100 px-1.5 text-red-900">failed</span>;
  return null;
}

export function NetworksSection({ d }: { d: DatasetDetail }) {
  const v = d.version.number;
  const acc = d.accession!;
  const refs = d.networks.map((n) => n.ref).filter((r): r is string => !!r);
  return (
    <section aria-labelledby="nets-h" className={sectionCard}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="nets-h" className={sectionHeading}>
          Networks ({d.networks.length})
        </h2>
        {refs.length > 1 && (
          <Link className="text-sm font-semibold text-moss-700 underline" to={paths.compare.href(refs)}>
            Compare these networks
          </Link>
        )}
      </div>
      <div className="mt-2 overflow-x-auto">
        <table className="min-w-full text-left text-sm">
          <caption className="sr-only">Networks of this version with size, connectance and modularity</caption>
          <thead>
            <tr className="border-b border-stone-300">
              <th scope="col" className="px-2 py-1">#</th>
              <th scope="col" className="px-2 py-1">Network</th>
              <th scope="col" className="px-2 py-1">Type</th>
              <th scope="col" className="px-2 py-1 text-right">S (I × J)</th>
              <th scope="col" className="px-2 py-1 text-right">L</th>
              <th scope="col" className="px-2 py-1 text-right">C</th>
              <th scope="col" className="px-2 py-1 text-right">Q</th>
              <th scope="col" className="px-2 py-1 text-right">Modules</th>
              <th scope="col" className="px-2 py-1 text-right">
                z ± MC error
              </th>
              <th scope="col" className="px-2 py-1 text-right">p</th>
              <th scope="col" className="px-2 py-1">Null model</th>
              <th scope="col" className="px-2 py-1">Data</th>
            </tr>
          </thead>
          <tbody>
            {d.networks.map((n) => {
              const m = n.metrics;
              const done = m?.status === "succeeded";
              return (
                <tr key={n.position} className="border-b border-stone-100 align-top">
                  <td className="px-2 py-1">{n.position}</td>
                  <td className="px-2 py-1">
                    <Link className="font-semibold text-moss-700 underline" to={paths.networkView.href(acc, v, n.position)}>
                      {n.metadata.name || n.originalName}
                    </Link>
                    <span className="block font-mono text-xs text-stone-600">{n.ref}</span>
                    <span className="block text-xs text-stone-700">
                      Sampled <ValueOrNotRecorded meta={n.metadata} field="dates" value={n.metadata.startDate ? `${n.metadata.startDate} to ${n.metadata.endDate ?? "?"}` : null} />
                    </span>
                  </td>
                  <td className="px-2 py-1">
                    <span className="inline-block h-2.5 w-2.5 rounded-full" style={{ background: interactionTypeColour[n.metadata.interactionType] ?? "#000" }} aria-hidden="true" />{" "}
                    {interactionTypeLabel[n.metadata.interactionType] ?? n.metadata.interactionType}
                    <span className="block text-xs text-stone-600">
                      {n.kind}
                      {n.directed ? ", directed" : ""}
                      {n.weighted ? ", weighted" : ""}
                    </span>
                  </td>
                  <td className="px-2 py-1 text-right tabular-nums">
                    {n.nNodes}
                    {n.kind === "bipartite" && ` (${n.nRows} × ${n.nCols})`}
                  </td>
                  <td className="px-2 py-1 text-right tabular-nums">{n.nLinks}</td>
                  <td className="px-2 py-1 text-right tabular-nums">{fmt(n.connectance, 3)}</td>
                  {done ? (
                    <>
                      <td className="px-2 py-1 text-right tabular-nums">{fmt(m!.Q, 3)}</td>
                      <td className="px-2 py-1 text-right tabular-nums">{m!.modules ?? "—"}</td>
                      <td className="px-2 py-1 text-right tabular-nums">
                        {fmtZ(m!.z, m!.zSe)}
                        {m!.zUnstable && <span title="z is unstable (null sd near 0 or few distinct randomizations)"> ⚠</span>}
                      </td>
                      <td className="px-2 py-1 text-right tabular-nums">{fmtPFloor(m!.p, m!.pAtFloor)}</td>
                      <td className="px-2 py-1 text-xs">
                        {nullLabel(m!.nullModel)}
                        {m!.newer?.status === "failed" && <span className="block text-amber-900">a newer computation failed; figures from run {m!.runId}</span>}
                        {m!.currentSettings === false && !m!.newer && <span className="block text-stone-600">from earlier settings (run {m!.runId})</span>}
                      </td>
                    </>
                  ) : (
                    <td className="px-2 py-1 text-right" colSpan={5}>
                      <MetricsCell n={n} />
                    </td>
                  )}
                  <td className="px-2 py-1 whitespace-nowrap">
                    {n.ref && (
                      <a className="text-moss-700 underline" href={`/api/v1/networks/${n.ref}/data.csv`} download>
                        CSV
                      </a>
                    )}{" "}
                    ·{" "}
                    <a className="text-moss-700 underline" href={`/api/v1/datasets/${acc}/versions/${v}/networks/${n.position}/file`} download>
                      original
                    </a>
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <div className="mt-2 text-xs text-stone-700">
        <p>
          z and p are against each network's primary null model, named in the row (fixed degrees: size, connectance and every degree kept); each network's
          page lists every null model, the formulas and the run history. Modules count linked nodes only.
        </p>
        <FigureCautions modules className="mt-1" />
      </div>
    </section>
  );
}
