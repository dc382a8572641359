/** The review page's history lines say what the audit row holds (which network, which files, which submission). */
import { describe, expect, it } from "vitest";
import { historyLabel } from "../../../../../client/src/features/reviews/utils/history-label";
import type { HistoryEntry } from "../../../../../client/src/features/reviews/api/types";

const entry = (action: string, details: Record<string, unknown> = {}) => ({ id: 1, at: "2026-12-02T10:00:00Z", action, actor: "Rowan Hale", details }) as unknown as HistoryEntry;

describe("history lines on the review page", () => {
  it("names the network, the files and the submission round from the audit details", () => {
    expect(historyLabel(entry("deposit.network.update", { position: 2, reparsed: true }))).toBe("Network 2 changed (file read again)");
    expect(historyLabel(entry("deposit.network.update", { position: 3, reparsed: false }))).toBe("Network 3 changed (metadata)");
    expect(historyLabel(entry("deposit.network.delete", { originalName: "heath.csv" }))).toBe("Network removed: heath.csv");
    expect(historyLabel(entry("deposit.network.add", { files: [{ name: "a.csv" }, { name: "b.xlsx" }] }))).toBe("Network files uploaded: a.csv, b.xlsx");
    expect(historyLabel(entry("deposit.submit", { round: 2 }))).toBe("Submitted for review (submission 2)");
    expect(historyLabel(entry("deposit.submit", { round: 1 }))).toBe("Submitted for review");
  });
  it("falls back to the plain label, or the action itself when it has none", () => {
    expect(historyLabel(entry("deposit.network.update"))).toBe("Network changed");
    expect(historyLabel(entry("review.publish"))).toBe("Published");
    expect(historyLabel(entry("some.new.action"))).toBe("some.new.action");
  });
});
