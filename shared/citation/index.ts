/**
 * Citations of a published dataset version: plain text, BibTeX and RIS. Pure functions of the study
 * metadata, the accession, the version number, the publication year and the page URL.
 *
 * Author names: a creator's `name` is one string. "Family, Given" is read as written; otherwise the last
 * word is taken as the family name ("Rowan Hale" → Hale, Rowan). Text citations use "Family G." initials.
 * The formats follow DataCite's recommended data citation (Creator (Year): Title. Version. Publisher.
 * Identifier), BibTeX's @dataset entry (biblatex's type for data, which reference managers import as a
 * dataset; classic BibTeX styles print an unknown type as @misc) and the RIS tag list (TY DATA).
 * With a registered DOI the identifier is the DOI's resolver URL (text), a `doi` field (BibTeX) and a DO
 * tag (RIS); without one (not yet registered) the page URL stands in.
 *
 * The source publication a depositor entered (a free-text citation and an optional DOI) becomes an entry of
 * its own (`sourceToBibTeX`), named by the dataset entry's `related` field.
 */
import type { Creator, StudyMetadata } from "../types/dataset";

export const PUBLISHER = "Tanglebank";

export interface CitationInput {
  metadata: Pick<StudyMetadata, "title" | "creators"> & Partial<Pick<StudyMetadata, "keywords" | "licence" | "description" | "publication">>;
  accession: string;
  version: number;
  year: number;
  url: string;
  /** The version's registered DOI, e.g. "10.5072/tb-000042.v2" (omitted while pending). */
  doi?: string | null;
}

/** The resolver URL of a DOI. */
export function doiUrl(doi: string): string {
  return `https://doi.org/${doi}`;
}

export interface PersonName {
  family: string;
  given: string;
}

export function splitName(name: string): PersonName {
  const n = name.replace(/\s+/g, " ").trim();
  const comma = n.indexOf(",");
  if (comma >= 0) return { family: n.slice(0, comma).trim(), given: n.slice(comma + 1).trim() };
  const parts = n.split(" ");
  if (parts.length === 1) return { family: parts[0], given: "" };
  return { family: parts[parts.length - 1], given: parts.slice(0, -1).join(" ") };
}

function initials(given: string): string {
  return given
    .split(/[\s]+/)
    .filter(Boolean)
    .map((g) => g.split("-").map((p) => (p[0] ? p[0].toUpperCase() : "")).join("-"))
    .join("");
}

function textAuthor(c: Creator): string {
  const { family, given } = splitName(c.name);
  const ini = initials(given);
  return ini ? `${family} ${ini}` : family;
}

function oneLine(s: string): string {
  return s.replace(/\s+/g, " ").trim();
}

/** e.g. "Hale R, Okafor I (2025) Pollinators of the Verrin Hills. Version 2. Tanglebank. TB-000042. https://…" */
export function formatCitationText(input: CitationInput): string {
  const authors = input.metadata.creators.map(textAuthor).join(", ") || PUBLISHER;
  const title = oneLine(input.metadata.title).replace(/[.]+$/, "");
  return `${authors} (${input.year}) ${title}. Version ${input.version}. ${PUBLISHER}. ${input.accession}. ${input.doi ? doiUrl(input.doi) : input.url}`;
}

const BIBTEX_SPECIAL: Record<string, string> = {
  "\\": "\\textbackslash{}",
  "{": "\\{",
  "}": "\\}",
  "%": "\\%",
  "&": "\\&",
  $: "\\$",
  "#": "\\#",
  _: "\\_",
  "~": "\\textasciitilde{}",
  "^": "\\textasciicircum{}",
};

