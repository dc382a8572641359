/**
 * What the compare view's "Add" field understands: a network, a dataset (a version or the latest), a
 * collection (at a revision), bare or as a page address; anything else is refused (null).
 */
import { describe, expect, it } from "vitest";
import { mergeRefs, parseCompareInput } from "../../../../../client/src/features/compare/utils/compare-input";

describe("compare input", () => {
  it("reads networks, datasets and collections written bare", () => {
    expect(parseCompareInput(" TB-000042/v2/3 ")).toEqual({ kind: "network", ref: "TB-000042/v2/3" });
    expect(parseCompareInput("TB-000042/v2")).toEqual({ kind: "dataset", accession: "TB-000042", version: 2 });
    expect(parseCompareInput("TB-000042")).toEqual({ kind: "dataset", accession: "TB-000042", version: null });
    expect(parseCompareInput("TBC-000007")).toEqual({ kind: "collection", code: "TBC-000007", revision: null });
    expect(parseCompareInput("TBC-000007?revision=3")).toEqual({ kind: "collection", code: "TBC-000007", revision: 3 });
  });

  it("reads page addresses of this site", () => {
    expect(parseCompareInput("https://tanglebank.example/datasets/TB-000042/v/2/networks/3")).toEqual({ kind: "network", ref: "TB-000042/v2/3" });
    expect(parseCompareInput("http://localhost:3000/datasets/TB-000042/v/2/")).toEqual({ kind: "dataset", accession: "TB-000042", version: 2 });
    expect(parseCompareInput("https://tanglebank.example/datasets/TB-000042")).toEqual({ kind: "dataset", accession: "TB-000042", version: null });
    expect(parseCompareInput("https://tanglebank.example/collections/TBC-000007?revision=2")).toEqual({ kind: "collection", code: "TBC-000007", revision: 2 });
  });

  it("refuses anything else", () => {
    for (const s of ["", "meadow", "TB-42", "TB-000042/3", "TB-000042/v2/x", "TBC-7", "https://x.example/catalogue", "http://[bad"]) expect(parseCompareInput(s)).toBeNull();
  });

  it("appends without duplicates and says which were new", () => {
    expect(mergeRefs(["a", "b"], ["b", "c", "c", "d"])).toEqual({ next: ["a", "b", "c", "d"], added: ["c", "d"] });
  });
});
