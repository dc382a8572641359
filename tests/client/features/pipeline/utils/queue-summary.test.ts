/** The Queue panel's sentence on the metrics pipeline page, from the counts of GET /api/v1/pipeline/queue. */
import { describe, expect, it } from "vitest";
import type { QueuePhaseCounts, QueueProgress } from "@shared/types/pipeline";
import { percentOf, queueSummary, timeLeftPhrase } from "../../../../../client/src/features/pipeline/utils/format";

function counts(c: Partial<QueuePhaseCounts>): QueuePhaseCounts {
  const base = { queued: 0, running: 0, nullsPending: 0, done: 0, failed: 0, ...c };
  const total = base.queued + base.running + base.nullsPending + base.done + base.failed;
  return { ...base, total, observedDone: base.nullsPending + base.done };
}

function progress(u: Partial<QueuePhaseCounts>, extra: Partial<QueueProgress["unbatched"]> = {}, overall?: Partial<QueuePhaseCounts>): QueueProgress {
  const uc = counts(u);
  const oc = counts(overall ?? u);
  return {
    settingsHash: "0".repeat(64),
    unbatched: { ...uc, since: "2026-12-01T00:00:00.000Z", ratePerMinute: null, etaSeconds: null, ...extra },
    overall: oc,
    active: oc.queued + oc.running + oc.nullsPending > 0,
  };
}

describe("queue summary", () => {
  it("reads observed and null-model progress with the time left", () => {
    const q = progress({ queued: 1, running: 2, nullsPending: 9, done: 15 }, { ratePerMinute: 18, etaSeconds: 40 });
    expect(queueSummary(q)).toBe("Newly published networks: 24 of 27 with observed figures, 15 of 27 with null-model figures — about 40 s left.");
  });

  it("says the time left is being estimated before any run finished, and counts failures", () => {
    const q = progress({ queued: 3, nullsPending: 2, failed: 1 });
    expect(queueSummary(q)).toBe("Newly published networks: 2 of 6 with observed figures, 0 of 6 with null-model figures — estimating the time left. 1 failed.");
  });

  it("states plainly when nothing waits, or when only a batch is computing", () => {
    expect(queueSummary(progress({}))).toBe("Nothing is waiting: every queued network has been computed with the current settings.");
    expect(queueSummary(progress({ done: 27 }, { etaSeconds: 0 }))).toBe(
      "Nothing is waiting: every queued network has been computed with the current settings. The last 27 newly published networks are finished.",
    );
    expect(queueSummary(progress({ done: 1 }, { etaSeconds: 0 }, { done: 1, queued: 5 }))).toBe(
      "No newly published network is waiting; the batch below is computing. The last newly published network is finished.",
    );
  });

  it("rounds shares and time-left phrases", () => {
    expect(percentOf(24, 27)).toBe(89);
    expect(percentOf(0, 0)).toBe(100);
    expect(timeLeftPhrase(0)).toBe("");
    expect(timeLeftPhrase(200)).toBe("about 3 min 20 s left");
  });
});
