/** What a line of a submission's history says, from its audit row (which network, which files, which submission). */
import type { HistoryEntry } from "../api/types";

const ACTION_LABELS: Record<string, string> = {
  "deposit.create": "Draft created",
  "deposit.metadata.update": "Study metadata saved",
  "deposit.network.add": "Network files uploaded",
  "deposit.network.update": "Network changed",
  "deposit.network.delete": "Network removed",
  "deposit.network.reorder": "Networks reordered",
  "deposit.submit": "Submitted for review",
  "review.publish": "Published",
  "review.request_changes": "Changes requested",
  "review.decline": "Declined",
  "review.metadata.correct": "Study metadata corrected by a curator",
  "dataset.metadata.correct": "Published study metadata corrected by a curator",
  "review.network.correct": "Network metadata corrected by a curator",
  "version.create": "New version started",
  "dataset.withdraw": "Withdrawn",
};

/** A history line with what the audit row says. */
export function historyLabel(h: HistoryEntry): string {
  const d = h.details;
  const label = ACTION_LABELS[h.action] ?? h.action;
  switch (h.action) {
    case "deposit.network.update":
      return typeof d.position === "number" ? `Network ${d.position} changed (${d.reparsed ? "file read again" : "metadata"})` : label;
    case "deposit.network.delete":
      return typeof d.originalName === "string" ? `${label}: ${d.originalName}` : label;
    case "deposit.network.add":
      return Array.isArray(d.files) ? `${label}: ${(d.files as Array<{ name?: string }>).map((f) => f.name).join(", ")}` : label;
    case "deposit.submit":
      return typeof d.round === "number" && d.round > 1 ? `${label} (submission ${d.round})` : label;
    default:
      return label;
  }
}
