/**
 * The binary network a null model returns: the observed network's kind, direction and labels on a new link
 * structure (compressed rows), every weight 1. Models that keep weights shuffle them onto it afterwards
 * (weights.ts, `withShuffledWeights`).
 */
import type { Network } from "../types";

/** The binary network on the structure `rowPtr`/`colIdx` (column numbers sorted within each row). */
export function binaryNetwork(net: Network, rowPtr: Uint32Array, colIdx: Uint32Array): Network {
  return {
    kind: net.kind,
    directed: net.directed,
    weighted: false,
    rowLabels: net.rowLabels,
    colLabels: net.colLabels,
    rowPtr,
    colIdx,
    weights: new Float64Array(colIdx.length).fill(1),
  };
}

/** The binary network whose links are the cells numbered `row × cols + col`, given in ascending order. */
export function binaryNetworkFromCells(net: Network, rows: number, cols: number, cells: ArrayLike<number>): Network {
  const rowPtr = new Uint32Array(rows + 1);
  const colIdx = new Uint32Array(cells.length);
  for (let p = 0; p < cells.length; p++) {
    const k = cells[p];
    const i = Math.floor(k / cols);
    colIdx[p] = k - i * cols;
    rowPtr[i + 1]++;
  }
  for (let i = 0; i < rows; i++) rowPtr[i + 1] += rowPtr[i];
  return binaryNetwork(net, rowPtr, colIdx);
}
