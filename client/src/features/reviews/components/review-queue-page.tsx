/** The Review queue: submissions by state (waiting for a curator by default, oldest first), with search. */
import { Link, useSearchParams } from "react-router-dom";
import { paths } from "../../../config/paths";
import { Alert } from "../../../components/ui/form";
import { useReviewQueue } from "../api/get-review-queue";

function age(iso: string): string {
  const h = (Date.now() - new Date(iso).getTime()) / 3_600_000;
  if (h < 1) return "less than an hour";
  if (h < 48) return `${Math.floor(h)} hour${Math.floor(h) === 1 ? "" : "s"}`;
  return `${Math.floor(h / 24)} days`;
}

const STATES: Array<[string, string]> = [
  ["submitted", "Waiting for a decision"],
  ["changes_requested", "Changes requested"],
  ["published", "Published"],
  ["declined", "Declined"],
  ["withdrawn", "Withdrawn"],
];

export function ReviewQueuePage() {
  const [params, setParams] = useSearchParams();
  const state = params.get("state") ?? "submitted";
  const q = params.get("q") ?? "";
  const { data, error, isPending } = useReviewQueue({ state, q });
  const set = (k: string, v: string) => setParams((p) => { if (v) p.set(k, v); else p.delete(k); return p; });
  return (
    <div>
      <h1 className="text-2xl font-bold text-moss-700">Review queue</h1>
      <p className="mt-1 text-stone-700">Submissions by state; those awaiting a curator’s decision come first, the longest-waiting at the top. You cannot decide on your own deposits.</p>
      <form role="search" className="mt-4 flex flex-wrap items-end gap-3" onSubmit={(e) => { e.preventDefault(); set("q", String(new FormData(e.currentTarget).get("q") ?? "").trim()); }}>
        <label className="text-sm">
          <span className="block font-semibold text-stone-800">State</span>
          <select value={state} onChange={(e) => set("state", e.target.value === "submitted" ? "" : e.target.value)} className="mt-1 rounded border border-stone-400 bg-white px-2 py-1.5">
            {STATES.map(([v, label]) => (
              <option key={v} value={v}>
                {label}
              </option>
            ))}
          </select>
        </label>
        <label className="text-sm">
          <span className="block font-semibold text-stone-800">Search title, depositor or accession</span>
          <input key={q} name="q" defaultValue={q} className="mt-1 rounded border border-stone-400 px-2 py-1.5" />
        </label>
        <button type="submit" className="rounded border border-moss-700 px-3 py-1.5 text-sm font-semibold text-moss-700 hover:bg-moss-50">
          Search
        </button>
      </form>
      {isPending && <p role="status" className="mt-4">Loading…</p>}
      {error && <div className="mt-4"><Alert tone="error" title={error.message} /></div>}
      {data && data.data.length === 0 && <p className="mt-6 text-stone-700">{state === "submitted" && !q ? "Nothing is waiting for review." : "No submission matches."}</p>}
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
