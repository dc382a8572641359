/** The page a withdrawn dataset leaves behind: accession, reason and citation, so references still resolve. */
import { doiUrl } from "@shared/citation";
import type { DatasetTombstone } from "../api/get-dataset";

export function TombstoneView({ t }: { t: DatasetTombstone }) {
  return (
    <section className="mx-auto max-w-3xl rounded-lg bg-white p-6 ring-1 ring-stone-300" aria-labelledby="tomb-h">
      <h1 id="tomb-h" className="text-2xl font-bold text-stone-900">
        {t.accession}
        {t.version ? ` v${t.version}` : ""} was withdrawn
      </h1>
      <p className="mt-3 text-stone-800">
        Withdrawn on {t.withdrawnAt.slice(0, 10)}. Its data has left the catalogue and bundles; this page keeps the accession and the citation so that
        published references still resolve.
      </p>
      <h2 className="mt-4 font-semibold text-stone-900">Reason</h2>
      <p className="mt-1 text-stone-800">{t.reason}</p>
      <h2 className="mt-4 font-semibold text-stone-900">Citation</h2>
      <p className="mt-1 rounded bg-stone-50 p-3 text-stone-900">{t.citation}</p>
      {t.doi && (
        <p className="mt-2 text-sm text-stone-800">
          Its DOI{" "}
          <a className="font-mono text-moss-700 underline" href={doiUrl(t.doi)} rel="noopener">
            {t.doi}
          </a>{" "}
          still resolves, to this page: DOIs are never deleted.
        </p>
      )}
    </section>
  );
}
