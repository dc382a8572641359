/**
 * The network a reader built, and what the parser says about it: formula-like labels, names shared by a
 * row and a column node (kept as different nodes), no links at all (refused), and nodes without a link
 * (kept) or linked to themselves (self-loops, cannibal links), each warning naming the nodes and where
 * the first one is in the file.
 */
import type { Network } from "../types";
import { listLabels } from "./errors";
import { looksLikeFormula } from "../../csv";
import { fail, type ReadContext } from "./context";

function warnFormulaLike(ctx: ReadContext, labels: string[]): void {
  const found = labels.filter(looksLikeFormula);
  if (found.length === 0) return;
  ctx.warnings.push({
    code: "formula-like-labels", file: ctx.file, row: null, column: null, count: found.length, labels: found,
    message: `${found.length} label(s) begin like a spreadsheet formula ("=", "+", "-" or "@"): ${listLabels(found)}. They are kept exactly as written; a spreadsheet program may run them as formulas when a CSV file is opened in it, so the network's CSV download offers a spreadsheet-safe form (a leading apostrophe)`,
  });
}

/** The Network of the CSR arrays (after the warning about formula-like labels). */
export function makeNetwork(ctx: ReadContext, rowLabels: string[], rowPtr: Uint32Array, colIdx: Uint32Array, weights: Float64Array, colLabels: string[]): Network {
  warnFormulaLike(ctx, ctx.kind === "bipartite" ? [...rowLabels, ...colLabels] : rowLabels);
  let weighted = false;
  for (let p = 0; p < weights.length; p++) if (weights[p] !== 1) { weighted = true; break; }
  return {
    kind: ctx.kind,
    directed: ctx.directed,
    weighted,
    rowLabels,
    colLabels: ctx.kind === "bipartite" ? colLabels : rowLabels,
    rowPtr,
    colIdx,
    weights,
  };
}

export function warnShared(ctx: ReadContext, shared: string[]): void {
  if (shared.length === 0) return;
  ctx.warnings.push({
    code: "shared-labels", file: ctx.file, row: null, column: null, count: shared.length, labels: shared,
    message: `${shared.length} name(s) label both a row node and a column node, which are kept as different nodes: ${listLabels(shared)}`,
  });
}

/**
 * Refuses a network without links; warns about nodes without a link and self-loops. `rowLine`: the line
 * of each row node (its row of a matrix, or its first line in an edge list); `headerLine`: the header's.
 */
export function checkLinks(ctx: ReadContext, net: Network, isMatrix: boolean, rowLine: Uint32Array, headerLine: number): void {
  const I = net.rowLabels.length;
  const nnz = net.rowPtr[I];
  if (nnz === 0) {
    fail(ctx, "no-links", null, null, `the ${isMatrix ? "matrix" : "edge list"} has no links (every value is 0 or blank)`);
  }
  if (net.kind === "bipartite") {
    const emptyRows: string[] = [];
    let firstLine = 0;
    for (let i = 0; i < I; i++) {
      if (net.rowPtr[i + 1] === net.rowPtr[i]) {
        emptyRows.push(net.rowLabels[i]);
        if (firstLine === 0) firstLine = rowLine[i];
      }
    }
    if (emptyRows.length > 0) {
      ctx.warnings.push({
        code: "empty-rows", file: ctx.file, row: firstLine, column: isMatrix ? 1 : null, count: emptyRows.length, labels: emptyRows,
        message: `${emptyRows.length} row node(s) have no link and are kept: ${listLabels(emptyRows)}`,
      });
    }
    const J = net.colLabels.length;
    const seen = new Uint8Array(J);
    for (let p = 0; p < nnz; p++) seen[net.colIdx[p]] = 1;
    const emptyCols: string[] = [];
    let firstCol = 0;
    for (let j = 0; j < J; j++) {
      if (!seen[j]) {
        emptyCols.push(net.colLabels[j]);
        if (firstCol === 0) firstCol = j + 2;
      }
    }
    if (emptyCols.length > 0) {
      ctx.warnings.push({
        code: "empty-columns", file: ctx.file, row: isMatrix ? headerLine : null, column: isMatrix ? firstCol : null,
        count: emptyCols.length, labels: emptyCols,
        message: `${emptyCols.length} column node(s) have no link and are kept: ${listLabels(emptyCols)}`,
      });
    }
    return;
  }
  const touched = new Uint8Array(I);
  const loops: string[] = [];
  for (let i = 0; i < I; i++) {
    for (let p = net.rowPtr[i]; p < net.rowPtr[i + 1]; p++) {
      const j = net.colIdx[p];
      touched[i] = 1;
      touched[j] = 1;
      if (j === i) loops.push(net.rowLabels[i]);
    }
  }
  const isolated: string[] = [];
  let firstLine = 0;
  for (let i = 0; i < I; i++) {
    if (!touched[i]) {
      isolated.push(net.rowLabels[i]);
      if (firstLine === 0) firstLine = rowLine[i];
    }
  }
  if (isolated.length > 0) {
    ctx.warnings.push({
      code: "isolated-nodes", file: ctx.file, row: firstLine, column: isMatrix ? 1 : null, count: isolated.length, labels: isolated,
      message: `${isolated.length} node(s) have no link and are kept: ${listLabels(isolated)}`,
    });
  }
  if (loops.length > 0) {
    ctx.warnings.push({
      code: "self-loops", file: ctx.file, row: null, column: null, count: loops.length, labels: loops,
      message: `${loops.length} node(s) link to themselves (${ctx.directed ? "cannibal links" : "self-loops"}), kept: ${listLabels(loops)}`,
    });
  }
}
