/** The review page offers curators only the metadata corrections the API accepts in the version's state. */
import { describe, expect, it } from "vitest";
import { canCorrect } from "../../../../../client/src/features/reviews/utils/corrections";
import type { ReviewDetail } from "../../../../../client/src/features/reviews/api/types";

describe("corrections a curator is offered", () => {
  const at = (state: string) => ({ version: { state } }) as unknown as Pick<ReviewDetail, "version">;
  it("study and network metadata while the version is under review", () => {
    for (const s of ["submitted", "changes_requested"]) {
      expect(canCorrect(at(s), "study")).toBe(true);
      expect(canCorrect(at(s), "network")).toBe(true);
    }
  });
  it("only the study metadata once published (the API answers 409 to a network correction there), nothing on a draft, declined or withdrawn version", () => {
    expect(canCorrect(at("published"), "study")).toBe(true);
    expect(canCorrect(at("published"), "network")).toBe(false);
    for (const s of ["draft", "declined", "withdrawn"]) {
      expect(canCorrect(at(s), "study")).toBe(false);
      expect(canCorrect(at(s), "network")).toBe(false);
    }
  });
});
