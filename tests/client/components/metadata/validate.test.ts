/**
 * The deposit forms' inline errors: blank optional fields are dropped before validation, errors show only
 * for fields that hold something until the person asks to see all, and cross-field rules apply.
 * (The browser validator itself is checked against ajv in tests/server/lib/schemas.test.ts.)
 */
import { describe, expect, it } from "vitest";
import { networkErrors, prune, studyErrors, visibleErrors } from "../../../../client/src/components/metadata/validate";

describe("metadata form validation", () => {
  it("drops blank optional fields so they are not reported", () => {
    expect(prune({ title: "x", funding: "", publication: { citation: "", doi: "" }, creators: [{ name: "A", orcid: "" }] })).toEqual({ title: "x", creators: [{ name: "A" }] });
  });

  it("reports a malformed ORCID while typing, but missing fields only once asked", () => {
    const draft = { title: "Heath pollinators", creators: [{ name: "Hale, Rowan", orcid: "0000-12" }] };
    const all = studyErrors(draft);
    expect(Object.keys(all)).toEqual(expect.arrayContaining(["/creators/0/orcid", "/description", "/licence", "/keywords", "/contactEmail"]));
    expect(Object.keys(visibleErrors(all, draft, false))).toEqual(["/creators/0/orcid"]);
    expect(visibleErrors(all, draft, true)).toEqual(all);
  });

  it("applies the cross-field rules of the network form", () => {
    const e = networkErrors({ startDate: "2020-06-01", endDate: "2020-05-01" }, { kind: "bipartite", directed: false });
    expect(e["/endDate"]).toMatch(/before the start date/);
    expect(e["/rowLevel"]).toMatch(/bipartite/);
    const n = networkErrors({ locality: { decimalLatitude: "54,4" } }, { kind: "unipartite", directed: true });
    expect(n["/locality/decimalLatitude"]).toBe("Locality, latitude must be a number.");
    expect(n["/directionMeaning"]).toMatch(/directed/);
  });
});
