import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import {
  basicMetrics, createRng, deserializeNetwork, NetworkEngineError, NetworkParseError, networkToEdgeListCsv,
  networkToMatrixCsv, parseNetworkText, serializeNetwork, validateNetwork, type Network, type ParseOptions,
} from "@shared/network/index";
import { bipartite, dense, oneMode, randomMatrix, randomOneMode } from "./helpers";

const fixture = (name: string) => readFileSync(new URL(`../../fixtures/${name}`, import.meta.url));
const bip = (text: string | Uint8Array, extra: Partial<ParseOptions> = {}) =>
  parseNetworkText(text, { fileName: "web.csv", kind: "bipartite", ...extra });
const one = (text: string | Uint8Array, extra: Partial<ParseOptions> = {}) =>
  parseNetworkText(text, { fileName: "web.csv", kind: "unipartite", ...extra });

function parseError(fn: () => unknown): NetworkParseError {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(NetworkParseError);
    return e as NetworkParseError;
  }
  throw new Error("expected a NetworkParseError");
}

describe("parsing the reference fixtures", () => {
  it("karate club edge list: 34 nodes, 78 links, degree of node 1 is 16 and of node 34 is 17 (Zachary 1977)", () => {
    const r = one(fixture("karate.edgelist.csv"));
    expect(r.format).toBe("edgelist");
    expect(r.delimiter).toBe(",");
    expect(r.warnings).toEqual([]);
    const deg = (label: string) => { const i = r.network.rowLabels.indexOf(label); return r.network.rowPtr[i + 1] - r.network.rowPtr[i]; };
    expect(deg("1")).toBe(16);
    expect(deg("34")).toBe(17);
    expect(r.network.rowPtr[34]).toBe(156);
    validateNetwork(r.network);
  });

  it("Davis Southern Women incidence matrix: 18 women × 14 events, 89 links (Davis et al. 1941)", () => {
    const r = bip(fixture("davis-southern-women.csv"));
    expect(r.format).toBe("matrix");
    expect(r.network.rowLabels[0]).toBe("Evelyn Jefferson");
    expect(r.network.colLabels).toEqual(Array.from({ length: 14 }, (_, j) => `E${j + 1}`));
    expect(basicMetrics(r.network).links).toBe(89);
    validateNetwork(r.network);
  });
});

describe("matrix files", () => {
  it("reads CSV with blank cells as 0, decimals and exponents, quoted labels", () => {
    const r = bip('x,"Bee, large",Fly\nOak,2.5,\n"Pine ""tall""",,1e1\n');
    expect(r.network.colLabels).toEqual(["Bee, large", "Fly"]);
    expect(r.network.rowLabels).toEqual(["Oak", 'Pine "tall"']);
    expect(dense(r.network)).toEqual([[2.5, 0], [0, 10]]);
    expect(r.network.weighted).toBe(true);
  });

  it("accepts a UTF-8 BOM (bytes and string), TSV, semicolons with decimal commas, CRLF and trailing delimiters", () => {
    const bom = new Uint8Array([0xef, 0xbb, 0xbf, ...new TextEncoder().encode("x,a\nr,1\n")]);
    expect(bip(bom).network.rowLabels).toEqual(["r"]);
    expect(bip("\ufeffx,a\nr,1\n").network.colLabels).toEqual(["a"]);
    const tsv = bip("plant\tbee\tfly\nOak\t1\t0\nElm\t0\t3\n");
    expect(tsv.delimiter).toBe("\t");
    expect(dense(tsv.network)).toEqual([[1, 0], [0, 3]]);
    const semi = bip("plant;bee;fly\r\nOak;0,5;0\r\nElm;0;3\r\n");
    expect(semi.delimiter).toBe(";");
    expect(dense(semi.network)).toEqual([[0.5, 0], [0, 3]]);
    const trailing = bip("plant,bee,fly,\nOak,1,0,\nElm,0,3,\n");
    expect(trailing.network.colLabels).toEqual(["bee", "fly"]);
    expect(parseNetworkText("x,é\nñ,1\n", { fileName: "u.csv", kind: "bipartite" }).network.colLabels).toEqual(["é"]);
  });

  it("warns about (and keeps) rows and columns with no links", () => {
    const r = bip("x,a,b,c\nr1,1,0,0\nr2,0,0,0\nr3,1,0,0\n");
    expect(r.network.rowLabels).toHaveLength(3);
    const rows = r.warnings.find((w) => w.code === "empty-rows")!;
    expect(rows).toMatchObject({ file: "web.csv", row: 3, count: 1, labels: ["r2"] });
    const cols = r.warnings.find((w) => w.code === "empty-columns")!;
    expect(cols).toMatchObject({ row: 1, column: 3, count: 2, labels: ["b", "c"] });
  });

  it("one-mode adjacency: columns matched by name in any order; directed flag; symmetric check when undirected", () => {
    const d = one("x,b,a\na,1,0\nb,0,1\n", { directed: true });
    // a→b = 1 and b→a = 0 … columns are [b, a]: row a has b=1, a=0; row b has b=0, a=1.
    expect(d.network.rowLabels).toEqual(["a", "b"]);
    expect(dense(d.network)).toEqual([[0, 1], [1, 0]]);
    expect(d.network.directed).toBe(true);
    const u = one("x,a,b,c\na,0,2,0\nb,2,1,0\nc,0,0,0\n");
    expect(basicMetrics(u.network)).toMatchObject({ links: 2, selfLoops: 1 });
    expect(u.warnings.map((w) => w.code).sort()).toEqual(["isolated-nodes", "self-loops"]);
  });
});

