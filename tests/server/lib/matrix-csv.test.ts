/**
 * The bundle's byte-level matrix writer (server/src/lib/matrix-csv.ts) against the engine's
 * writer (`networkToMatrixCsv`, itself tested by round trips through the parser in
 * tests/shared/network/parse.test.ts): the same bytes for random bipartite and one-mode networks
 * (directed or not, self-loops, weights whole, fractional, large and tiny), labels needing quotes and
 * non-ASCII labels, empty rows and networks without links; a CSV parsed back gives the stored network;
 * damaged stored networks throw instead of writing a malformed file. No database needed.
 */
import { describe, expect, it } from "vitest";
import { parse as parseCsv } from "csv-parse/sync";
import { createRng, deserializeNetwork, MATRIX_CORNER, networkToMatrixCsv, parseNetworkText, serializeNetwork, type Network } from "@shared/network/index";
import { networkFromTriples } from "@shared/network/graph";
import { csvHeaderLabels, matrixCsvPieces, matrixCsvFromCanonical } from "../../../server/src/lib/matrix-csv";
import { useNativeCrc32 } from "../../../server/src/api/bundles/bundles.crc";
import { numberFieldsOfCsv } from "../../../server/src/api/bundles/bundles.datapackage";
import { bundleMatrixCsv, MATRIX_CSV_FORMAT } from "../../../server/src/api/bundles/bundles.stored-csv";
import zlib from "node:zlib";

/** The engine's CSV, with another corner cell when asked (the engine writes MATRIX_CORNER, "node"). */
const engine = (net: Network, corner = MATRIX_CORNER) => corner + networkToMatrixCsv(net).slice(MATRIX_CORNER.length);

function randomNetwork(seed: number, opts: { outerSpaces?: boolean } = {}): Network {
  const rng = createRng(seed);
  const kind = rng.next() < 0.5 ? "bipartite" : "unipartite";
  const directed = kind === "unipartite" && rng.next() < 0.5;
  const I = rng.nextInt(40);
  const J = kind === "bipartite" ? rng.nextInt(60) : I;
  const weightKind = rng.nextInt(4); // 0 binary, 1 small whole, 2 large whole, 3 fractional
  const weight = () => (weightKind === 0 ? 1 : weightKind === 1 ? 1 + rng.nextInt(9) : weightKind === 2 ? 10 + rng.nextInt(1e9) : 0.001 + rng.next() * 1000);
  const odd = ["a,b", 'say "hi"', "Épervier d'Europe", "鳥", "line\nbreak", "tab\there", "", ...(opts.outerSpaces === false ? [] : [" padded "])];
  const label = (p: string, i: number) => (rng.next() < 0.15 ? `${odd[rng.nextInt(odd.length)]}_${p}${i}` : `${p}${i}`);
  const rows = Array.from({ length: I }, (_, i) => label("r", i));
  const cols = kind === "bipartite" ? Array.from({ length: J }, (_, j) => label("c", j)) : rows;
  const r: number[] = [];
  const c: number[] = [];
  const w: number[] = [];
  const density = rng.next();
  for (let i = 0; i < I; i++) {
    for (let j = kind === "unipartite" && !directed ? i : 0; j < J; j++) {
      if (rng.next() >= density) continue;
      const x = weight();
      r.push(i); c.push(j); w.push(x);
      if (kind === "unipartite" && !directed && i !== j) { r.push(j); c.push(i); w.push(x); }
    }
  }
  return networkFromTriples({ kind, directed, rowLabels: rows, colLabels: cols }, r, c, w);
}

