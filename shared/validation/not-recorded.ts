/**
 * "Not recorded" as an answer: a network's coordinates, elevation, sampling dates, habitat or sampling
 * effort may be unknown (older or literature-derived networks often lack them). The metadata then lists the
 * field under `notRecorded` with the reason, instead of a made-up value (schemas/network.schema.json), and
 * every page, API answer, JSON-LD document, map and bundle says "not recorded". Shared by the validation
 * (cross-checks.ts), the server's readers and the client's pages.
 */
export const NOT_RECORDED_FIELDS = ["coordinates", "elevation", "dates", "habitat", "samplingEffort"] as const;
export type NotRecordedField = (typeof NOT_RECORDED_FIELDS)[number];

export const NOT_RECORDED_LABELS: Record<NotRecordedField, string> = {
  coordinates: "Coordinates",
  elevation: "Elevation",
  dates: "Sampling dates",
  habitat: "Habitat",
  samplingEffort: "Sampling effort",
};

/** The metadata fields (JSON pointers) each "not recorded" answer stands for. */
export const NOT_RECORDED_PATHS: Record<NotRecordedField, string[]> = {
  coordinates: ["/locality/decimalLatitude", "/locality/decimalLongitude", "/locality/coordinatePrecision", "/locality/generalisation"],
  elevation: ["/locality/elevation"],
  dates: ["/startDate", "/endDate"],
  habitat: ["/habitat"],
  samplingEffort: ["/samplingEffort", "/samplingEffort/value", "/samplingEffort/unit"],
};

/** The words every reader shows in place of a value. */
export const NOT_RECORDED = "not recorded";

/** The reason a field is not recorded, or null when it is not marked so. */
export function notRecordedReason(meta: unknown, field: NotRecordedField): string | null {
  if (!meta || typeof meta !== "object") return null;
  const nr = (meta as Record<string, unknown>).notRecorded;
  if (!nr || typeof nr !== "object") return null;
  const r = (nr as Record<string, unknown>)[field];
  return typeof r === "string" && r.trim() !== "" ? r.trim() : null;
}

/** Every field marked not recorded with its reason, in the order of NOT_RECORDED_FIELDS. */
export function notRecordedList(meta: unknown): Array<{ field: NotRecordedField; label: string; reason: string }> {
  const out: Array<{ field: NotRecordedField; label: string; reason: string }> = [];
  for (const field of NOT_RECORDED_FIELDS) {
    const reason = notRecordedReason(meta, field);
    if (reason) out.push({ field, label: NOT_RECORDED_LABELS[field], reason });
  }
  return out;
}

/** "Habitat: not given in the source; Sampling dates: …" (bundles, one cell). */
export function notRecordedText(meta: unknown): string {
  return notRecordedList(meta).map((x) => `${x.label}: ${x.reason}`).join("; ");
}

/** Text typed as a value that says the value is missing ("n/a", "unknown", "not available"…). */
export function isPlaceholderValue(s: unknown): boolean {
  return typeof s === "string" && /^\s*(n\/?a|na|none|nil|null|unknown|unk|\?+|-+|–|—|not (available|recorded|known|given|applicable)|no data|missing|tbd|tba)\s*\.?\s*$/i.test(s);
}
