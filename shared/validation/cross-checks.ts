/**
 * Rules that JSON Schema cannot express because they compare fields or depend on the parsed network.
 * Run after the schema (server at submission, client on the forms); messages in the same FieldError form.
 */
import type { FieldError } from "./messages";
import { isPlaceholderValue, NOT_RECORDED_LABELS, notRecordedReason, type NotRecordedField } from "./not-recorded";

export interface NetworkFacts {
  kind: "bipartite" | "unipartite";
  directed: boolean;
}

export function networkCrossChecks(meta: Record<string, unknown>, facts: NetworkFacts): FieldError[] {
  const out: FieldError[] = [];
  const start = meta.startDate;
  const end = meta.endDate;
  if (typeof start === "string" && typeof end === "string" && /^\d{4}-\d{2}-\d{2}$/.test(start) && /^\d{4}-\d{2}-\d{2}$/.test(end) && end < start) {
    out.push({ path: "/endDate", message: `End date ${end} is before the start date ${start}.` });
  }
  const blank = (v: unknown) => typeof v !== "string" || v.trim() === "";
  out.push(...notRecordedChecks(meta));
  if (facts.kind === "bipartite") {
    if (blank(meta.rowLevel)) out.push({ path: "/rowLevel", message: "Say what the row nodes are for a bipartite network, e.g. plants." });
    if (blank(meta.colLevel)) out.push({ path: "/colLevel", message: "Say what the column nodes are for a bipartite network, e.g. pollinators." });
  } else if (facts.directed && blank(meta.directionMeaning)) {
    out.push({ path: "/directionMeaning", message: "Direction meaning is required for a directed network: say what a link from row to column means, e.g. row eats column." });
  }
  return out;
}

const isNum = (v: unknown) => typeof v === "number" || (typeof v === "string" && v.trim() !== "");
const has = (v: unknown) => v !== undefined && v !== null && !(typeof v === "string" && v.trim() === "");

/**
 * Coordinates, dates and habitat are required unless marked not recorded with a reason; elevation and
 * sampling effort are optional. A field is given or marked not recorded, never both; a placeholder such
 * as "n/a" or "unknown" typed as a value is refused with the way to say it properly.
 */
export function notRecordedChecks(meta: Record<string, unknown>): FieldError[] {
  const out: FieldError[] = [];
  const loc = (meta.locality && typeof meta.locality === "object" ? meta.locality : {}) as Record<string, unknown>;
  const effort = (meta.samplingEffort && typeof meta.samplingEffort === "object" ? meta.samplingEffort : null) as Record<string, unknown> | null;
  const given: Record<NotRecordedField, boolean> = {
    coordinates: isNum(loc.decimalLatitude) || isNum(loc.decimalLongitude),
    elevation: isNum(loc.elevation),
    dates: has(meta.startDate) || has(meta.endDate),
    habitat: has(meta.habitat),
    samplingEffort: !!effort && (has(effort.value) || has(effort.unit)),
  };
  const required: Record<NotRecordedField, string[]> = {
    coordinates: ["/locality/decimalLatitude", "/locality/decimalLongitude"],
    elevation: [],
    dates: ["/startDate", "/endDate"],
    habitat: ["/habitat"],
    samplingEffort: [],
  };
  const values: Record<string, unknown> = {
    "/locality/decimalLatitude": loc.decimalLatitude,
    "/locality/decimalLongitude": loc.decimalLongitude,
    "/startDate": meta.startDate,
    "/endDate": meta.endDate,
    "/habitat": meta.habitat,
  };
  const NAMES: Record<string, string> = {
    "/locality/decimalLatitude": "Latitude",
    "/locality/decimalLongitude": "Longitude",
    "/startDate": "Start date",
    "/endDate": "End date",
    "/habitat": "Habitat",
  };
  for (const field of Object.keys(required) as NotRecordedField[]) {
    const reason = notRecordedReason(meta, field);
    const label = NOT_RECORDED_LABELS[field];
    if (reason && given[field]) {
      out.push({ path: `/notRecorded/${field}`, message: `${label} ${field === "dates" || field === "coordinates" ? "are" : "is"} given and also marked not recorded: keep the value or the reason, not both.` });
      continue;
    }
    if (reason) continue;
    for (const path of required[field]) {
      if (!has(values[path])) out.push({ path, message: `${NAMES[path]} is required: give it, or mark ${label.toLowerCase()} as not recorded with the reason.` });
    }
  }
  if (given.coordinates && !has(loc.generalisation)) {
    out.push({ path: "/locality/generalisation", message: "Public coordinates is required when coordinates are given: choose how far they are generalised." });
  }
  if (isPlaceholderValue(meta.habitat)) {
    out.push({ path: "/habitat", message: `"${String(meta.habitat).trim()}" is not a habitat: mark the habitat as not recorded and give the reason instead.` });
  }
  return out;
}