describe("edge-list files", () => {
  it("bipartite: source = row node, target = column node; weight column; any column order and case; extra columns ignored with a warning", () => {
    const r = bip("Weight,Target,Source,note\n3,bee,oak,x\n1,fly,oak,\n2,bee,elm,\n");
    expect(r.format).toBe("edgelist");
    expect(r.network.rowLabels).toEqual(["oak", "elm"]);
    expect(r.network.colLabels).toEqual(["bee", "fly"]);
    expect(dense(r.network)).toEqual([[3, 1], [2, 0]]);
    expect(r.warnings.map((w) => w.code)).toEqual(["ignored-columns"]);
  });

  it("repeated pairs are summed with a warning naming the first repeat; undirected a,b and b,a are the same link", () => {
    const r = bip("source,target\noak,bee\noak,fly\noak,bee\n");
    expect(dense(r.network)).toEqual([[2, 1]]);
    expect(r.warnings[0]).toMatchObject({ code: "duplicate-links", row: 4, count: 1 });
    const u = one("source,target\na,b\nb,a\n");
    expect(dense(u.network)).toEqual([[0, 2], [2, 0]]);
    expect(u.warnings[0].code).toBe("duplicate-links");
    const d = one("source,target\na,b\nb,a\n", { directed: true });
    expect(dense(d.network)).toEqual([[0, 1], [1, 0]]);
    expect(d.warnings).toEqual([]);
  });

  it("a weight of 0 keeps the nodes without a link (warned as empty); a label on both sides of a bipartite list is two nodes", () => {
    const r = bip("source,target,weight\noak,bee,1\nelm,fly,0\nbee,fly,2\n");
    expect(r.network.rowLabels).toEqual(["oak", "elm", "bee"]);
    expect(r.warnings.map((w) => w.code).sort()).toEqual(["empty-rows", "shared-labels"]);
  });
});

