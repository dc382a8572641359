/**
 * The review page of one submission: metadata (with exact coordinates and contact e-mail), network
 * previews, parse warnings, schema findings, the duplicate-file flag, the decision form, metadata
 * corrections and the dataset's history.
 */
import { useState } from "react";
import { Link } from "react-router-dom";
import type { NetworkSummary } from "@shared/types/dataset";
import { ApiClientError } from "../../../lib/api-client";
import { paths } from "../../../config/paths";
import { MatrixPreview, matrixFromCanonical } from "../../../components/network/matrix-preview";
import { StudyForm, type StudyDraft } from "../../../components/metadata/study-form";
import { NetworkForm, type NetworkDraft } from "../../../components/metadata/network-form";
import { networkErrors, prune, studyErrors } from "../../../components/metadata/validate";
import { Alert, Button } from "../../../components/ui/form";
import { useReview, useReviewCanonical } from "../api/get-review";
import { correctNetwork, correctStudy, decide, useReviewMutation, useWithdrawDataset, type Decision } from "../api/mutations";
import type { HistoryEntry, ReviewDetail } from "../api/types";
import { ValueOrNotRecorded } from "../../../components/metadata/not-recorded";
import { figuresState } from "../utils/figures-state";
import { ReviewMatrix } from "./review-matrix";
import { SubmissionDiffSection } from "./submission-diff";
import { SubmissionThread } from "../../../components/thread/submission-thread";
import { usePostReviewComment, useReviewThread } from "../api/thread";

const ACTION_LABELS: Record<string, string> = {
  "deposit.create": "Draft created",
  "deposit.metadata.update": "Study metadata saved",
  "deposit.network.add": "Network files uploaded",
  "deposit.network.update": "Network changed",
  "deposit.network.delete": "Network removed",
  "deposit.network.reorder": "Networks reordered",
  "deposit.submit": "Submitted for review",
  "review.publish": "Published",
  "review.request_changes": "Changes requested",
  "review.decline": "Declined",
  "review.metadata.correct": "Study metadata corrected by a curator",
  "dataset.metadata.correct": "Published study metadata corrected by a curator",
  "review.network.correct": "Network metadata corrected by a curator",
  "version.create": "New version started",
  "dataset.withdraw": "Withdrawn",
};

/** A history line with what the audit row says (which network, which files, which submission). */
function historyLabel(h: HistoryEntry): string {
  const d = h.details;
  const label = ACTION_LABELS[h.action] ?? h.action;
  switch (h.action) {
    case "deposit.network.update":
      return typeof d.position === "number" ? `Network ${d.position} changed (${d.reparsed ? "file read again" : "metadata"})` : label;
    case "deposit.network.delete":
      return typeof d.originalName === "string" ? `${label}: ${d.originalName}` : label;
    case "deposit.network.add":
      return Array.isArray(d.files) ? `${label}: ${(d.files as Array<{ name?: string }>).map((f) => f.name).join(", ")}` : label;
    case "deposit.submit":
      return typeof d.round === "number" && d.round > 1 ? `${label} (submission ${d.round})` : label;
    default:
      return label;
  }
}

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

function Field({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <>
      <dt className="font-semibold text-stone-800">{label}</dt>
      <dd className="text-stone-900">{children ?? "—"}</dd>
    </>
  );
}

function NetworkBlock({ r, n }: { r: ReviewDetail; n: NetworkSummary }) {
  const [editing, setEditing] = useState(false);
  const [draft, setDraft] = useState<NetworkDraft>(n.metadata as NetworkDraft);
  const save = useReviewMutation((meta: unknown) => correctNetwork(r.versionId, n.id, meta));
  const m = n.metadata;
  const loc = m.locality;
  const dup = r.duplicates.find((d) => d.networkId === n.id);
  const published = r.version.state === "published";
  const canCorrect = r.version.state === "submitted" || r.version.state === "changes_requested" || published;
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
          {canCorrect && !editing && (
            <button type="button" onClick={() => setEditing(true)} className="mt-3 rounded border border-moss-700 px-3 py-1.5 text-sm font-semibold text-moss-700 hover:bg-moss-50">
              Correct the metadata of network {n.position}
            </button>
          )}
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
          {save.error && <div className="mt-3"><Alert tone="error" title={save.error.message} /></div>}
          <div className="mt-3 flex gap-2">
            <Button busy={save.isPending}>Save correction</Button>
            <Button type="button" variant="secondary" onClick={() => setEditing(false)}>
              Cancel
            </Button>
          </div>
        </form>
      )}
    </li>
  );
}

