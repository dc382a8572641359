/** Withdrawing a published dataset from the review page (a reason is required and shown on the tombstone). */
import { useState } from "react";
import { Alert, Button } from "../../../components/ui/form";
import { useWithdrawDataset } from "../api/mutations";
import type { ReviewDetail } from "../api/types";

export function WithdrawForm({ r }: { r: ReviewDetail }) {
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
