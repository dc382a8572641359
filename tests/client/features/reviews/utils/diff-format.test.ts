/** How the review page writes a diff's values, network sizes and node lists. */
import { describe, expect, it } from "vitest";
import { formatNames, formatShape, formatValue } from "../../../../../client/src/features/reviews/utils/diff-format";
import type { NetworkSide } from "@shared/types/review";

const side = (over: Partial<NetworkSide>): NetworkSide => ({
  networkId: 1, position: 1, name: "n", originalName: "n.csv", sha256: "", kind: "bipartite", directed: false, format: "matrix",
  nRows: 3, nCols: 4, nNodes: 7, nLinks: 8, totalWeight: 8, ...over,
});

describe("diff formatting", () => {
  it("writes absent values, lists, yes/no and objects plainly", () => {
    expect(formatValue(null)).toBe("(none)");
    expect(formatValue("")).toBe("(none)");
    expect(formatValue([])).toBe("(none)");
    expect(formatValue(["pollination", "heath"])).toBe("pollination, heath");
    expect(formatValue(true)).toBe("yes");
    expect(formatValue(0)).toBe("0");
    expect(formatValue({ value: 120, unit: "h" })).toBe('{"value":120,"unit":"h"}');
  });
  it("writes a two-mode network as rows × columns and a one-mode one by its nodes", () => {
    expect(formatShape(side({}))).toBe("3 × 4, 8 links");
    expect(formatShape(side({ kind: "unipartite", nRows: null, nCols: null, nNodes: 34, nLinks: 1 }))).toBe("34 nodes, 1 link");
  });
  it("names added and removed nodes, saying when the list is cut", () => {
    expect(formatNames("+", [], 0)).toBe("");
    expect(formatNames("+", ["Ling"], 1)).toBe("+1 (Ling)");
    expect(formatNames("−", ["a", "b"], 60)).toBe("−60 (the first 2: a, b)");
  });
});
