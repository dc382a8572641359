/** Withdraw, on the dataset page, for curators and admins: a reason (shown on the tombstone) and a confirmation. */
import { useState } from "react";
import { Alert, Button } from "../../../components/ui/form";
import { useWithdrawDataset } from "../api/withdraw-dataset";

export function WithdrawSection({ accession }: { accession: string }) {
  const [reason, setReason] = useState("");
  const [confirming, setConfirming] = useState(false);
  const m = useWithdrawDataset();
  return (
    <section aria-labelledby="withdraw-h" className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-stone-200">
      <h2 id="withdraw-h" className="text-xl font-bold text-moss-700">
        Withdraw {accession}
      </h2>
      <p className="mt-1 text-sm text-stone-700">Curators only, when the data must leave the catalogue and bundles (e.g. a serious error). A tombstone page keeps the accession, the citation and the reason; the accession is never reused.</p>
      <label htmlFor="withdraw-reason" className="mt-3 block text-sm font-semibold text-stone-800">
        Reason (required, shown on the tombstone page)
      </label>
      <textarea id="withdraw-reason" rows={3} value={reason} onChange={(e) => { setReason(e.target.value); setConfirming(false); }} aria-required="true" className="mt-1 block w-full rounded border border-stone-400 px-3 py-2 focus:border-moss-600 focus:outline-none focus:ring-2 focus:ring-moss-200" />
      {m.error && <div className="mt-3"><Alert tone="error" title={m.error.message} /></div>}
      <div className="mt-3 flex flex-wrap items-center gap-3">
        {!confirming ? (
          <Button type="button" variant="danger" disabled={!reason.trim()} onClick={() => setConfirming(true)}>
            Withdraw the dataset…
          </Button>
        ) : (
          <>
            <span role="alert" className="text-sm font-semibold text-red-900">Withdraw every published version of {accession}? This cannot be undone.</span>
            <Button type="button" variant="danger" busy={m.isPending} onClick={() => m.mutate({ accession, reason: reason.trim() })}>
              Yes, withdraw {accession}
            </Button>
            <Button type="button" variant="secondary" onClick={() => setConfirming(false)}>
              Cancel
            </Button>
          </>
        )}
      </div>
    </section>
  );
}
