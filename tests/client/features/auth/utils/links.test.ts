import { describe, expect, it } from "vitest";
import { linkProblem, safeNext } from "../../../../../client/src/features/auth/utils/links";
import { ApiClientError } from "../../../../../client/src/lib/api-client";

describe("safeNext: where sign-in may send you", () => {
  it("follows same-site paths only", () => {
    expect(safeNext("/account", "/")).toBe("/account");
    expect(safeNext("/admin/outbox?x=1", "/")).toBe("/admin/outbox?x=1");
    expect(safeNext(null, "/account")).toBe("/account");
    expect(safeNext("https://elsewhere.example/", "/account")).toBe("/account");
    expect(safeNext("//elsewhere.example/", "/account")).toBe("/account");
    expect(safeNext("/\\elsewhere.example", "/account")).toBe("/account");
    expect(safeNext("javascript:alert(1)", "/account")).toBe("/account");
  });

  it("refuses what a browser would read as another site: tabs, line breaks and backslashes in the path", () => {
    // The URL standard removes tabs and newlines and treats "\\" as "/" in http(s) addresses, so each of
    // these would open elsewhere.example (checked here with Node's WHATWG URL, the same parser rules).
    for (const bad of ["/\t/elsewhere.example", "/\n/elsewhere.example", "/\r\n/elsewhere.example", "/\\/elsewhere.example", "/ /elsewhere.example", "/\u0000/x"]) {
      expect(safeNext(bad, "/account"), JSON.stringify(bad)).toBe("/account");
    }
    expect(new URL("/\t/elsewhere.example", "http://tanglebank.test").host).toBe("elsewhere.example");
    expect(safeNext("/datasets/TB-000001?tab=networks#n2", "/")).toBe("/datasets/TB-000001?tab=networks#n2");
    expect(safeNext("/%09/elsewhere.example", "/")).toBe("/%09/elsewhere.example");
  });
});

describe("linkProblem: the page's words for a refused one-time link", () => {
  it("names expired, used and invalid links, and passes other errors through", () => {
    expect(linkProblem(new ApiClientError(410, "link_expired", "x"), "password reset")).toMatchObject({ code: "link_expired", title: "This link has expired" });
    expect(linkProblem(new ApiClientError(410, "link_used", "x"), "confirmation").text).toMatch(/already confirmed/);
    expect(linkProblem(new ApiClientError(400, "link_invalid", "x"), "confirmation").code).toBe("link_invalid");
    expect(linkProblem(new ApiClientError(500, "internal", "Database down"), "confirmation")).toMatchObject({ code: "other", text: "Database down" });
  });
});