describe("bundle matrix CSV writer", () => {
  it("writes exactly the engine's bytes, with an empty or named corner cell", () => {
    let checked = 0;
    for (let seed = 1; seed <= 300; seed++) {
      let net: Network;
      try {
        net = randomNetwork(seed);
      } catch {
        continue; // e.g. duplicate labels refused by the engine
      }
      const json = JSON.parse(JSON.stringify(serializeNetwork(net)));
      expect(matrixCsvFromCanonical(json).toString("utf8"), `seed ${seed}`).toBe(engine(net));
      expect(networkToMatrixCsv(net).startsWith("node")).toBe(true);
      expect(matrixCsvFromCanonical(json, "").toString("utf8"), `seed ${seed}`).toBe(engine(net, ""));
      checked++;
    }
    expect(checked).toBeGreaterThan(250);
  });

  it("round-trips through the engine's parser to the stored network", () => {
    for (let seed = 400; seed < 440; seed++) {
      // the parser trims outer spaces of labels even when quoted, so such labels cannot round-trip
      const net = randomNetwork(seed, { outerSpaces: false });
      if (net.rowPtr[net.rowLabels.length] === 0) continue; // the parser refuses a matrix without links
      const stored = serializeNetwork(net);
      const text = matrixCsvFromCanonical(JSON.parse(JSON.stringify(stored))).toString("utf8");
      const back = parseNetworkText(text, { fileName: "m.csv", kind: net.kind, directed: net.directed }).network;
      expect(serializeNetwork(back)).toEqual(serializeNetwork(deserializeNetwork(stored)));
    }
  });

  it("reads the column labels back from a CSV's header (the bundle's Table Schema fields), whatever the quoting", () => {
    for (let seed = 1; seed <= 300; seed++) {
      const net = randomNetwork(seed);
      const csv = matrixCsvFromCanonical(serializeNetwork(net), "node");
      expect(csvHeaderLabels(csv), `seed ${seed}`).toEqual(net.kind === "bipartite" ? net.colLabels : net.rowLabels);
    }
    expect(csvHeaderLabels(Buffer.from('node,"a,b","say ""hi""","line\nbreak",鳥\nx,0,0,0,1\n'))).toEqual(["a,b", 'say "hi"', "line\nbreak", "鳥"]);
    expect(csvHeaderLabels(Buffer.from("node\n"))).toEqual([]);
    expect(csvHeaderLabels(Buffer.from(""))).toEqual([]);
    expect(() => csvHeaderLabels(Buffer.from('node,"open\n'))).toThrow(/unterminated/);
  });

  it("writes the Table Schema fields of a CSV's columns as JSON.stringify would, with or without quoted labels", () => {
    const expected = (labels: string[]) => labels.map((name) => "," + JSON.stringify({ name, type: "number" })).join("");
    let plain = 0;
    for (let seed = 1; seed <= 300; seed++) {
      const net = randomNetwork(seed);
      const csv = matrixCsvFromCanonical(serializeNetwork(net), "node");
      const labels = net.kind === "bipartite" ? net.colLabels : net.rowLabels;
      if (!csv.subarray(0, csv.indexOf(10)).includes(34)) plain++;
      expect(numberFieldsOfCsv(csv), `seed ${seed}`).toBe(expected(labels));
    }
    expect(plain).toBeGreaterThan(20); // the one-replace path was taken too
    const odd = ["back\\slash", "tab\there", "emoji 🐝", "é", "", "鳥"];
    const net = networkFromTriples({ kind: "bipartite", directed: false, rowLabels: ["r"], colLabels: odd }, [0], [0], [1]);
    expect(numberFieldsOfCsv(matrixCsvFromCanonical(serializeNetwork(net), "node"))).toBe(expected(odd));
    expect(numberFieldsOfCsv(Buffer.from("node\n"))).toBe("");
  });

  it("streams the same bytes in pieces of whole rows, none larger than asked unless one row is", () => {
    for (let seed = 1; seed <= 200; seed++) {
      const json = serializeNetwork(randomNetwork(seed));
      const whole = matrixCsvFromCanonical(json, "node");
      // byte offset where each record (the header, then each row) ends, by an independent CSV parser
      const ends = new Set((parseCsv(whole, { info: true, relax_column_count: true }) as unknown as Array<{ info: { bytes: number } }>).map((r) => r.info.bytes));
      expect(ends.has(whole.length)).toBe(true);
      for (const size of [1, 64, 1000, 1 << 20]) {
        const { bytes, pieces } = matrixCsvPieces(json, "node", size);
        expect(bytes).toBe(whole.length);
        const parts = [...pieces];
        expect(Buffer.concat(parts).equals(whole), `seed ${seed}, pieces of ${size}`).toBe(true);
        let at = 0;
        for (const part of parts) {
          const from = at;
          at += part.length;
          expect(ends.has(at), `seed ${seed}: a piece ends inside a row`).toBe(true);
          // larger than asked only when it is a single record
          if (part.length > size) expect([...ends].filter((e) => e > from && e < at)).toEqual([]);
        }
        if (size >= whole.length) expect(parts).toHaveLength(1);
      }
    }
  });

  it("writes the bytes its format number stands for (stored CSVs carry that number: raise MATRIX_CSV_FORMAT when this changes)", () => {
    const net = networkFromTriples({ kind: "bipartite", directed: false, rowLabels: ["Heather", "a,b"], colLabels: ['say "hi"', "Bombus"] }, [0, 1], [1, 0], [2, 0.5]);
    expect(MATRIX_CSV_FORMAT).toBe(1);
    expect(bundleMatrixCsv(serializeNetwork(net)).toString("utf8")).toBe('node,"say ""hi""",Bombus\nHeather,0,2\n"a,b",0.5,0\n');
  });

  it("edge cases: no rows, no links, one cell", () => {
    const empty = networkFromTriples({ kind: "bipartite", directed: false, rowLabels: [], colLabels: [] }, [], [], []);
    expect(matrixCsvFromCanonical(serializeNetwork(empty), "node").toString()).toBe(engine(empty, "node"));
    const noLinks = networkFromTriples({ kind: "bipartite", directed: false, rowLabels: ["a", "b"], colLabels: ["x"] }, [], [], []);
    expect(matrixCsvFromCanonical(serializeNetwork(noLinks)).toString()).toBe("node,x\na,0\nb,0\n");
    const one = networkFromTriples({ kind: "bipartite", directed: false, rowLabels: ["a"], colLabels: ["x"] }, [0], [0], [2.5]);
    expect(matrixCsvFromCanonical(serializeNetwork(one), "node").toString()).toBe("node,x\na,2.5\n");
  });

  it("refuses damaged stored networks instead of writing a malformed file", () => {
    const good = serializeNetwork(networkFromTriples({ kind: "bipartite", directed: false, rowLabels: ["a", "b"], colLabels: ["x", "y"] }, [0, 1], [1, 0], [1, 1]));
    expect(() => matrixCsvFromCanonical({ ...good, idx: [1, 5] })).toThrow(/column index 5/);
    expect(() => matrixCsvFromCanonical({ ...good, ptr: [0, 1] })).toThrow(/row pointers/);
    expect(() => matrixCsvFromCanonical({ ...good, w: [1, -2] })).toThrow(/weight -2/);
    expect(() => matrixCsvFromCanonical({ ...good, v: 2 })).toThrow(/canonical/);
  });
});

describe("native CRC-32 for archiver", () => {
  it("gives the standard check value and the same result as archiver's own package, in pieces too", async () => {
    expect(useNativeCrc32()).toBe(true);
    // check value of CRC-32 for "123456789": 0xCBF43926
    expect(zlib.crc32("123456789")).toBe(0xcbf43926);
    const { createRequire } = await import("node:module");
    const req = createRequire(import.meta.url);
    const crc = createRequire(createRequire(createRequire(req.resolve("archiver")).resolve("zip-stream")).resolve("compress-commons"))("crc-32") as { buf(b: Uint8Array, seed?: number): number };
    expect(crc.buf(Buffer.from("123456789")) >>> 0).toBe(0xcbf43926);
    const data = Buffer.from("node,x,y\na,0,1\n".repeat(1000));
    expect(crc.buf(data.subarray(500), crc.buf(data.subarray(0, 500)) >>> 0) >>> 0).toBe(zlib.crc32(data));
  });
});