function StudyBlock({ r }: { r: ReviewDetail }) {
  const [editing, setEditing] = useState(false);
  const [draft, setDraft] = useState<StudyDraft>(r.metadata as StudyDraft);
  const save = useReviewMutation((meta: unknown) => correctStudy(r.versionId, meta, r.lockVersion));
  const m = r.metadata;
  const published = r.version.state === "published";
  const canCorrect = r.version.state === "submitted" || r.version.state === "changes_requested" || published;
  return (
    <section aria-labelledby="study-h" className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-stone-200">
      <h2 id="study-h" className="text-xl font-bold text-moss-700">
        Study
      </h2>
      {!editing ? (
        <>
          <dl className="mt-3 grid gap-x-6 gap-y-1 text-sm md:grid-cols-[max-content_1fr]">
            <Field label="Title">{m.title}</Field>
            <Field label="Description"><span className="whitespace-pre-wrap">{m.description}</span></Field>
            <Field label="Creators">{(m.creators ?? []).map((c) => `${c.name}${c.orcid ? ` (ORCID ${c.orcid})` : ""}${c.affiliation ? `, ${c.affiliation}` : ""}`).join("; ")}</Field>
            <Field label="Publication">{m.publication ? `${m.publication.citation}${m.publication.doi ? ` doi:${m.publication.doi}` : ""}` : null}</Field>
            <Field label="Licence">{m.licence}</Field>
            <Field label="Keywords">{(m.keywords ?? []).join(", ")}</Field>
            <Field label="Funding">{m.funding}</Field>
            <Field label="Contact (curators only)">{m.contactEmail}</Field>
          </dl>
          {canCorrect && (
            <button type="button" onClick={() => setEditing(true)} className="mt-3 rounded border border-moss-700 px-3 py-1.5 text-sm font-semibold text-moss-700 hover:bg-moss-50">
              Correct the study metadata
            </button>
          )}
        </>
      ) : (
        <form
          className="mt-3"
          aria-label="Correct the study metadata"
          onSubmit={(e) => {
            e.preventDefault();
            save.mutate(prune(draft), { onSuccess: () => setEditing(false) });
          }}
        >
          {published && (
            <p className="mb-3 rounded border border-amber-300 bg-amber-50 p-3 text-sm text-stone-900">
              This version is published: a correction changes its page, its citation and the catalogue at once, and its DOI metadata follow. The data and
              the licence stay as published (start a new version to change them); the correction is recorded in the history with before and after.
            </p>
          )}
          <StudyForm value={draft} onChange={setDraft} errors={studyErrors(draft)} />
          {save.error && <div className="mt-3"><Alert tone="error" title={save.error.message} /></div>}
          <div className="mt-3 flex gap-2">
            <Button busy={save.isPending}>Save correction</Button>
            <Button type="button" variant="secondary" onClick={() => setEditing(false)}>
              Cancel
            </Button>
          </div>
        </form>
      )}
    </section>
  );
}

