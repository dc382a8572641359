/**
 * Inline field errors in the browser from the same JSON Schemas the server uses (schemas/*.schema.json),
 * checked by the shared validator (no eval, so it runs under our CSP) and worded by the shared messages.
 */
import studySchema from "../../../../schemas/study.schema.json";
import networkSchema from "../../../../schemas/network.schema.json";
import { humanizeSchemaErrors, networkCrossChecks, NOT_RECORDED_LABELS, NOT_RECORDED_PATHS, validateWithSchema, withNormalisedDoi, type JsonSchema, type NetworkFacts, type NotRecordedField } from "@shared/validation";

export type FieldErrors = Record<string, string>;

function toMap(list: Array<{ path: string; message: string }>): FieldErrors {
  const out: FieldErrors = {};
  for (const e of list) if (!out[e.path]) out[e.path] = e.message;
  return out;
}

/** Removes empty strings, empty objects and undefined so blank optional fields are simply absent. */
export function prune<T>(value: T): T {
  if (Array.isArray(value)) return value.map(prune) as T;
  if (value && typeof value === "object") {
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(value)) {
      const p = prune(v);
      if (p === undefined || p === "" || (p && typeof p === "object" && !Array.isArray(p) && !Object.keys(p).length)) continue;
      out[k] = p;
    }
    return out as T;
  }
  return value;
}

export function studyErrors(meta: unknown): FieldErrors {
  return toMap(humanizeSchemaErrors(validateWithSchema(studySchema as JsonSchema, withNormalisedDoi(prune(meta)))));
}

export function networkErrors(meta: unknown, facts: NetworkFacts): FieldErrors {
  const m = prune(meta) as Record<string, unknown>;
  let list = [...humanizeSchemaErrors(validateWithSchema(networkSchema as JsonSchema, m)), ...networkCrossChecks(m, facts)];
  // A "not recorded" box ticked with no reason yet: ask for the reason, not for the value.
  const nr = ((meta as Record<string, unknown> | null)?.notRecorded ?? {}) as Record<string, unknown>;
  for (const f of Object.keys(nr) as NotRecordedField[]) {
    if (!(f in NOT_RECORDED_PATHS) || String(nr[f] ?? "").trim() !== "") continue;
    list = list.filter((e) => !NOT_RECORDED_PATHS[f].includes(e.path));
    list.push({ path: `/notRecorded/${f}`, message: `Say why ${NOT_RECORDED_LABELS[f].toLowerCase()} ${f === "dates" || f === "coordinates" ? "are" : "is"} not recorded (e.g. not given in the source publication).` });
  }
  return toMap(list);
}

function at(value: unknown, pointer: string): unknown {
  let cur = value;
  for (const seg of pointer.split("/").filter(Boolean)) {
    if (cur === null || typeof cur !== "object") return undefined;
    cur = (cur as Record<string, unknown>)[seg];
  }
  return cur;
}

/** Errors of fields that hold something (a bad ORCID while typing), or all of them once `showAll`. */
export function visibleErrors(errors: FieldErrors, value: unknown, showAll: boolean): FieldErrors {
  if (showAll) return errors;
  const out: FieldErrors = {};
  for (const [path, msg] of Object.entries(errors)) {
    const v = at(value, path);
    if (v !== undefined && v !== "" && !(Array.isArray(v) && v.length === 0)) out[path] = msg;
  }
  return out;
}
