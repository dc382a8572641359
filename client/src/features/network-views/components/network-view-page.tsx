/** /datasets/:accession/v/:n/networks/:pos — one network: metrics with formulas, matrix, null distribution, roles, modules, downloads. */
import { DoiLine } from "../../../components/ui/doi";
import { looksLikeFormula } from "@shared/csv";
import { FormulaLikeNote } from "./formula-like-note";
import { Link, useParams } from "react-router-dom";
import { startTransition, useEffect, useState } from "react";
import { paths } from "../../../config/paths";
import { ApiClientError } from "../../../lib/api-client";
import { useNetworkView } from "../api/get-network-view";
import { ModuleMatrix } from "../../../components/network/module-matrix";
import { MetricsPanel } from "./metrics-panel";
import { ModuleTable } from "./module-table";
import { NullHistogram } from "./null-histogram";
import { RolesPlot } from "./roles-plot";
import { ValueOrNotRecorded } from "../../../components/metadata/not-recorded";
import { RunHistory } from "./run-history";

const btn = "inline-block rounded border border-moss-700 px-3 py-1.5 text-sm font-semibold text-moss-700 hover:bg-moss-50";

export function NetworkViewPage() {
  const params = useParams();
  const accession = params.accession ?? "";
  const version = Number(params.n);
  const position = Number(params.pos);
  const q = useNetworkView(accession, version, position);
  const view = q.data;
  // The plots below the matrix mount in a transition: React renders them in slices, so a network with
  // thousands of nodes never holds the main thread in one long task.
  const [plots, setPlots] = useState(false);
  useEffect(() => {
    if (view) startTransition(() => setPlots(true));
  }, [view]);
  useEffect(() => {
    if (view) document.title = `${view.metadata.name ?? view.ref} (${view.ref}) · Tanglebank`;
  }, [view]);

  if (q.isPending) return <p className="text-stone-700">Loading the network…</p>;
  if (q.isError || !view) {
    const e = q.error;
    const gone = e instanceof ApiClientError && e.status === 410;
    return (
      <section className="mx-auto max-w-2xl py-6">
        <h1 className="text-2xl font-bold text-moss-700">{gone ? "This version was withdrawn" : "Network not found"}</h1>
        <p className="mt-3 text-stone-800">{e instanceof Error ? e.message : "Something went wrong."}</p>
        <p className="mt-3">
          <Link className="font-semibold text-moss-700 underline" to={paths.dataset.href(accession)}>
            Go to {accession}
          </Link>
        </p>
      </section>
    );
  }
  const api = `/api/v1`;
  const ref = view.ref;
  const formulaLike = (view.kind === "bipartite" ? [...view.rowLabels, ...view.colLabels] : view.rowLabels).filter(looksLikeFormula);
  return (
    <div className="space-y-6">
      <nav aria-label="Breadcrumb" className="text-sm">
        <ol className="flex flex-wrap gap-1 text-stone-700">
          <li>
            <Link className="text-moss-700 underline" to={paths.catalogue.href()}>
              Catalogue
            </Link>{" "}
            /
          </li>
          <li>
            <Link className="text-moss-700 underline" to={paths.datasetVersion.href(view.accession, view.version)}>
              {view.accession} v{view.version}
            </Link>{" "}
            /
          </li>
          <li aria-current="page">network {view.position}</li>
        </ol>
      </nav>
      <header>
        <h1 className="text-2xl font-bold text-moss-700">{view.metadata.name ?? `Network ${view.position}`}</h1>
        <p className="mt-1 text-stone-700">
          <span className="font-mono">{ref}</span> · {view.datasetTitle} · {view.metadata.interactionType} · {view.kind}
          {view.directed ? ", directed" : ""}
          {view.weighted ? `, weighted (${view.metadata.weightMeaning})` : ", binary"} · {view.metadata.locality?.placeName}
        </p>
        <p className="mt-1 text-sm text-stone-700">
          Habitat <ValueOrNotRecorded meta={view.metadata} field="habitat" value={view.metadata.habitat} /> · sampled{" "}
          <ValueOrNotRecorded meta={view.metadata} field="dates" value={view.metadata.startDate ? `${view.metadata.startDate} to ${view.metadata.endDate ?? "?"}` : null} />
          {(view.metadata.samplingEffort || view.metadata.notRecorded?.samplingEffort) && (
            <>
              {" "}
              · sampling effort{" "}
              <ValueOrNotRecorded meta={view.metadata} field="samplingEffort" value={view.metadata.samplingEffort ? `${view.metadata.samplingEffort.value} ${view.metadata.samplingEffort.unit}` : null} />
            </>
          )}
          {view.metadata.missingValues?.markerCells ? ` · ${view.metadata.missingValues.markerCells} cell(s) marked ${(view.metadata.missingValues.markers ?? []).join(", ")} in the file read as ${view.metadata.missingValues.markerMeaning === "not-observed" ? "not observed" : "no interaction"}` : ""}
          {view.metadata.missingValues?.blankMeaning === "not-observed" ? ` · ${view.metadata.missingValues.blankCells} empty cell(s) read as not observed` : ""}
        </p>
        {view.doi && (
          <p className="mt-1 text-sm text-stone-800">
            <DoiLine doi={view.doi} label={`Cite the dataset version: DOI`} />
          </p>
        )}
        {view.versionState !== "published" && (
          <p className="mt-2 rounded border border-lichen-600 bg-lichen-300/40 p-2 text-sm text-stone-900">This version is {view.versionState.replace("_", " ")}: only its depositor and curators can see it.</p>
        )}
        {view.latestPublishedVersion !== null && view.latestPublishedVersion > view.version && (
          <p className="mt-2 rounded border border-lichen-600 bg-lichen-300/40 p-2 text-sm text-stone-900">
            A newer version of this dataset exists:{" "}
            <Link className="font-semibold underline" to={paths.datasetVersion.href(view.accession, view.latestPublishedVersion)}>
              version {view.latestPublishedVersion}
            </Link>
            .
          </p>
        )}
      </header>

      <section aria-labelledby="downloads-h" className="rounded-lg bg-white p-4 ring-1 ring-stone-200">
        <h2 id="downloads-h" className="text-lg font-bold text-moss-700">
          Downloads
        </h2>
        <div className="mt-2 flex flex-wrap gap-2">
          <a className={btn} href={`${api}/networks/${ref}/data.csv`} download>
            Network (matrix CSV)
          </a>
          <a className={btn} href={`${api}/networks/${ref}/data.csv?layout=edgelist`} download>
            Network (edge list CSV)
          </a>
          <a className={btn} href={`${api}/datasets/${view.accession}/versions/${view.version}/networks/${view.position}/file`} download>
            Original file ({view.provenance.file.name})
          </a>
          {view.rowModules && (
            <>
              <a className={btn} href={`${api}/network-views/${view.accession}/v${view.version}/${view.position}/partition.csv`} download>
                Partition (CSV)
              </a>
              <a className={btn} href={`${api}/network-views/${view.accession}/v${view.version}/${view.position}/partition.json`} download>
                Partition (JSON)
              </a>
            </>
          )}
        </div>
        <FormulaLikeNote labels={formulaLike} csvHref={`${api}/networks/${ref}/data.csv`} />
        <p className="mt-2 text-xs text-stone-600">
          Original file SHA-256 <span className="break-all font-mono">{view.provenance.file.sha256}</span>. Licence {view.licence}.
        </p>
      </section>

      <MetricsPanel view={view} />
      <ModuleMatrix view={view} download={`tanglebank-${view.ref.replace(/\//g, "-")}-matrix`} />
      {plots ? (
        <>
          <div className="grid gap-6 xl:grid-cols-2">
            <NullHistogram view={view} />
            <RolesPlot view={view} />
          </div>
          <ModuleTable view={view} />
          <RunHistory view={view} />
        </>
      ) : (
        <p className="text-stone-700">Drawing the plots…</p>
      )}
    </div>
  );
}
