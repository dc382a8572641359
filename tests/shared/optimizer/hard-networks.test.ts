/**
 * The benchmark's weighted and nested generators (scripts/lib/hard-networks.ts) make what they claim:
 * valid networks, nested row and column sets, the requested share of noise, heavy-tailed integer weights
 * that follow the degrees and stay symmetric on one-mode graphs. Checked by direct counting.
 */
import { describe, expect, it } from "vitest";
import { lfrGraph, nestedBipartite, weightedBipartiteDC, weightedLfrGraph } from "../../../scripts/lib/hard-networks";
import { validateNetwork } from "@shared/network/graph";
import type { Network } from "@shared/network/types";

const rowSets = (net: Network): Set<number>[] =>
  net.rowLabels.map((_, i) => new Set(Array.from(net.colIdx.subarray(net.rowPtr[i], net.rowPtr[i + 1]))));

describe("nestedBipartite", () => {
  it("without noise: every row's columns contain those of every later row (and columns likewise); fill as asked", () => {
    const { net } = nestedBipartite({ rows: 40, cols: 60, seed: 1, noise: 0, fill: 0.2 });
    validateNetwork(net);
    const rows = rowSets(net);
    for (let i = 1; i < rows.length; i++) for (const j of rows[i]) expect(rows[i - 1].has(j)).toBe(true);
    // Columns: a column's rows are 0..r−1 for some r, so containment holds between columns too.
    for (const r of rows) for (const j of r) expect(j === 0 || r.has(j - 1)).toBe(true);
    expect(net.rowPtr[40] / (40 * 60)).toBeGreaterThan(0.19);
    expect(net.rowPtr[40] / (40 * 60)).toBeLessThan(0.21);
  });

  it("with 5 % noise: about 5 % of the links lie outside the nested pattern, no empty row or column", () => {
    const clean = rowSets(nestedBipartite({ rows: 100, cols: 150, seed: 2, noise: 0 }).net);
    const { net } = nestedBipartite({ rows: 100, cols: 150, seed: 2, noise: 0.05 });
    validateNetwork(net);
    const noisy = rowSets(net);
    let outside = 0;
    let links = 0;
    noisy.forEach((r, i) => {
      for (const j of r) {
        links++;
        if (!clean[i].has(j)) outside++;
      }
    });
    expect(outside / links).toBeGreaterThan(0.04);
    expect(outside / links).toBeLessThan(0.06);
    for (const r of noisy) expect(r.size).toBeGreaterThan(0);
    const colSeen = new Set<number>();
    for (const r of noisy) for (const j of r) colSeen.add(j);
    expect(colSeen.size).toBe(150);
  });
});

describe("heavy-tailed weights", () => {
  it("one-mode: the LFR graph's links, symmetric integer weights ≥ 1, heavy-tailed, heavier at high degrees", () => {
    const base = lfrGraph({ nodes: 800, mu: 0.4, seed: 5 }).net;
    const { net } = weightedLfrGraph({ nodes: 800, mu: 0.4, seed: 5 });
    validateNetwork(net); // checks symmetry of the weights and the weighted flag
    expect(Array.from(net.colIdx)).toEqual(Array.from(base.colIdx));
    const w = Array.from(net.weights);
    for (const x of w) expect(Number.isInteger(x) && x >= 1).toBe(true);
    const sorted = [...w].sort((a, b) => a - b);
    expect(sorted[sorted.length - 1] / sorted[sorted.length >> 1]).toBeGreaterThan(10);
    // Mean weight of links whose end nodes both have above-median degree vs the rest.
    const deg = net.rowLabels.map((_, i) => net.rowPtr[i + 1] - net.rowPtr[i]);
    const medDeg = [...deg].sort((a, b) => a - b)[deg.length >> 1];
    let hi = 0;
    let nHi = 0;
    let lo = 0;
    let nLo = 0;
    for (let i = 0; i < deg.length; i++)
      for (let e = net.rowPtr[i]; e < net.rowPtr[i + 1]; e++) {
        if (deg[i] > medDeg && deg[net.colIdx[e]] > medDeg) {
          hi += net.weights[e];
          nHi++;
        } else {
          lo += net.weights[e];
          nLo++;
        }
      }
    expect(hi / nHi).toBeGreaterThan(1.5 * (lo / nLo));
  });

  it("bipartite counts: valid, integer, weighted share between modules reported in [0, 1]", () => {
    const { net, mixing } = weightedBipartiteDC({ rows: 60, cols: 90, modules: 4, seed: 6 });
    validateNetwork(net);
    expect(net.weighted).toBe(true);
    for (const x of net.weights) expect(Number.isInteger(x) && x >= 1).toBe(true);
    expect(mixing).toBeGreaterThan(0);
    expect(mixing).toBeLessThan(1);
  });
});