describe("every parse error names file, row and column", () => {
  const cases: Array<[string, () => unknown, string, number | null, number | null]> = [
    ["empty-file", () => bip(""), "empty-file", null, null],
    ["empty-file (only blank lines)", () => bip("\n\n  \n"), "empty-file", null, null],
    ["empty-file (header only)", () => bip("x,a,b\n"), "empty-file", 1, null],
    ["not-utf8 (Latin-1 é on line 2)", () => bip(new Uint8Array([...new TextEncoder().encode("x,a\n"), 0x72, 0xe9, 0x2c, 0x31, 0x0a])), "not-utf8", 2, null],
    ["not-utf8 (UTF-16 BOM)", () => bip(new Uint8Array([0xff, 0xfe, 0x78, 0x00])), "not-utf8", 1, 1],
    ["non-numeric", () => bip("x,a,b\nr1,1,abc\n"), "non-numeric", 2, 3],
    ["non-numeric (text)", () => bip("x,a,b\nr1,1,0\nr2,lots,1\n"), "non-numeric", 3, 2],
    ["missing-values (NA without a stated meaning)", () => bip("x,a,b\nr1,1,0\nr2,NA,1\n"), "missing-values", 3, 2],
    ["negative", () => bip("x,a,b\nr1,1,0\nr2,0,-2\n"), "negative", 3, 3],
    ["ragged-row (short)", () => bip("x,a,b,c\nr1,1,0,1\nr2,1,0\n"), "ragged-row", 3, 4],
    ["ragged-row (long)", () => bip("x,a,b\nr1,1,0\nr2,1,0,5\n"), "ragged-row", 3, 4],
    ["duplicate-node (row)", () => bip("x,a,b\nr1,1,0\nr2,0,1\nr1,1,1\n"), "duplicate-node", 4, 1],
    ["duplicate-node (column)", () => bip("x,a,b,a\nr1,1,0,1\n"), "duplicate-node", 1, 4],
    ["empty-label (row)", () => bip("x,a\n,1\n"), "empty-label", 2, 1],
    ["empty-label (column)", () => bip("x,,b\nr,1,1\n"), "empty-label", 1, 2],
    ["empty-label (edge list)", () => bip("source,target\noak,\n"), "empty-label", 2, 2],
    ["bad-label (NUL in a row name)", () => bip("x,a\nr\u00001,1\n"), "bad-label", 2, 1],
    ["bad-label (escape code in a column name)", () => bip("x,a,\u001b[31mb\n r,1,1\n"), "bad-label", 1, 3],
    ["bad-label (bell inside a quoted edge-list name)", () => bip('source,target\noak,"bee\u0007fly"\n'), "bad-label", 2, 2],
    ["bad-label (C1 control)", () => bip("source,target\noak\u0085,bee\n"), "bad-label", 2, 1],
    ["bad-label (501 characters)", () => bip(`x,a\n${"r".repeat(501)},1\n`), "bad-label", 2, 1],
    ["no-links", () => bip("x,a,b\nr1,0,\nr2,,0\n"), "no-links", null, null],
    ["self-loop-bipartite (matrix)", () => bip("x,oak,bee\noak,1,0\nfly,0,1\n"), "self-loop-bipartite", 2, 2],
    ["self-loop-bipartite (edge list)", () => bip("source,target\noak,bee\noak,oak\n"), "self-loop-bipartite", 3, 2],
    ["too-large (bytes)", () => bip("x,a\nr,1\n", { maxBytes: 5 }), "too-large", null, null],
    ["too-large (cells)", () => bip("x,a,b\nr1,1,0\nr2,0,1\nr3,1,1\n", { maxCells: 5 }), "too-large", 4, null],
    ["bad-header (no column names)", () => bip("x\nr1\n"), "bad-header", 1, null],
    ["bad-header (edge list without target)", () => bip("source,weight\noak,1\n", { format: "edgelist" }), "bad-header", 1, null],
    ["bad-header (two source columns)", () => bip("source,target,source\na,b,c\n"), "bad-header", 1, 3],
    ["bad-csv (unclosed quote)", () => bip('x,a\n"r1,1\n'), "bad-csv", null, null],
    ["not-square", () => one("x,a,b\na,0,1\nb,1,0\nc,0,0\n"), "not-square", null, null],
    ["label-mismatch", () => one("x,a,z\na,0,1\nb,1,0\n"), "label-mismatch", 1, 3],
    ["not-symmetric", () => one("x,a,b\na,0,1\nb,0,0\n"), "not-symmetric", 2, 3],
    ["non-numeric weight (edge list)", () => one("source,target,weight\na,b,lots\n"), "non-numeric", 2, 3],
    ["negative weight (edge list)", () => one("source,target,weight\na,b,1\nb,c,-1\n"), "negative", 3, 3],
    ["bad-option (directed bipartite)", () => bip("x,a\nr,1\n", { directed: true }), "bad-option", null, null],
  ];
  it.each(cases)("%s", (_name, fn, code, row, column) => {
    const e = parseError(fn);
    expect(e.code).toBe(code);
    expect(e.file).toBe("web.csv");
    if (code !== "bad-csv") {
      expect(e.row).toBe(row);
      expect(e.column).toBe(column);
    } else {
      expect(e.row).not.toBeNull();
    }
    expect(e.message.startsWith("web.csv")).toBe(true);
    if (row !== null && code !== "bad-csv") expect(e.message).toContain(`row ${row}`);
    if (column !== null) expect(e.message).toContain(`column ${column}`);
  });
});

describe("canonical JSON form", () => {
  const samples = (): Network[] => {
    const rng = createRng(51);
    return [
      bipartite(randomMatrix(rng, 7, 9, 0.4, true)),
      bipartite(randomMatrix(rng, 5, 4, 0.5, false)),
      randomOneMode(rng, 10, 0.3, false, true, true),
      randomOneMode(rng, 10, 0.3, true, false, true),
    ];
  };
  it("round-trips through JSON text (as stored in JSONB)", () => {
    for (const net of samples()) {
      const json = JSON.parse(JSON.stringify(serializeNetwork(net)));
      const back = deserializeNetwork(json);
      expect(serializeNetwork(back)).toEqual(serializeNetwork(net));
      expect(dense(back)).toEqual(dense(net));
      if (!net.weighted) expect(json.w).toBeNull();
      if (net.kind === "unipartite") expect(json.cols).toBeNull();
    }
  });

  it("rejects malformed stored networks with bad-network", () => {
    const good = serializeNetwork(bipartite([[1, 0], [1, 1]]));
    const broken = [
      { ...good, v: 2 },
      { ...good, idx: [0, 1, 0] },
      { ...good, idx: [0, 5, 1] },
      { ...good, ptr: [0, 1] },
      { ...good, w: [1, -1, 1], weighted: true },
      { ...good, weighted: true },
      { ...good, rows: [1, 2] },
      null,
    ];
    for (const b of broken) expect(() => deserializeNetwork(b)).toThrow(NetworkEngineError);
    const asym = serializeNetwork(oneMode(3, [[0, 1]], true));
    expect(() => deserializeNetwork({ ...asym, directed: false })).toThrow(/symmetric/);
  });
});