/** Escapes characters BibTeX/LaTeX treat specially; Unicode letters stay as they are (UTF-8 .bib files). */
export function escapeBibTeX(s: string): string {
  return oneLine(s).replace(/[\\{}%&$#_~^]/g, (ch) => BIBTEX_SPECIAL[ch]);
}

/** A citation key made of safe characters only, e.g. "TB-000042-v2". */
export function bibTeXKey(accession: string, version: number): string {
  return `${accession.replace(/[^A-Za-z0-9-]/g, "")}-v${version}`;
}

/** Key of the source publication's entry of a dataset version, e.g. "TB-000042-v2-source". */
export function sourceBibTeXKey(accession: string, version: number): string {
  return `${bibTeXKey(accession, version)}-source`;
}

/** One BibTeX @dataset entry; `relatedKey` names the entry of its source publication, when there is one. */
export function toBibTeX(input: CitationInput, relatedKey?: string): string {
  const authors = input.metadata.creators
    .map((c) => {
      const { family, given } = splitName(c.name);
      return given ? `${escapeBibTeX(family)}, ${escapeBibTeX(given)}` : `{${escapeBibTeX(family)}}`;
    })
    .join(" and ");
  const fields: Array<[string, string]> = [
    ["author", authors || `{${PUBLISHER}}`],
    // double braces keep the title's capitals as written
    ["title", `{${escapeBibTeX(input.metadata.title)}}`],
    ["year", String(input.year)],
    ["publisher", PUBLISHER],
    ["version", String(input.version)],
    ...(input.doi ? ([["doi", escapeBibTeX(input.doi)]] as Array<[string, string]>) : []),
    ["url", input.url],
    ["note", `Dataset ${escapeBibTeX(input.accession)}, version ${input.version}`],
  ];
  if (input.metadata.keywords?.length) fields.push(["keywords", input.metadata.keywords.map(escapeBibTeX).join(", ")]);
  if (input.metadata.licence) fields.push(["copyright", input.metadata.licence]);
  if (relatedKey) fields.push(["related", relatedKey]);
  return entry("dataset", bibTeXKey(input.accession, input.version), fields);
}

function entry(type: string, key: string, fields: Array<[string, string]>): string {
  const body = fields.map(([k, v]) => `  ${k} = {${v}}`).join(",\n");
  return `@${type}{${key},\n${body}\n}\n`;
}

/** A DOI as its bare name ("10.1234/abc"), from a bare DOI, a "doi:" form or a doi.org address. */
export function bareDoi(doi: string): string {
  return doi.trim().replace(/^(?:https?:\/\/(?:dx\.)?doi\.org\/|doi:\s*)/i, "");
}

/**
 * The source publication of a dataset version as a BibTeX @misc entry: the citation as the depositor wrote
 * it (as the title, so that it shows in a reference list as written), its year when the citation holds one
 * (the first four-digit year from 1600 on), the DOI and its address. Null when no citation was entered.
 */
export function sourceToBibTeX(publication: { citation?: string; doi?: string } | undefined, accession: string, version: number): string | null {
  const citation = publication?.citation?.trim();
  if (!citation) return null;
  const fields: Array<[string, string]> = [["title", `{${escapeBibTeX(citation)}}`]];
  const year = /\b(1[6-9]\d\d|20\d\d)\b/.exec(citation)?.[1];
  if (year) fields.push(["year", year]);
  const doi = publication?.doi ? bareDoi(publication.doi) : "";
  if (doi) fields.push(["doi", escapeBibTeX(doi)], ["url", doiUrl(doi)]);
  fields.push(["note", `Source publication of ${PUBLISHER} dataset ${escapeBibTeX(accession)}, version ${version}`]);
  return entry("misc", sourceBibTeXKey(accession, version), fields);
}

function risLine(tag: string, value: string): string {
  return `${tag}  - ${oneLine(value)}`;
}

/** One RIS record (TY DATA), CRLF line ends as the format asks. */
export function toRIS(input: CitationInput): string {
  const lines: string[] = [risLine("TY", "DATA")];
  for (const c of input.metadata.creators) {
    const { family, given } = splitName(c.name);
    lines.push(risLine("AU", given ? `${family}, ${given}` : family));
  }
  lines.push(risLine("TI", input.metadata.title));
  lines.push(risLine("PY", String(input.year)));
  lines.push(risLine("PB", PUBLISHER));
  lines.push(risLine("ET", `Version ${input.version}`));
  lines.push(risLine("ID", `${input.accession}-v${input.version}`));
  lines.push(risLine("AN", input.accession));
  if (input.doi) lines.push(risLine("DO", input.doi));
  lines.push(risLine("UR", input.url));
  for (const k of input.metadata.keywords ?? []) lines.push(risLine("KW", k));
  if (input.metadata.description) lines.push(risLine("AB", input.metadata.description));
  if (input.metadata.licence) lines.push(risLine("N1", `Licence: ${input.metadata.licence}`));
  lines.push("ER  - ");
  return lines.join("\r\n") + "\r\n";
}

/** SPDX licence page for a licence id. */
export function licenceUrl(licence: string): string {
  return `https://spdx.org/licenses/${licence}.html`;
}

/** The dataset entry followed by its source publication's entry (when a citation was entered), linked by `related`. */
export function datasetBibTeX(input: CitationInput): string {
  const source = sourceToBibTeX(input.metadata.publication, input.accession, input.version);
  return toBibTeX(input, source ? sourceBibTeXKey(input.accession, input.version) : undefined) + (source ? "\n" + source : "");
}

/** What a collection's citation needs (a saved set of networks; its owner is its author). */
export interface CollectionCitationInput {
  name: string;
  description?: string;
  owner: string;
  code: string;
  revision: number;
  networks: number;
  year: number;
  url: string;
}

/** e.g. "Hale R (2026) Heath webs for the 2026 meta-analysis. Tanglebank collection TBC-000012, revision 3 (24 networks). https://…" */
export function formatCollectionCitation(c: CollectionCitationInput): string {
  const author = textAuthor({ name: c.owner }) || PUBLISHER;
  return `${author} (${c.year}) ${oneLine(c.name).replace(/[.]+$/, "")}. ${PUBLISHER} collection ${c.code}, revision ${c.revision} (${c.networks} network${c.networks === 1 ? "" : "s"}). ${c.url}`;
}

/** A collection as a BibTeX @dataset entry (key e.g. "TBC-000012-r3"). */
export function collectionToBibTeX(c: CollectionCitationInput): string {
  const { family, given } = splitName(c.owner);
  const fields: Array<[string, string]> = [
    ["author", given ? `${escapeBibTeX(family)}, ${escapeBibTeX(given)}` : `{${escapeBibTeX(family || PUBLISHER)}}`],
    ["title", `{${escapeBibTeX(c.name)}}`],
    ["year", String(c.year)],
    ["publisher", PUBLISHER],
    ["version", `revision ${c.revision}`],
    ["url", c.url],
    ["note", `${PUBLISHER} collection ${escapeBibTeX(c.code)}, revision ${c.revision}: ${c.networks} network${c.networks === 1 ? "" : "s"}; cite the datasets it holds too`],
  ];
  return entry("dataset", `${c.code.replace(/[^A-Za-z0-9-]/g, "")}-r${c.revision}`, fields);
}

/** A collection as one RIS record (TY DATA). */
export function collectionToRIS(c: CollectionCitationInput): string {
  const { family, given } = splitName(c.owner);
  const lines = [
    risLine("TY", "DATA"),
    risLine("AU", given ? `${family}, ${given}` : family),
    risLine("TI", c.name),
    risLine("PY", String(c.year)),
    risLine("PB", PUBLISHER),
    risLine("ET", `Revision ${c.revision}`),
    risLine("ID", `${c.code}-r${c.revision}`),
    risLine("AN", c.code),
    risLine("UR", c.url),
    risLine("N1", `${c.networks} network${c.networks === 1 ? "" : "s"}`),
  ];
  if (c.description) lines.push(risLine("AB", c.description));
  lines.push("ER  - ");
  return lines.join("\r\n") + "\r\n";
}