function DecisionForm({ r }: { r: ReviewDetail }) {
  const [decision, setDecision] = useState<Decision | "">("");
  const [comment, setComment] = useState("");
  const m = useReviewMutation((a: { decision: Decision; comment: string }) => decide(r.versionId, { ...a, lockVersion: r.lockVersion }));
  const err = m.error instanceof ApiClientError ? m.error : null;
  if (r.version.state !== "submitted") return null;
  if (r.ownDeposit) return <Alert tone="info" title="This is your own deposit.">Another curator must decide on it.</Alert>;
  const needsComment = decision === "request_changes" || decision === "decline";
  return (
    <form
      aria-labelledby="decision-h"
      className="rounded-lg bg-white p-5 shadow-sm ring-2 ring-lichen-400"
      onSubmit={(e) => {
        e.preventDefault();
        if (decision) m.mutate({ decision, comment });
      }}
    >
      <h2 id="decision-h" className="text-xl font-bold text-moss-700">
        Decision
      </h2>
      {r.problems.length > 0 && (
        <div className="mt-3">
          <Alert tone="info" title="Schema findings">
            <ul className="list-disc pl-5">
              {r.problems.map((p, i) => (
                <li key={i}>{p.message}</li>
              ))}
            </ul>
          </Alert>
        </div>
      )}
      <fieldset className="mt-3">
        <legend className="text-sm font-semibold text-stone-800">Choose</legend>
        <div className="mt-1 flex flex-wrap gap-4">
          {([
            ["publish", "Publish"],
            ["request_changes", "Request changes"],
            ["decline", "Decline"],
          ] as const).map(([v, label]) => (
            <label key={v} className="flex items-center gap-1.5">
              <input type="radio" name="decision" value={v} checked={decision === v} onChange={() => setDecision(v)} />
              {label}
            </label>
          ))}
        </div>
      </fieldset>
      <div className="mt-3">
        <label htmlFor="decision-comment" className="block text-sm font-semibold text-stone-800">
          {decision === "decline" ? "Reason (required)" : decision === "request_changes" ? "What should change (required)" : "Note to the depositor (optional)"}
        </label>
        <textarea id="decision-comment" rows={4} value={comment} onChange={(e) => setComment(e.target.value)} aria-required={needsComment || undefined} className="mt-1 block w-full rounded border border-stone-400 px-3 py-2 focus:border-moss-600 focus:outline-none focus:ring-2 focus:ring-moss-200" />
      </div>
      {err && <div className="mt-3"><Alert tone="error" title={err.message} /></div>}
      <div className="mt-4">
        <Button busy={m.isPending} disabled={!decision || (needsComment && !comment.trim())}>
          {decision === "publish" ? "Publish" : decision === "request_changes" ? "Send the change request" : decision === "decline" ? "Decline" : "Record the decision"}
        </Button>
      </div>
    </form>
  );
}

function WithdrawForm({ r }: { r: ReviewDetail }) {
  const [reason, setReason] = useState("");
  const m = useWithdrawDataset(r.versionId);
  if (r.version.state !== "published" || !r.accession) return null;
  return (
    <form
      aria-labelledby="withdraw-h"
      className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-stone-200"
      onSubmit={(e) => {
        e.preventDefault();
        if (window.confirm(`Withdraw ${r.accession}? Its data leave the catalogue and downloads; a tombstone page keeps the accession, the citation and your reason.`)) m.mutate({ accession: r.accession!, reason });
      }}
    >
      <h2 id="withdraw-h" className="text-xl font-bold text-moss-700">
        Withdraw {r.accession}
      </h2>
      <p className="mt-1 text-sm text-stone-700">Only when the data must leave the catalogue (e.g. a serious error). The accession is never reused.</p>
      <label htmlFor="withdraw-reason" className="mt-3 block text-sm font-semibold text-stone-800">
        Reason (required, shown on the tombstone page)
      </label>
      <textarea id="withdraw-reason" rows={3} value={reason} onChange={(e) => setReason(e.target.value)} aria-required="true" className="mt-1 block w-full rounded border border-stone-400 px-3 py-2 focus:border-moss-600 focus:outline-none focus:ring-2 focus:ring-moss-200" />
      {m.error && <div className="mt-3"><Alert tone="error" title={m.error.message} /></div>}
      <div className="mt-3">
        <Button variant="danger" busy={m.isPending} disabled={!reason.trim()}>
          Withdraw the dataset
        </Button>
      </div>
    </form>
  );
}

