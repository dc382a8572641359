/** The dataset page's study section: creators (with verified ORCID iDs), description, keywords, licence, source, funding. */
import type { DatasetDetail } from "@shared/types/dataset";
import { KeywordList } from "../../../components/metadata/keyword-list";
import { SectionCard } from "./section-card";

export function StudySection({ d }: { d: DatasetDetail }) {
  const md = d.metadata;
  return (
    <SectionCard id="study-h" heading="About this dataset">
      <dl className="mt-2 grid gap-x-6 gap-y-3 text-sm md:grid-cols-[12rem_1fr]">
        <dt className="font-semibold text-stone-800">Creators</dt>
        <dd>
          <ul className="space-y-1">
            {md.creators.map((c) => (
              <li key={c.name}>
                {c.name}
                {c.affiliation && <span className="text-stone-700"> — {c.affiliation}</span>}
                {c.orcid && (
                  <>
                    {" "}
                    <a className="text-moss-700 underline" href={`https://orcid.org/${c.orcid.replace(/^https?:\/\/orcid\.org\//, "")}`} rel="noopener">
                      ORCID {c.orcid.replace(/^https?:\/\/orcid\.org\//, "")}
                    </a>
                    {d.verifiedOrcids.includes(c.orcid.replace(/^https?:\/\/orcid\.org\//, "").toUpperCase()) && (
                      <span className="ml-2 rounded bg-moss-50 px-1.5 py-0.5 text-xs font-semibold text-moss-800 ring-1 ring-moss-600" title="A Tanglebank account holding this iD verified it through ORCID's sign-in">
                        ✓ verified
                      </span>
                    )}
                  </>
                )}
              </li>
            ))}
          </ul>
        </dd>
        <dt className="font-semibold text-stone-800">Description</dt>
        <dd className="whitespace-pre-line text-stone-900">{md.description}</dd>
        {md.keywords.length > 0 && (
          <>
            <dt className="font-semibold text-stone-800">Keywords</dt>
            <dd>
              <KeywordList keywords={md.keywords} />
            </dd>
          </>
        )}
        <dt className="font-semibold text-stone-800">Licence</dt>
        <dd>
          <a className="text-moss-700 underline" href={`https://spdx.org/licenses/${md.licence}.html`} rel="noopener license">
            {md.licence}
          </a>
          {md.licence === "CC-BY-4.0" ? " — reuse with attribution (cite below)" : " — public domain dedication; citing is still good practice"}
        </dd>
        {md.publication && (
          <>
            <dt className="font-semibold text-stone-800">Source publication</dt>
            <dd>
              {md.publication.citation}{" "}
              {md.publication.doi && (
                <a className="text-moss-700 underline" href={`https://doi.org/${md.publication.doi}`} rel="noopener">
                  doi:{md.publication.doi}
                </a>
              )}
            </dd>
          </>
        )}
        {md.funding && (
          <>
            <dt className="font-semibold text-stone-800">Funding</dt>
            <dd>{md.funding}</dd>
          </>
        )}
        <dt className="font-semibold text-stone-800">Deposited by</dt>
        <dd>{d.owner.displayName}</dd>
      </dl>
    </SectionCard>
  );
}
