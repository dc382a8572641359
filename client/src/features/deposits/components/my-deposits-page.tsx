/** My deposits: every version of the person's datasets with its state and what they can do next. */
import { Link, useNavigate } from "react-router-dom";
import { paths } from "../../../config/paths";
import { Alert, Button } from "../../../components/ui/form";
import { useMyDeposits } from "../api/get-my-deposits";
import { deleteDeposit, startNewVersion, useDepositMutation } from "../api/mutations";
import { STATE_LABELS, type DepositListItem } from "../api/types";

const STATE_LOOK: Record<string, string> = {
  draft: "bg-stone-100 text-stone-800 ring-stone-300",
  submitted: "bg-lichen-300/40 text-stone-900 ring-lichen-600",
  changes_requested: "bg-orange-50 text-orange-900 ring-orange-700",
  published: "bg-moss-50 text-moss-900 ring-moss-600",
  declined: "bg-red-50 text-red-900 ring-red-800",
  withdrawn: "bg-stone-200 text-stone-800 ring-stone-500",
};

function Row({ d }: { d: DepositListItem }) {
  const navigate = useNavigate();
  const del = useDepositMutation((id: number) => deleteDeposit(id));
  const nv = useDepositMutation((acc: string) => startNewVersion(acc));
  const resume = paths.depositResume.href(d.versionId);
  return (
    <tr className="border-t border-stone-200 align-top">
      <td className="py-3 pr-4">
        <Link to={d.state === "published" && d.accession ? `/datasets/${d.accession}` : resume} className="font-semibold text-moss-700 underline">
          {d.title}
        </Link>
        <div className="text-sm text-stone-700">
          {d.accession ? `${d.accession} · ` : ""}version {d.number} · {d.networkCount} network{d.networkCount === 1 ? "" : "s"}
        </div>
        {d.state === "changes_requested" && d.lastReview?.comment && <p className="mt-1 whitespace-pre-wrap text-sm text-orange-900">Curator: {d.lastReview.comment}</p>}
        {d.state === "declined" && d.lastReview?.comment && <p className="mt-1 text-sm text-red-900">Reason: {d.lastReview.comment}</p>}
      </td>
      <td className="py-3 pr-4">
        <span className={`inline-block rounded-full px-2.5 py-0.5 text-sm font-semibold ring-1 ${STATE_LOOK[d.state]}`}>{STATE_LABELS[d.state]}</span>
      </td>
      <td className="py-3 pr-4 text-sm text-stone-700">{new Date(d.updatedAt).toLocaleString()}</td>
      <td className="py-3">
        <div className="flex flex-wrap gap-2">
          {d.state === "draft" && <Link to={resume} className="rounded bg-moss-700 px-3 py-1.5 text-sm font-semibold text-white hover:bg-moss-600">Resume</Link>}
          {d.state === "changes_requested" && <Link to={`${resume}?step=3`} className="rounded bg-moss-700 px-3 py-1.5 text-sm font-semibold text-white hover:bg-moss-600">Answer the change request</Link>}
          {d.state === "submitted" && <Link to={resume} className="rounded border border-moss-700 px-3 py-1.5 text-sm font-semibold text-moss-700">View</Link>}
          {d.state === "draft" && (
            <Button type="button" variant="danger" className="px-3 py-1.5 text-sm" busy={del.isPending} onClick={() => { if (window.confirm(`Delete the draft “${d.title}”? This cannot be undone.`)) del.mutate(d.versionId); }}>
              Delete draft
            </Button>
          )}
          {d.canStartNewVersion && d.accession && (
            <Button type="button" variant="secondary" className="px-3 py-1.5 text-sm" busy={nv.isPending} onClick={() => nv.mutate(d.accession!, { onSuccess: (r) => r && "versionId" in r && navigate(paths.depositResume.href(r.versionId)) })}>
              Start version {d.number + 1}
            </Button>
          )}
        </div>
        {(del.error || nv.error) && <p role="alert" className="mt-1 text-sm text-red-800">{(del.error ?? nv.error)!.message}</p>}
      </td>
    </tr>
  );
}

export function MyDepositsPage() {
  const { data, error, isPending } = useMyDeposits();
  return (
    <div>
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h1 className="text-2xl font-bold text-moss-700">My deposits</h1>
        <Link to={paths.deposit.href()} className="rounded bg-moss-700 px-4 py-2 font-semibold text-white hover:bg-moss-600">
          New deposit
        </Link>
      </div>
      {isPending && <p role="status" className="mt-4">Loading…</p>}
      {error && <div className="mt-4"><Alert tone="error" title={error.message} /></div>}
      {data && data.data.length === 0 && <p className="mt-6 text-stone-700">You have no deposits yet. Start one with “New deposit”.</p>}
      {data && data.data.length > 0 && (
        <div className="mt-6 overflow-x-auto rounded-lg bg-white p-4 shadow-sm ring-1 ring-stone-200">
          <table className="w-full text-left">
            <caption className="sr-only">Your deposits and their states</caption>
            <thead>
              <tr className="text-sm text-stone-700">
                <th scope="col" className="pb-2 pr-4">Dataset</th>
                <th scope="col" className="pb-2 pr-4">State</th>
                <th scope="col" className="pb-2 pr-4">Last change</th>
                <th scope="col" className="pb-2">Actions</th>
              </tr>
            </thead>
            <tbody>{data.data.map((d) => <Row key={d.versionId} d={d} />)}</tbody>
          </table>
        </div>
      )}
    </div>
  );
}
