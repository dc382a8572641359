/**
 * The catalogue's URL state: toggling facet values, setting and clearing parameters, and what
 * "everything matching" sends to the bundle endpoint (filters only, never paging or sorting).
 */
import { describe, expect, it } from "vitest";
import { filterOnly, hasFilters, listValues, rangeProblems, rangeProblemsFromApi, toggleValue, withParams } from "../../../../../client/src/features/catalogue/utils/catalogue-params";
import { bundleUrlForFilter, bundleUrlForRefs, DEFAULT_PARTS, formatBytes } from "../../../../../client/src/features/bundles/utils/bundle-url";

describe("catalogue URL parameters", () => {
  it("toggles facet values as a comma list and goes back to page 1", () => {
    let p = new URLSearchParams("page=3&country=NO");
    p = toggleValue(p, "country", "SE");
    expect(listValues(p, "country")).toEqual(["NO", "SE"]);
    expect(p.get("page")).toBeNull();
    p = toggleValue(p, "country", "NO");
    p = toggleValue(p, "country", "SE");
    expect(p.has("country")).toBe(false);
  });

  it("sets and clears values; the bundle filter drops paging and sorting", () => {
    const p = withParams(new URLSearchParams("q=moor&sort=z&order=desc&page=2&pageSize=50&nodesMin=10"), { nodesMin: "", zMin: "1.5" });
    expect(p.toString()).toBe("q=moor&sort=z&order=desc&page=2&pageSize=50&zMin=1.5");
    expect(filterOnly(p).toString()).toBe("q=moor&zMin=1.5");
    expect(hasFilters(new URLSearchParams("sort=S&page=2"))).toBe(false);
    expect(bundleUrlForFilter(filterOnly(p))).toBe("/api/v1/bundles?q=moor&zMin=1.5");
    expect(bundleUrlForRefs(["TB-000001/v1/2", "TB-000003/v2/1"])).toBe("/api/v1/bundles?refs=TB-000001%2Fv1%2F2,TB-000003%2Fv2%2F1");
    // compressed packing is asked for explicitly; stored files are the server's default
    expect(bundleUrlForFilter(filterOnly(p), { packing: "small", parts: DEFAULT_PARTS })).toBe("/api/v1/bundles?q=moor&zMin=1.5&compression=small");
    expect(bundleUrlForRefs(["TB-000001/v1/2"], { packing: "small", parts: DEFAULT_PARTS })).toBe("/api/v1/bundles?refs=TB-000001%2Fv1%2F2&compression=small");
    // optional parts other than the server's default are named, in a fixed order; none is an empty include
    expect(bundleUrlForRefs(["TB-000001/v1/2"], { packing: "fast", parts: ["originals", "edges", "partitions"] })).toBe("/api/v1/bundles?refs=TB-000001%2Fv1%2F2&include=partitions%2Cedges%2Coriginals");
    expect(bundleUrlForFilter(filterOnly(p), { packing: "fast", parts: [] })).toBe("/api/v1/bundles?q=moor&zMin=1.5&include=");
  });

  it("formats sizes", () => {
    expect(formatBytes(500)).toBe("1 kB");
    expect(formatBytes(80 * 1024)).toBe("80 kB");
    expect(formatBytes(3.25 * 1024 * 1024)).toBe("3.3 MB");
    expect(formatBytes(250 * 1024 * 1024)).toBe("250 MB");
  });
});

describe("range checks before a search", () => {
  it("flags a minimum above its maximum, naming both", () => {
    expect(rangeProblems({ connectanceMin: "0.5", connectanceMax: "0.1" })).toEqual({
      connectance: "The minimum (0.5) is above the maximum (0.1): no network could match. Swap them or change one.",
    });
    expect(rangeProblems({ connectanceMin: "0.1", connectanceMax: "0.1", qMin: "-0.2", zMax: "3" })).toEqual({});
  });

  it("flags values the figure cannot take, as the API does", () => {
    expect(rangeProblems({ pMax: "2", nodesMin: "3.5", yearMin: "abc", qMin: "" })).toEqual({
      p: "The maximum must be between 0 and 1 (got 2).",
      nodes: "The minimum must be a whole number (got 3.5).",
      year: "The minimum “abc” is not a number.",
    });
    expect(rangeProblems({ nodesMin: "-1" })).toEqual({ nodes: "The minimum must be at least 0 (got -1)." });
  });

  it("reads the API's answer to a shared link per range", () => {
    expect(rangeProblemsFromApi([{ path: "qMin", message: "qMin (0.6) is greater than qMax (0.2)" }, { path: "sort", message: "bad" }])).toEqual({ Q: "qMin (0.6) is greater than qMax (0.2)" });
  });
});