describe("CSV writers round-trip through the parser", () => {
  const tricky = (net: Network): Network => {
    const names = net.rowLabels.map((l, i) => (i === 0 ? 'He said "hi", twice' : i === 1 ? "tab\there" : l));
    return { ...net, rowLabels: names, colLabels: net.kind === "bipartite" ? net.colLabels : names };
  };
  it("matrix CSV and TSV keep every node (isolated ones too), order, weights and kind", () => {
    const rng = createRng(61);
    const nets: Array<[Network, Partial<ParseOptions>]> = [
      [tricky(bipartite(randomMatrix(rng, 6, 8, 0.4, true))), {}],
      [tricky(randomOneMode(rng, 9, 0.3, false, true, true)), {}],
      [tricky(randomOneMode(rng, 9, 0.3, true, true, true)), { directed: true }],
    ];
    for (const [net, extra] of nets) {
      if (net.rowPtr[net.rowLabels.length] === 0) continue;
      for (const delimiter of [",", "\t", ";"] as const) {
        const text = networkToMatrixCsv({ ...net, weights: net.weights.map((w) => Math.round(w * 4) / 4) }, { delimiter });
        const parsed = parseNetworkText(text, { fileName: "m.csv", kind: net.kind, ...extra }).network;
        expect(parsed.rowLabels).toEqual(net.rowLabels);
        expect(parsed.colLabels).toEqual(net.colLabels);
        expect(dense(parsed)).toEqual(dense({ ...net, weights: net.weights.map((w) => Math.round(w * 4) / 4) }));
      }
    }
  });

  it("edge-list CSV keeps links and weights (nodes in order of first appearance)", () => {
    const rng = createRng(62);
    const nets: Array<[Network, Partial<ParseOptions>]> = [
      [tricky(bipartite(randomMatrix(rng, 6, 8, 0.5, true))), {}],
      [tricky(randomOneMode(rng, 9, 0.4, false, true, true)), {}],
      [tricky(randomOneMode(rng, 9, 0.4, true, false, true)), { directed: true }],
    ];
    for (const [net, extra] of nets) {
      const parsed = parseNetworkText(networkToEdgeListCsv(net), { fileName: "e.csv", kind: net.kind, ...extra }).network;
      const cells = (n: Network) => {
        const out: string[] = [];
        for (let i = 0; i < n.rowLabels.length; i++) for (let p = n.rowPtr[i]; p < n.rowPtr[i + 1]; p++) out.push(`${n.rowLabels[i]}|${n.colLabels[n.colIdx[p]]}|${n.weights[p]}`);
        return out.sort();
      };
      expect(cells(parsed)).toEqual(cells(net));
      expect(parsed.weighted).toBe(net.weighted);
    }
  });
});

describe("large files are read in pieces without losing records or line numbers", () => {
  // Regression: one reader call on a whole 30 MB text held hundreds of MB; the text is now fed in ~1 MB pieces.
  const J = 1000;
  const header = "x," + Array.from({ length: J }, (_, j) => `c${j}`).join(",");
  const row = (i: number, label = `r${i}`) => `${label},` + Array.from({ length: J }, (_, j) => ((i + j) % 97 === 0 ? "1" : "0")).join(",");
  it("a 1.4 MB matrix with a quoted multi-line label parses completely", () => {
    const rows = Array.from({ length: 700 }, (_, i) => row(i, i === 520 ? '"two\nlines"' : `r${i}`));
    const r = bip([header, ...rows].join("\n") + "\n");
    expect(r.network.rowLabels).toHaveLength(700);
    expect(r.network.rowLabels[520]).toBe("two\nlines");
    let expected = 0;
    for (let i = 0; i < 700; i++) for (let j = 0; j < J; j++) if ((i + j) % 97 === 0) expected++;
    expect(r.network.colIdx.length).toBe(expected);
  });
  it("an error on line 702 of a 1.4 MB file is reported on line 702", () => {
    const rows = Array.from({ length: 700 }, (_, i) => row(i));
    rows[700] = row(700).replace(/,0$/, ",oops");
    const e = parseError(() => bip([header, ...rows].join("\n") + "\n"));
    expect(e.code).toBe("non-numeric");
    expect(e.row).toBe(702);
    expect(e.column).toBe(J + 1);
  });
});
