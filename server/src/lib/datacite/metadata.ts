/**
 * The DataCite metadata of Tanglebank's DOIs, built from the study metadata (schemas/study.schema.json):
 * creators with their ORCID iDs and affiliations, title, publisher, publication year, resource type
 * Dataset, keywords as subjects, the licence with its SPDX identifier, the description, dates, and related
 * identifiers (the source publication's DOI, the concept DOI, the previous and next versions).
 *
 * Two kinds of DOI per dataset:
 *   - the concept DOI (e.g. 10.5072/tb-000042) resolves to /datasets/TB-000042, which always shows the
 *     latest published version; its metadata is that version's, and it lists every version (HasVersion);
 *   - a version DOI (10.5072/tb-000042.v2) resolves to /datasets/TB-000042/v/2 (IsVersionOf the concept).
 * A withdrawn version keeps its DOI and URL (the page is its tombstone); its metadata says when and why
 * it was withdrawn. Pure functions: the DOI job feeds them rows from the database.
 */
import { createHash } from "node:crypto";
import type { Creator, StudyMetadata } from "@shared/types/dataset";
import { PUBLISHER, splitName } from "@shared/citation";
import { DATACITE_SCHEMA_URI } from "./required-fields";

export interface DoiVersionInput {
  number: number;
  state: "published" | "withdrawn";
  metadata: Partial<StudyMetadata>;
  publishedAt: Date | null;
  withdrawnAt: Date | null;
  withdrawalReason: string | null;
  /** The version's DOI (null when none was reserved for it). */
  doi: string | null;
}

export interface DoiDatasetInput {
  accession: string;
  conceptDoi: string | null;
  /** Published and withdrawn versions, any order. */
  versions: DoiVersionInput[];
  publicUrl: string;
}

export type DataciteAttributes = Record<string, unknown> & { doi: string; url: string };

/** The DOI names Tanglebank gives: `<prefix>/tb-000042` (concept) and `<prefix>/tb-000042.v2` (a version). */
export function conceptDoiName(prefix: string, accession: string): string {
  return `${prefix}/${accession.toLowerCase()}`;
}
export function versionDoiName(prefix: string, accession: string, version: number): string {
  return `${conceptDoiName(prefix, accession)}.v${version}`;
}

const LICENCES: Record<string, { rights: string; rightsUri: string }> = {
  "CC0-1.0": { rights: "Creative Commons Zero v1.0 Universal", rightsUri: "https://creativecommons.org/publicdomain/zero/1.0/legalcode" },
  "CC-BY-4.0": { rights: "Creative Commons Attribution 4.0 International", rightsUri: "https://creativecommons.org/licenses/by/4.0/legalcode" },
};

function orcidUri(orcid: string): string {
  return `https://orcid.org/${orcid.replace(/^https?:\/\/(www\.)?orcid\.org\//i, "")}`;
}

function creator(c: Creator): Record<string, unknown> {
  const { family, given } = splitName(c.name);
  return {
    name: given ? `${family}, ${given}` : family,
    nameType: "Personal",
    ...(given ? { givenName: given } : {}),
    familyName: family,
    ...(c.orcid ? { nameIdentifiers: [{ nameIdentifier: orcidUri(c.orcid), nameIdentifierScheme: "ORCID", schemeUri: "https://orcid.org" }] } : {}),
    ...(c.affiliation ? { affiliation: [{ name: c.affiliation }] } : {}),
  };
}

const isoDay = (d: Date) => d.toISOString().slice(0, 10);

/** The attributes every DOI of a version's metadata shares (creators, title, rights, …). */
function describe(md: Partial<StudyMetadata>, accession: string): Record<string, unknown> {
  const licence = md.licence ? LICENCES[md.licence] : undefined;
  const out: Record<string, unknown> = {
    creators: (md.creators ?? []).filter((c) => c?.name?.trim()).map(creator),
    titles: [{ title: md.title?.trim() || accession }],
    publisher: { name: PUBLISHER },
    types: { resourceTypeGeneral: "Dataset", resourceType: "Ecological interaction networks" },
    subjects: (md.keywords ?? []).filter((k) => k.trim()).map((subject) => ({ subject })),
    language: "en",
    schemaVersion: DATACITE_SCHEMA_URI,
  };
  if (licence && md.licence) {
    out.rightsList = [{ ...licence, rightsIdentifier: md.licence.toLowerCase(), rightsIdentifierScheme: "SPDX", schemeUri: "https://spdx.org/licenses/" }];
  }
  return out;
}

