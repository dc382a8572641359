/** The curator's decision on a submitted version (publish, request changes, decline), with the schema findings to weigh. */
import { useState } from "react";
import { ApiClientError } from "../../../lib/api-client";
import { Alert, Button } from "../../../components/ui/form";
import { decide, useReviewMutation, type Decision } from "../api/mutations";
import type { ReviewDetail } from "../api/types";

export function DecisionForm({ r }: { r: ReviewDetail }) {
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
