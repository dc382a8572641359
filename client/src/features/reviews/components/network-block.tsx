/**
 * One network of a submission on the review page: its matrix picture, the deposited file with its SHA-256,
 * the duplicate-file flag, parse warnings, its metadata (exact coordinates included), the whole matrix and
 * the curator's correction form.
 */
import { useState } from "react";
import type { NetworkSummary } from "@shared/types/dataset";
import { MatrixPreview, matrixFromCanonical } from "../../../components/network/matrix-preview";
import { NetworkForm, type NetworkDraft } from "../../../components/metadata/network-form";
import { networkErrors, prune } from "../../../components/metadata/validate";
import { ValueOrNotRecorded } from "../../../components/metadata/not-recorded";
import { Alert } from "../../../components/ui/form";
import { useReviewCanonical } from "../api/get-review";
import { correctNetwork, useReviewMutation } from "../api/mutations";
import type { ReviewDetail } from "../api/types";
import { CorrectButton, CorrectionActions, Field } from "./metadata-correction";
import { canCorrect } from "../utils/corrections";
import { ReviewMatrix } from "./review-matrix";

/** Deposits with up to this many networks show every whole matrix at once; larger ones open them one by one. */
const FULL_MATRICES_OPEN = 6;

function formatBytes(n: number): string {
  if (n < 1024) return `${n} bytes`;
  if (n < 1024 * 1024) return `${(n / 1024).toFixed(1)} KB`;
  return `${(n / 1024 / 1024).toFixed(1)} MB`;
}

function Preview({ versionId, n }: { versionId: number; n: NetworkSummary }) {
  const { data } = useReviewCanonical(versionId, n.id);
  if (!data) return <div className="h-[140px] w-[140px] animate-pulse rounded bg-stone-100" aria-hidden="true" />;
  return <MatrixPreview matrix={matrixFromCanonical(data)} label={`Matrix picture of network ${n.position}, ${n.originalName}`} size={140} />;
}

export function NetworkBlock({ r, n }: { r: ReviewDetail; n: NetworkSummary }) {
  const [editing, setEditing] = useState(false);
  const [draft, setDraft] = useState<NetworkDraft>(n.metadata as NetworkDraft);
  const save = useReviewMutation((meta: unknown) => correctNetwork(r.versionId, n.id, meta));
  const m = n.metadata;
  const loc = m.locality;
  const dup = r.duplicates.find((d) => d.networkId === n.id);
  return (
    <li className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-stone-200">
      <div className="flex flex-wrap gap-5">
        <Preview versionId={r.versionId} n={n} />
        <div className="min-w-0 flex-1">
          <h3 className="text-lg font-bold text-moss-700">
            Network {n.position}: {m.name ?? n.originalName}
          </h3>
          <p className="text-sm text-stone-700">
            {n.originalName} · {n.format === "matrix" ? "matrix" : "edge list"} · {n.kind}
            {n.directed ? ", directed" : ""} · {n.nRows !== null ? `${n.nRows} × ${n.nCols}` : `${n.nNodes} nodes`} · {n.nLinks} links · connectance {n.connectance === null ? "—" : n.connectance.toFixed(3)}
          </p>
          <p className="mt-1 text-sm text-stone-800">
            <a className="font-semibold text-moss-700 underline" href={`/api/v1/deposits/${r.versionId}/networks/${n.id}/file`} download={n.originalName}>
              Download the deposited file
            </a>{" "}
            ({n.originalName}, {formatBytes(n.size)}) · SHA-256 <code className="break-all text-xs" data-testid="file-sha256">{n.sha256}</code>
          </p>
          {dup && (
            <div className="mt-2">
              <Alert tone="info" title="The same file is already published">
                Identical bytes (same SHA-256) are published as {dup.publishedAs.join(", ")}.
              </Alert>
            </div>
          )}
          {n.warnings.length > 0 && (
            <ul className="mt-2 list-disc pl-5 text-sm">
              {n.warnings.map((w, i) => (
                <li key={i}>Parse warning: {w.message}</li>
              ))}
            </ul>
          )}
          <dl className="mt-3 grid gap-x-6 gap-y-1 text-sm md:grid-cols-[max-content_1fr]">
            <Field label="Interaction">{m.interactionType}</Field>
            <Field label="Weights">{m.weightMeaning}</Field>
            {n.kind === "bipartite" ? <Field label="Levels">{`${m.rowLevel ?? "?"} (rows) / ${m.colLevel ?? "?"} (columns)`}</Field> : n.directed ? <Field label="Direction">{m.directionMeaning}</Field> : null}
            <Field label="Locality">{loc ? `${loc.placeName ?? "?"}, ${loc.countryCode ?? "?"}` : null}</Field>
            <Field label="Coordinates">
              <ValueOrNotRecorded
                meta={m}
                field="coordinates"
                value={loc && (loc.decimalLatitude != null || loc.decimalLongitude != null) ? `${loc.decimalLatitude ?? "?"}, ${loc.decimalLongitude ?? "?"} (exact; public: ${loc.generalisation === "exact" ? "exact" : `rounded to ${loc.generalisation ?? "?"}°`})` : null}
              />
            </Field>
            <Field label="Elevation">
              <ValueOrNotRecorded meta={m} field="elevation" value={loc?.elevation !== undefined && loc?.elevation !== null ? `${loc.elevation} m` : null} />
            </Field>
            <Field label="Habitat">
              <ValueOrNotRecorded meta={m} field="habitat" value={m.habitat} />
            </Field>
            <Field label="Dates">
              <ValueOrNotRecorded meta={m} field="dates" value={m.startDate || m.endDate ? `${m.startDate ?? "?"} to ${m.endDate ?? "?"}` : null} />
            </Field>
            <Field label="Sampling">{m.samplingProtocol}</Field>
            <Field label="Effort">
              <ValueOrNotRecorded meta={m} field="samplingEffort" value={m.samplingEffort ? `${m.samplingEffort.value} ${m.samplingEffort.unit}` : null} />
            </Field>
            {m.missingValues && (
              <Field label="Cells without a number">
                {m.missingValues.markerCells ? `${m.missingValues.markerCells} marked ${(m.missingValues.markers ?? []).join(", ")}: ${m.missingValues.markerMeaning === "not-observed" ? "not observed" : "no interaction"}; ` : ""}
                {`${m.missingValues.blankCells} empty: ${m.missingValues.blankMeaning === "not-observed" ? "not observed" : "no interaction"}`}
              </Field>
            )}
            <Field label="Taxonomic resolution">{m.taxonomicResolution}</Field>
          </dl>
          {canCorrect(r, "network") && !editing && <CorrectButton onClick={() => setEditing(true)}>Correct the metadata of network {n.position}</CorrectButton>}
        </div>
      </div>
      <ReviewMatrix versionId={r.versionId} n={n} initiallyOpen={r.networks.length <= FULL_MATRICES_OPEN} />
      {editing && (
        <form
          className="mt-4 border-t border-stone-200 pt-4"
          aria-label={`Correct the metadata of network ${n.position}`}
          onSubmit={(e) => {
            e.preventDefault();
            save.mutate(prune(draft), { onSuccess: () => setEditing(false) });
          }}
        >
          <NetworkForm value={draft} onChange={setDraft} errors={networkErrors(draft, { kind: n.kind, directed: n.directed })} kind={n.kind} directed={n.directed} />
          <CorrectionActions error={save.error} busy={save.isPending} onCancel={() => setEditing(false)} />
        </form>
      )}
    </li>
  );
}
