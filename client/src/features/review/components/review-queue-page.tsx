/** The Review queue: submissions waiting for a curator, oldest first. */
import { Link } from "react-router-dom";
import { paths } from "../../../config/paths";
import { Alert } from "../../../components/ui/form";
import { useReviewQueue } from "../api/get-review-queue";

function age(iso: string): string {
  const h = (Date.now() - new Date(iso).getTime()) / 3_600_000;
  if (h < 1) return "less than an hour";
  if (h < 48) return `${Math.floor(h)} hour${Math.floor(h) === 1 ? "" : "s"}`;
  return `${Math.floor(h / 24)} days`;
}

export function ReviewQueuePage() {
  const { data, error, isPending } = useReviewQueue();
  return (
    <div>
      <h1 className="text-2xl font-bold text-moss-700">Review queue</h1>
      <p className="mt-1 text-stone-700">Submissions awaiting a curator’s decision, the longest-waiting first. You cannot decide on your own deposits.</p>
      {isPending && <p role="status" className="mt-4">Loading…</p>}
      {error && <div className="mt-4"><Alert tone="error" title={error.message} /></div>}
      {data && data.data.length === 0 && <p className="mt-6 text-stone-700">Nothing is waiting for review.</p>}
      {data && data.data.length > 0 && (
        <div className="mt-6 overflow-x-auto rounded-lg bg-white p-4 shadow-sm ring-1 ring-stone-200">
          <table className="w-full text-left">
            <caption className="sr-only">Submissions awaiting review</caption>
            <thead>
              <tr className="text-sm text-stone-700">
                <th scope="col" className="pb-2 pr-4">Submission</th>
                <th scope="col" className="pb-2 pr-4">Depositor</th>
                <th scope="col" className="pb-2 pr-4">Networks</th>
                <th scope="col" className="pb-2">Waiting</th>
              </tr>
            </thead>
            <tbody>
              {data.data.map((q) => (
                <tr key={q.versionId} className="border-t border-stone-200 align-top">
                  <td className="py-3 pr-4">
                    <Link to={paths.review.href(q.versionId)} className="font-semibold text-moss-700 underline">
                      {q.title}
                    </Link>
                    <div className="text-sm text-stone-700">
                      {q.accession ? `${q.accession}, ` : ""}version {q.number}
                      {q.resubmission ? " · resubmitted after changes" : ""}
                      {q.ownDeposit ? " · your own deposit" : ""}
                    </div>
                  </td>
                  <td className="py-3 pr-4">{q.depositor}</td>
                  <td className="py-3 pr-4">{q.networkCount}</td>
                  <td className="py-3">
                    <time dateTime={q.submittedAt} title={new Date(q.submittedAt).toLocaleString()}>
                      {age(q.submittedAt)}
                    </time>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
