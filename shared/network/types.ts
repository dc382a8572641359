/**
 * The canonical in-memory form of one interaction network, shared by the parser, every metric, the
 * optimizer and the null models. Pure data: no Node, DOM or database types.
 *
 * Storage is compressed sparse rows (CSR) over the non-zero cells of the matrix:
 * - bipartite: the rows are the row nodes and the columns the column nodes, one kind of node each (e.g. plants
 *   and pollinators, as the depositor names them);
 *   cell (i, j) is the interaction of row node i with column node j.
 * - unipartite: rows and columns are the same S nodes (`colLabels === rowLabels`); cell (i, j) is a link
 *   from i to j. An undirected network stores each link in both directions (symmetric CSR), a self-loop once.
 * Within a row, column indices are strictly increasing (no duplicate cells).
 */
export type NetworkKind = "bipartite" | "unipartite";

export interface Network {
  kind: NetworkKind;
  /** Unipartite only: whether A[i][j] means a directed link i → j. Always false for bipartite. */
  directed: boolean;
  /** True when any non-zero cell differs from 1. */
  weighted: boolean;
  /** Bipartite: labels of the row nodes; unipartite: all node labels. */
  rowLabels: string[];
  /** Bipartite: labels of the column nodes; unipartite: the same array as rowLabels. */
  colLabels: string[];
  /** Length rowLabels.length + 1; row i's cells are rowPtr[i] .. rowPtr[i+1]-1. */
  rowPtr: Uint32Array;
  /** Column index of each stored non-zero cell. */
  colIdx: Uint32Array;
  /** Weight (> 0) of each stored non-zero cell. */
  weights: Float64Array;
}

/** A partition: module number (0-based, consecutive) of every node. Bipartite: rows first, then columns. */
export type Partition = Int32Array;