function ReviewThread({ versionId }: { versionId: number }) {
  const { data, error } = useReviewThread(versionId);
  const post = usePostReviewComment(versionId);
  if (error) return <Alert tone="error" title={`The conversation could not be loaded: ${error.message}`} />;
  if (!data) return null;
  return <SubmissionThread entries={data.entries} side={data.side} canComment={data.canComment} onSend={(b) => post.mutateAsync(b)} sending={post.isPending} error={post.error?.message ?? null} closedNote="The conversation opens when the depositor submits." />;
}

export function ReviewPage({ versionId }: { versionId: number }) {
  const { data: r, error, isPending } = useReview(versionId);
  if (isPending) return <p role="status">Loading the submission…</p>;
  if (error || !r) return <Alert tone="error" title={error instanceof ApiClientError && error.status === 404 ? "No such submission." : (error?.message ?? "Not found")} />;
  const last = r.reviews[r.reviews.length - 1];
  return (
    <div className="grid gap-6">
      <div>
        <p className="text-sm">
          <Link to={paths.reviewQueue.href()} className="text-moss-700 underline">
            Review queue
          </Link>
        </p>
        <h1 className="mt-1 text-2xl font-bold text-moss-700">Review: {r.metadata.title || "(untitled)"}</h1>
        <p className="mt-1 text-stone-700">
          Version {r.version.number}
          {r.accession ? ` of ${r.accession}` : ""} by {r.depositor.displayName} ({r.depositor.email}) · state <strong>{r.version.state.replace("_", " ")}</strong>
          {r.version.submittedAt ? ` · submitted ${new Date(r.version.submittedAt).toLocaleString()}` : ""}
        </p>
      </div>
      {r.version.state === "published" && r.accession && (
        <Alert tone="success" title={`Published as ${r.accession}.`}>
          <Link className="underline" to={`/datasets/${r.accession}`}>Open the dataset page</Link>. {figuresState(r.networks)}
        </Alert>
      )}
      {r.version.state === "changes_requested" && last && <Alert tone="info" title={`Changes requested by ${last.curator}`}><p className="whitespace-pre-wrap">{last.comment}</p></Alert>}
      {r.version.state === "declined" && last && <Alert tone="info" title={`Declined by ${last.curator}`}><p className="whitespace-pre-wrap">{last.comment}</p></Alert>}
      {r.version.state === "withdrawn" && r.withdrawal && <Alert tone="info" title={`Withdrawn on ${new Date(r.withdrawal.at).toLocaleDateString()}`}><p className="whitespace-pre-wrap">{r.withdrawal.reason}</p></Alert>}
      <DecisionForm r={r} />
      <ReviewThread versionId={r.versionId} />
      {r.version.state !== "draft" && <SubmissionDiffSection versionId={r.versionId} submittedAt={r.version.submittedAt} />}
      <StudyBlock key={`s${r.lockVersion}`} r={r} />
      <section aria-labelledby="networks-h">
        <h2 id="networks-h" className="text-xl font-bold text-moss-700">
          Networks ({r.networks.length})
        </h2>
        <ol className="mt-3 grid gap-4">{r.networks.map((n) => <NetworkBlock key={`${n.id}-${r.lockVersion}`} r={r} n={n} />)}</ol>
      </section>
      <WithdrawForm r={r} />
      <section aria-labelledby="history-h" className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-stone-200">
        <h2 id="history-h" className="text-xl font-bold text-moss-700">
          History
        </h2>
        <ol className="mt-3 grid gap-1 text-sm">
          {r.history.map((h) => (
            <li key={h.id}>
              <time dateTime={h.at} className="text-stone-700">{new Date(h.at).toLocaleString()}</time> · {historyLabel(h)}
              {h.actor ? ` by ${h.actor}` : ""}
              {typeof h.details.comment === "string" && h.details.comment ? `: “${h.details.comment}”` : ""}
            </li>
          ))}
        </ol>
      </section>
    </div>
  );
}
