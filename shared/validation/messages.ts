/**
 * Turns JSON Schema validation errors (ajv's error objects, or the same shape from ./mini-validator) into
 * one human message per field, addressed by a JSON pointer to the field (e.g. "/creators/0/orcid").
 * Shared by the server (ajv) and the client (inline field errors), so both say the same thing.
 */

/** The part of an ajv `ErrorObject` we read. */
export interface SchemaError {
  instancePath: string;
  keyword: string;
  params: Record<string, unknown>;
  message?: string;
}

export interface FieldError {
  /** JSON pointer to the field the message is about. */
  path: string;
  message: string;
}

/** Field names as a depositor reads them on the forms. */
const LABELS: Record<string, string> = {
  title: "Title",
  description: "Description",
  creators: "Creators",
  name: "Name",
  orcid: "ORCID iD",
  affiliation: "Affiliation",
  publication: "Source publication",
  citation: "Citation",
  doi: "DOI",
  licence: "Licence",
  keywords: "Keywords",
  funding: "Funding",
  contactEmail: "Contact e-mail",
  interactionType: "Interaction type",
  weightMeaning: "Weight meaning",
  rowLevel: "Row nodes are",
  colLevel: "Column nodes are",
  directionMeaning: "Direction meaning",
  locality: "Locality",
  placeName: "Place name",
  countryCode: "Country code",
  decimalLatitude: "Latitude",
  decimalLongitude: "Longitude",
  coordinatePrecision: "Coordinate precision",
  elevation: "Elevation",
  generalisation: "Coordinate generalisation",
  habitat: "Habitat",
  startDate: "Start date",
  endDate: "End date",
  samplingProtocol: "Sampling protocol",
  samplingEffort: "Sampling effort",
  value: "Amount",
  unit: "Unit",
  taxonomicResolution: "Taxonomic resolution",
  notRecorded: "Not recorded",
  coordinates: "Coordinates",
  dates: "Sampling dates",
  missingValues: "Cells without a number",
};

/** What a pattern-checked field must look like. */
const PATTERN_HINTS: Record<string, string> = {
  orcid: "must be an ORCID iD of 16 characters with hyphens, e.g. 0000-0002-1825-0097",
  doi: "must be a DOI such as 10.1234/abc.5678 (doi:10.1234/abc.5678 or https://doi.org/10.1234/abc.5678 are accepted too); leave it empty when the publication has none",
  countryCode: "must be a two-letter ISO 3166-1 code in capitals, e.g. NO",
};

const FORMAT_HINTS: Record<string, string> = {
  email: "must be an e-mail address, e.g. name@example.org",
  date: "must be a real date written YYYY-MM-DD",
};

function lastSegment(pointer: string): string {
  const segs = pointer.split("/").filter(Boolean);
  for (let i = segs.length - 1; i >= 0; i--) if (!/^\d+$/.test(segs[i])) return segs[i];
  return "";
}

/** "Creators 2, name" for /creators/1/name */
export function fieldLabel(pointer: string): string {
  const segs = pointer.split("/").filter(Boolean).map((s) => s.replace(/~1/g, "/").replace(/~0/g, "~"));
  if (!segs.length) return "The record";
  const parts: string[] = [];
  for (const s of segs) {
    if (/^\d+$/.test(s) && parts.length) parts[parts.length - 1] += ` ${Number(s) + 1}`;
    else {
      const label = LABELS[s] ?? s;
      // "Country code" reads "country code" after a comma; "ORCID iD" keeps its capitals.
      const inner = /^[A-Z][a-z]/.test(label) ? label[0].toLowerCase() + label.slice(1) : label;
      parts.push(parts.length ? inner : label[0].toUpperCase() + label.slice(1));
    }
  }
  return parts.join(", ");
}

function escapePointer(s: string): string {
  return s.replace(/~/g, "~0").replace(/\//g, "~1");
}

function list(values: unknown[]): string {
  return values.map((v) => JSON.stringify(v)).join(", ");
}

/** One human message for one schema error. */
export function humanizeSchemaError(e: SchemaError): FieldError {
  const p = e.params;
  switch (e.keyword) {
    case "required": {
      const path = `${e.instancePath}/${escapePointer(String(p.missingProperty))}`;
      return { path, message: `${fieldLabel(path)} is required.` };
    }
    case "additionalProperties": {
      const path = `${e.instancePath}/${escapePointer(String(p.additionalProperty))}`;
      return { path, message: `${fieldLabel(path)} is not a field of this form; remove it.` };
    }
    default:
      break;
  }
  const path = e.instancePath;
  const label = fieldLabel(path);
  const field = lastSegment(path);
  let what: string;
  switch (e.keyword) {
    case "type":
      what = `must be ${p.type === "array" ? "a list" : p.type === "object" ? "a group of fields" : `a ${p.type}`}`;
      break;
    case "enum":
      what = `must be one of ${list(p.allowedValues as unknown[])}`;
      break;
    case "minLength":
      what = p.limit === 1 ? "must not be empty" : `must be at least ${p.limit} characters long`;
      break;
    case "maxLength":
      what = `must be at most ${p.limit} characters long`;
      break;
    case "minItems":
      what = `needs at least ${p.limit} ${p.limit === 1 ? "entry" : "entries"}`;
      break;
    case "maxItems":
      what = `may have at most ${p.limit} entries`;
      break;
    case "uniqueItems":
      what = `has the same entry twice (entries ${Math.min(Number(p.i), Number(p.j)) + 1} and ${Math.max(Number(p.i), Number(p.j)) + 1})`;
      break;
    case "minimum":
      what = `must be at least ${p.limit}`;
      break;
    case "maximum":
      what = `must be at most ${p.limit}`;
      break;
    case "exclusiveMinimum":
      what = `must be greater than ${p.limit}`;
      break;
    case "exclusiveMaximum":
      what = `must be less than ${p.limit}`;
      break;
    case "pattern":
      what = PATTERN_HINTS[field] ?? `does not have the expected form (${String(p.pattern)})`;
      break;
    case "format":
      what = FORMAT_HINTS[String(p.format)] ?? `must be in ${String(p.format)} format`;
      break;
    default:
      what = e.message ?? "is not valid";
  }
  return { path, message: `${label} ${what}.` };
}

/** Human messages for all errors, one per (path, message), in the order found. */
export function humanizeSchemaErrors(errors: readonly SchemaError[] | null | undefined): FieldError[] {
  const seen = new Set<string>();
  const out: FieldError[] = [];
  for (const e of errors ?? []) {
    const f = humanizeSchemaError(e);
    const key = `${f.path}\n${f.message}`;
    if (seen.has(key)) continue;
    seen.add(key);
    out.push(f);
  }
  return out;
}
