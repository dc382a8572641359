/** The review page of a published version says where the metrics pipeline is now, not at publication. */
import { describe, expect, it } from "vitest";
import { figuresState } from "../../../../../client/src/features/reviews/utils/figures-state";

const net = (status: string | null) => ({ metrics: status === null ? null : { status } });

describe("figures state on the review page", () => {
  it("says all figures are computed once every network succeeded", () => {
    expect(figuresState([net("succeeded")])).toBe("Figures computed for all 1 network.");
    expect(figuresState([net("succeeded"), net("succeeded"), net("succeeded")])).toBe("Figures computed for all 3 networks.");
  });
  it("counts networks still waiting (queued, running or without a run) and failed ones", () => {
    expect(figuresState([net("succeeded"), net("queued"), net("running"), net(null)])).toBe("Figures: 1 of 4 computed, 3 queued or running.");
    expect(figuresState([net("succeeded"), net("failed")])).toBe("Figures: 1 of 2 computed, 1 failed (see the metrics pipeline).");
    expect(figuresState([net("failed"), net("queued")])).toBe("Figures: 0 of 2 computed, 1 queued or running, 1 failed (see the metrics pipeline).");
  });
});
