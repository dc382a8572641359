/**
 * The study-level metadata form (fields of schemas/study.schema.json). Controlled: the parent owns the
 * value and decides when to save. Errors show for fields the person touched, or all after `showAll`.
 */
import type { Creator, StudyMetadata } from "@shared/types/dataset";
import { Area, Choice, Text } from "./fields";
import type { FieldErrors } from "./validate";

export type StudyDraft = Partial<Omit<StudyMetadata, "creators" | "keywords">> & { creators?: Array<Partial<Creator>>; keywords?: string[] };

export const LICENCES = [
  { value: "CC-BY-4.0", label: "CC-BY-4.0 (attribution)" },
  { value: "CC0-1.0", label: "CC0-1.0 (public domain dedication)" },
];

export function StudyForm({ value, onChange, errors, disabled }: { value: StudyDraft; onChange: (v: StudyDraft) => void; errors: FieldErrors; disabled?: boolean }) {
  const set = (patch: Partial<StudyDraft>) => onChange({ ...value, ...patch });
  const creators = value.creators?.length ? value.creators : [{}];
  const setCreator = (i: number, patch: Partial<Creator>) => set({ creators: creators.map((c, k) => (k === i ? { ...c, ...patch } : c)) });
  return (
    <div className="grid gap-4">
      <Text label="Title" required value={value.title} onChange={(title) => set({ title })} error={errors["/title"]} disabled={disabled} />
      <Area label="Description" required value={value.description} onChange={(description) => set({ description })} error={errors["/description"]} hint="What was studied, where and how (at least 20 characters)." disabled={disabled} />
      <fieldset className="rounded border border-stone-300 p-4">
        <legend className="px-1 text-sm font-semibold text-stone-800">Creators, in citation order</legend>
        {errors["/creators"] && <p className="text-sm font-semibold text-red-800">{errors["/creators"]}</p>}
        <ol className="grid gap-3">
          {creators.map((c, i) => (
            <li key={i} className="grid gap-2 md:grid-cols-[2fr_1.2fr_2fr_auto] md:items-end">
              <Text label={`Creator ${i + 1} name`} required value={c.name} onChange={(name) => setCreator(i, { name })} error={errors[`/creators/${i}/name`]} hint={i === 0 ? "Family, Given" : undefined} disabled={disabled} />
              <Text label="ORCID iD" value={c.orcid} onChange={(orcid) => setCreator(i, { orcid })} error={errors[`/creators/${i}/orcid`]} disabled={disabled} />
              <Text label="Affiliation" value={c.affiliation} onChange={(affiliation) => setCreator(i, { affiliation })} error={errors[`/creators/${i}/affiliation`]} disabled={disabled} />
              <button type="button" disabled={disabled || creators.length === 1} onClick={() => set({ creators: creators.filter((_, k) => k !== i) })} className="rounded border border-stone-400 px-3 py-2 text-sm text-stone-800 hover:bg-stone-100 disabled:opacity-50">
                Remove<span className="sr-only"> creator {i + 1}</span>
              </button>
            </li>
          ))}
        </ol>
        <button type="button" disabled={disabled} onClick={() => set({ creators: [...creators, {}] })} className="mt-3 rounded border border-moss-700 px-3 py-1.5 text-sm font-semibold text-moss-700 hover:bg-moss-50">
          Add a creator
        </button>
      </fieldset>
      <div className="grid gap-4 md:grid-cols-2">
        <Choice label="Licence" required value={value.licence} onChange={(licence) => set({ licence: (licence || undefined) as StudyDraft["licence"] })} options={LICENCES} error={errors["/licence"]} disabled={disabled} />
        <Text label="Contact e-mail" required type="email" value={value.contactEmail} onChange={(contactEmail) => set({ contactEmail })} error={errors["/contactEmail"]} hint="Seen by curators only, never shown publicly." disabled={disabled} />
      </div>
      <Text
        label="Keywords"
        required
        value={(value.keywords ?? []).join(", ")}
        onChange={(s) => set({ keywords: s.split(",").map((k) => k.trim()).filter((k, i, all) => k !== "" || i === all.length - 1).filter(Boolean) })}
        error={errors["/keywords"] ?? Object.entries(errors).find(([k]) => k.startsWith("/keywords/"))?.[1]}
        hint="Separated by commas."
        disabled={disabled}
      />
      <div className="grid gap-4 md:grid-cols-[2fr_1fr]">
        <Text label="Source publication (citation)" value={value.publication?.citation} onChange={(citation) => set({ publication: { ...value.publication, citation } as StudyDraft["publication"] })} error={errors["/publication/citation"] ?? errors["/publication"]} disabled={disabled} />
        <Text label="Publication DOI" value={value.publication?.doi} onChange={(doi) => set({ publication: { ...value.publication, doi } as StudyDraft["publication"] })} error={errors["/publication/doi"]} hint="e.g. 10.1234/abc.5678, doi:10.1234/abc.5678 or https://doi.org/10.1234/abc.5678 (stored as 10.1234/abc.5678)" disabled={disabled} />
      </div>
      <Text label="Funding" value={value.funding} onChange={(funding) => set({ funding })} error={errors["/funding"]} disabled={disabled} />
    </div>
  );
}
