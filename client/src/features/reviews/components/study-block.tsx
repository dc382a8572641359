/** The study metadata of a submission on the review page (contact e-mail included), with the curator's correction form. */
import { useState } from "react";
import { StudyForm, type StudyDraft } from "../../../components/metadata/study-form";
import { prune, studyErrors } from "../../../components/metadata/validate";
import { correctStudy, useReviewMutation } from "../api/mutations";
import type { ReviewDetail } from "../api/types";
import { CorrectButton, CorrectionActions, Field } from "./metadata-correction";
import { canCorrect } from "../utils/corrections";

export function StudyBlock({ r }: { r: ReviewDetail }) {
  const [editing, setEditing] = useState(false);
  const [draft, setDraft] = useState<StudyDraft>(r.metadata as StudyDraft);
  const save = useReviewMutation((meta: unknown) => correctStudy(r.versionId, meta, r.lockVersion));
  const m = r.metadata;
  const published = r.version.state === "published";
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
          {canCorrect(r, "study") && <CorrectButton onClick={() => setEditing(true)}>Correct the study metadata</CorrectButton>}
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
          <CorrectionActions error={save.error} busy={save.isPending} onCancel={() => setEditing(false)} />
        </form>
      )}
    </section>
  );
}