function publicationRelation(md: Partial<StudyMetadata>): Array<Record<string, string>> {
  const doi = md.publication?.doi?.trim().replace(/^https?:\/\/(dx\.)?doi\.org\//i, "");
  return doi ? [{ relatedIdentifier: doi, relatedIdentifierType: "DOI", relationType: "IsSupplementTo" }] : [];
}

function withdrawalNote(v: DoiVersionInput): string {
  const when = v.withdrawnAt ? ` on ${isoDay(v.withdrawnAt)}` : "";
  return `This version was withdrawn${when}${v.withdrawalReason ? `: ${v.withdrawalReason}` : "."} Its DOI resolves to the tombstone page, which keeps the citation and the reason.`;
}

/** DataCite attributes of version `number`'s DOI (event "publish": findable). */
export function versionDoiAttributes(input: DoiDatasetInput, number: number): DataciteAttributes {
  const sorted = [...input.versions].sort((a, b) => a.number - b.number);
  const i = sorted.findIndex((v) => v.number === number);
  const v = sorted[i];
  if (!v?.doi) throw new Error(`${input.accession} v${number} has no DOI`);
  const md = v.metadata;
  const prev = sorted.slice(0, i).reverse().find((x) => x.doi);
  const next = sorted.slice(i + 1).find((x) => x.doi);
  const related = [
    ...publicationRelation(md),
    ...(input.conceptDoi ? [{ relatedIdentifier: input.conceptDoi, relatedIdentifierType: "DOI", relationType: "IsVersionOf" }] : []),
    ...(prev?.doi ? [{ relatedIdentifier: prev.doi, relatedIdentifierType: "DOI", relationType: "IsNewVersionOf" }] : []),
    ...(next?.doi ? [{ relatedIdentifier: next.doi, relatedIdentifierType: "DOI", relationType: "IsPreviousVersionOf" }] : []),
  ];
  const published = v.publishedAt ?? v.withdrawnAt ?? new Date();
  const descriptions = [
    ...(md.description?.trim() ? [{ description: md.description.trim(), descriptionType: "Abstract" }] : []),
    ...(v.state === "withdrawn" ? [{ description: withdrawalNote(v), descriptionType: "Other" }] : []),
  ];
  return {
    doi: v.doi,
    event: "publish",
    url: `${input.publicUrl}/datasets/${input.accession}/v/${v.number}`,
    ...describe(md, input.accession),
    publicationYear: published.getUTCFullYear(),
    version: String(v.number),
    descriptions,
    dates: [{ date: isoDay(published), dateType: "Issued" }, ...(v.state === "withdrawn" && v.withdrawnAt ? [{ date: isoDay(v.withdrawnAt), dateType: "Withdrawn" }] : [])],
    relatedIdentifiers: related,
    alternateIdentifiers: [{ alternateIdentifier: `${input.accession}/v${v.number}`, alternateIdentifierType: "Tanglebank accession" }],
  };
}

/**
 * DataCite attributes of the concept DOI: the latest published version's metadata (the latest version of
 * any state when all were withdrawn), the first publication's year, and every version as HasVersion.
 */
export function conceptDoiAttributes(input: DoiDatasetInput): DataciteAttributes {
  if (!input.conceptDoi) throw new Error(`${input.accession} has no concept DOI`);
  const sorted = [...input.versions].sort((a, b) => a.number - b.number);
  if (!sorted.length) throw new Error(`${input.accession} has no published version`);
  const live = sorted.filter((v) => v.state === "published");
  const shown = (live.length ? live : sorted)[(live.length ? live : sorted).length - 1];
  const md = shown.metadata;
  const first = sorted[0].publishedAt ?? sorted[0].withdrawnAt ?? new Date();
  const allWithdrawn = !live.length;
  const descriptions = [
    ...(md.description?.trim() ? [{ description: md.description.trim(), descriptionType: "Abstract" }] : []),
    { description: `All versions of ${input.accession}; this DOI resolves to the latest published version.`, descriptionType: "Other" },
    ...(allWithdrawn ? [{ description: withdrawalNote(shown), descriptionType: "Other" }] : []),
  ];
  return {
    doi: input.conceptDoi,
    event: "publish",
    url: `${input.publicUrl}/datasets/${input.accession}`,
    ...describe(md, input.accession),
    publicationYear: first.getUTCFullYear(),
    descriptions,
    dates: [{ date: isoDay(first), dateType: "Issued" }, ...(shown.publishedAt && shown.publishedAt > first ? [{ date: isoDay(shown.publishedAt), dateType: "Updated" }] : [])],
    relatedIdentifiers: [
      ...publicationRelation(md),
      ...sorted.filter((v) => v.doi).map((v) => ({ relatedIdentifier: v.doi!, relatedIdentifierType: "DOI", relationType: "HasVersion" })),
    ],
    alternateIdentifiers: [{ alternateIdentifier: input.accession, alternateIdentifierType: "Tanglebank accession" }],
  };
}

/** SHA-256 of attributes with sorted keys: equal hashes mean DataCite already holds this metadata. */
export function attributesHash(attrs: Record<string, unknown>): string {
  const canon = (v: unknown): unknown =>
    Array.isArray(v) ? v.map(canon) : v && typeof v === "object" ? Object.fromEntries(Object.keys(v).sort().map((k) => [k, canon((v as Record<string, unknown>)[k])])) : v;
  return createHash("sha256").update(JSON.stringify(canon(attrs))).digest("hex");
}
