/**
 * CSV writers for downloads and bundles. Both round-trip through `parseNetworkText`:
 * - `networkToMatrixCsv`: incidence matrix (bipartite) or square adjacency matrix (one-mode; an undirected
 *   network is written symmetric, a self-loop once on the diagonal). The corner cell (the header's first
 *   cell) is `node`, the name of the first column, which holds the row nodes' labels: one convention for
 *   every matrix CSV Tanglebank writes (downloads, the API and bundles). Absent cells are written as 0. Every node, isolated ones included, survives the round trip, in the same order.
 * - `networkToEdgeListCsv`: header `source,target` (plus `weight` when weighted); one line per stored
 *   link, an undirected link once (source ≤ target in node order). Isolated nodes cannot be written in an
 *   edge list, and node order becomes order of first appearance.
 * Labels are kept exactly (`spreadsheetSafe` writes formula-like ones with a leading apostrophe) and quoted by the one CSV rule of shared/csv (the delimiter, a quote, a line break or outer white space). Numbers use
 * JavaScript's shortest round-trip form. Lines end with "\n".
 */
import type { Network } from "../types";
import { quoteField, spreadsheetSafe, type CsvDelimiter } from "../../csv";

/** The header's first cell of every matrix CSV: the name of the column of row labels. */
export const MATRIX_CORNER = "node";

export interface CsvWriteOptions {
  /** Field delimiter (default ","). */
  delimiter?: CsvDelimiter;
  /** Formula-like labels get a leading apostrophe (shared/csv spreadsheetSafe); the data are otherwise exact. */
  spreadsheetSafe?: boolean;
}

function labelWriter(options: CsvWriteOptions): (s: string) => string {
  const d = options.delimiter ?? ",";
  return options.spreadsheetSafe ? (s) => quoteField(spreadsheetSafe(s), d) : (s) => quoteField(s, d);
}

export function networkToMatrixCsv(net: Network, options: CsvWriteOptions = {}): string {
  const d = options.delimiter ?? ",";
  const I = net.rowLabels.length;
  const J = net.kind === "bipartite" ? net.colLabels.length : I;
  const cols = net.kind === "bipartite" ? net.colLabels : net.rowLabels;
  const lines: string[] = [];
  const label = labelWriter(options);
  lines.push([MATRIX_CORNER, ...cols.map(label)].join(d));
  const cells: string[] = new Array(J + 1);
  for (let i = 0; i < I; i++) {
    cells[0] = label(net.rowLabels[i]);
    for (let j = 1; j <= J; j++) cells[j] = "0";
    for (let p = net.rowPtr[i]; p < net.rowPtr[i + 1]; p++) cells[net.colIdx[p] + 1] = String(net.weights[p]);
    lines.push(cells.join(d));
  }
  return lines.join("\n") + "\n";
}

export function networkToEdgeListCsv(net: Network, options: CsvWriteOptions = {}): string {
  const d = options.delimiter ?? ",";
  const I = net.rowLabels.length;
  const cols = net.kind === "bipartite" ? net.colLabels : net.rowLabels;
  const undirected = net.kind === "unipartite" && !net.directed;
  const label = labelWriter(options);
  const lines: string[] = [net.weighted ? ["source", "target", "weight"].join(d) : ["source", "target"].join(d)];
  for (let i = 0; i < I; i++) {
    for (let p = net.rowPtr[i]; p < net.rowPtr[i + 1]; p++) {
      const j = net.colIdx[p];
      if (undirected && j < i) continue;
      const parts = [label(net.rowLabels[i]), label(cols[j])];
      if (net.weighted) parts.push(String(net.weights[p]));
      lines.push(parts.join(d));
    }
  }
  return lines.join("\n") + "\n";
}
