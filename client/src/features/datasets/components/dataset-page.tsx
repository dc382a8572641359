/** /datasets/:accession (latest published version) and /datasets/:accession/v/:n (one version). */
import { useEffect, useMemo } from "react";
import { Link } from "react-router-dom";
import type { CitationInput } from "@shared/citation";
import { paths } from "../../../config/paths";
import { useDataset } from "../api/get-dataset";
import { useDatasetHistory } from "../api/get-dataset-history";
import { CitationBlock } from "./citation-block";
import { WithdrawSection } from "./withdraw-section";
import { DoiLine } from "../../../components/ui/doi";
import { HistorySection } from "./history-section";
import { LocalitySection } from "./locality-section";
import { NetworksSection } from "./networks-section";
import { StudySection } from "./study-section";
import { TombstoneView } from "./tombstone-view";
import { VersionsSection } from "./versions-section";

export function DatasetPage({ accession, version, isCurator }: { accession: string; version: number | null; isCurator: boolean }) {
  const q = useDataset(accession, version);
  const history = useDatasetHistory(accession, isCurator && q.data?.kind === "dataset");
  const d = q.data?.kind === "dataset" ? q.data.dataset : null;
  const citation = useMemo<CitationInput | null>(() => {
    if (!d || !d.accession) return null;
    return {
      metadata: d.metadata,
      accession: d.accession,
      version: d.version.number,
      year: new Date(d.version.publishedAt ?? Date.now()).getUTCFullYear(),
      url: `${window.location.origin}${paths.datasetVersion.href(d.accession, d.version.number)}`,
      doi: d.dois.version?.state === "registered" ? d.dois.version.doi : null,
    };
  }, [d]);
  useEffect(() => {
    if (d) document.title = `${d.metadata.title} (${d.accession} v${d.version.number}) · Tanglebank`;
  }, [d]);

  if (q.isPending) return <p className="text-stone-700">Loading the dataset…</p>;
  if (q.isError) {
    return (
      <section className="mx-auto max-w-2xl py-6">
        <h1 className="text-2xl font-bold text-moss-700">Dataset not found</h1>
        <p className="mt-3 text-stone-800">{q.error.message}</p>
        <p className="mt-3">
          <Link className="font-semibold text-moss-700 underline" to={paths.catalogue.href()}>
            Search the catalogue
          </Link>
        </p>
      </section>
    );
  }
  if (q.data.kind === "withdrawn") return <TombstoneView t={q.data.tombstone} />;
  const ds = q.data.dataset;
  const newer = ds.latestPublishedVersion !== null && ds.latestPublishedVersion > ds.version.number;
  return (
    <div className="space-y-6">
      <header>
        <p className="font-mono text-sm text-stone-700">
          {ds.accession} · version {ds.version.number}
          {ds.version.publishedAt && ` · published ${ds.version.publishedAt.slice(0, 10)}`}
        </p>
        <h1 className="mt-1 text-2xl font-bold text-moss-700 md:text-3xl">{ds.metadata.title}</h1>
        <p className="mt-1 text-stone-800">{ds.metadata.creators.map((c) => c.name).join(", ")}</p>
        {(ds.dois.version || ds.dois.concept) && (
          <p className="mt-1 flex flex-wrap gap-x-4 text-sm text-stone-800">
            <DoiLine doi={ds.dois.version} label={`DOI of version ${ds.version.number}`} />
            <DoiLine doi={ds.dois.concept} label="DOI of all versions" note="(always the latest)" />
          </p>
        )}
        {ds.version.state !== "published" && (
          <p className="mt-2 rounded border border-lichen-600 bg-lichen-300/40 p-2 text-sm text-stone-900">
            This version is {ds.version.state.replace("_", " ")}: only its depositor and curators can see it.
          </p>
        )}
        {newer && (
          <p className="mt-2 rounded border border-lichen-600 bg-lichen-300/40 p-2 text-sm text-stone-900" role="note">
            A newer version of this dataset exists:{" "}
            <Link className="font-semibold underline" to={paths.datasetVersion.href(ds.accession!, ds.latestPublishedVersion!)}>
              version {ds.latestPublishedVersion}
            </Link>
            . This page shows version {ds.version.number}, kept unchanged so that citations of it still hold.
          </p>
        )}
      </header>
      <StudySection d={ds} />
      {citation && <CitationBlock input={citation} />}
      <NetworksSection d={ds} />
      <LocalitySection d={ds} />
      <VersionsSection d={ds} />
      {isCurator && <HistorySection entries={history.data} loading={history.isPending} error={history.isError ? history.error.message : null} />}
      {isCurator && ds.accession && ds.version.state === "published" && <WithdrawSection accession={ds.accession} />}
    </div>
  );
}
