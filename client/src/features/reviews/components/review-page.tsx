/**
 * The review page of one submission: metadata (with exact coordinates and contact e-mail), network
 * previews, parse warnings, schema findings, the duplicate-file flag, the decision form, metadata
 * corrections and the dataset's history.
 */
import { Link } from "react-router-dom";
import { ApiClientError } from "../../../lib/api-client";
import { paths } from "../../../config/paths";
import { Alert } from "../../../components/ui/form";
import { useReview } from "../api/get-review";
import { figuresState } from "../utils/figures-state";
import { DecisionForm } from "./decision-form";
import { NetworkBlock } from "./network-block";
import { ReviewHistory } from "./review-history";
import { ReviewThread } from "./review-thread";
import { StudyBlock } from "./study-block";
import { SubmissionDiffSection } from "./submission-diff";
import { WithdrawForm } from "./withdraw-form";

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
      <ReviewHistory history={r.history} />
    </div>
  );
}
