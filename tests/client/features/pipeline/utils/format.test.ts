/** Display helpers of the metrics pipeline page (durations, rates, progress share). */
import { describe, expect, it } from "vitest";
import { formatDateTime, formatDuration, formatRate, percentFinished } from "../../../../../client/src/features/pipeline/utils/format";

describe("pipeline page formatting", () => {
  it("writes durations in s, min and h", () => {
    expect(formatDuration(null)).toBe("unknown");
    expect(formatDuration(44.6)).toBe("45 s");
    expect(formatDuration(200)).toBe("3 min 20 s");
    expect(formatDuration(7500)).toBe("2 h 05 min");
  });
  it("writes rates and dates", () => {
    expect(formatRate(null)).toBe("—");
    expect(formatRate(3.25)).toBe("3.3 / min");
    expect(formatRate(44.3)).toBe("44 / min");
    expect(formatDateTime("2026-12-01T23:16:05.000Z")).toBe("2026-12-01 23:16 UTC");
  });
  it("counts done and failed networks as finished", () => {
    expect(percentFinished(3, 1, 4)).toBe(100);
    expect(percentFinished(1, 0, 3)).toBe(33);
    expect(percentFinished(0, 0, 0)).toBe(100);
  });
});
