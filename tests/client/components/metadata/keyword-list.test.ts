import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { KeywordList } from "../../../../client/src/components/metadata/keyword-list";

describe("KeywordList", () => {
  it("isolates each keyword, so an unclosed right-to-left override stays inside its own keyword", () => {
    const html = renderToStaticMarkup(createElement(KeywordList, { keywords: ["\u202Eheath", "ملقحات", "bees"] }));
    expect(html).toBe("<bdi>\u202Eheath</bdi>, <bdi>ملقحات</bdi>, <bdi>bees</bdi>");
  });
});
