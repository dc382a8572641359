/**
 * Canonical JSON form of a `Network` for storage (PostgreSQL JSONB) and transport, and back.
 *
 *   { v: 1, kind, directed, weighted, rows: string[], cols: string[] | null, ptr: number[], idx: number[],
 *     w: number[] | null }
 * `cols` is null for one-mode networks (the nodes are `rows`); `w` is null when the network is unweighted
 * (every weight 1). `ptr`, `idx` and `w` are the CSR arrays of types.ts. `deserializeNetwork` checks every
 * invariant and throws `NetworkEngineError("bad-network")` naming the first violation.
 */
import { validateNetwork } from "../graph";
import { NetworkEngineError } from "../errors";
import type { Network } from "../types";

export interface CanonicalNetworkJson {
  v: 1;
  kind: "bipartite" | "unipartite";
  directed: boolean;
  weighted: boolean;
  rows: string[];
  cols: string[] | null;
  ptr: number[];
  idx: number[];
  w: number[] | null;
}

export function serializeNetwork(net: Network): CanonicalNetworkJson {
  return {
    v: 1,
    kind: net.kind,
    directed: net.directed,
    weighted: net.weighted,
    rows: net.rowLabels.slice(),
    cols: net.kind === "bipartite" ? net.colLabels.slice() : null,
    ptr: Array.from(net.rowPtr),
    idx: Array.from(net.colIdx),
    w: net.weighted ? Array.from(net.weights) : null,
  };
}

export function deserializeNetwork(json: unknown): Network {
  const bad = (msg: string): never => {
    throw new NetworkEngineError("bad-network", `Stored network: ${msg}`);
  };
  if (typeof json !== "object" || json === null) bad("not an object");
  const o = json as Record<string, unknown>;
  if (o.v !== 1) bad(`unknown version ${JSON.stringify(o.v)}`);
  if (o.kind !== "bipartite" && o.kind !== "unipartite") bad(`unknown kind ${JSON.stringify(o.kind)}`);
  if (typeof o.directed !== "boolean" || typeof o.weighted !== "boolean") bad("directed and weighted must be booleans");
  const strings = (x: unknown, name: string): string[] => {
    if (!Array.isArray(x) || x.some((s) => typeof s !== "string")) bad(`${name} must be an array of strings`);
    return x as string[];
  };
  const ints = (x: unknown, name: string): Uint32Array => {
    if (!Array.isArray(x) || x.some((n) => !Number.isInteger(n) || n < 0 || n > 0xffffffff)) bad(`${name} must be an array of non-negative integers`);
    return Uint32Array.from(x as number[]);
  };
  const rows = strings(o.rows, "rows");
  const cols = o.kind === "bipartite" ? strings(o.cols, "cols") : rows;
  if (o.kind === "unipartite" && o.cols !== null && o.cols !== undefined) bad("cols must be null for a one-mode network");
  const ptr = ints(o.ptr, "ptr");
  const idx = ints(o.idx, "idx");
  let w: Float64Array;
  if (o.w === null || o.w === undefined) w = new Float64Array(idx.length).fill(1);
  else {
    if (!Array.isArray(o.w) || o.w.some((n) => typeof n !== "number")) bad("w must be an array of numbers or null");
    w = Float64Array.from(o.w as number[]);
  }
  const net: Network = {
    kind: o.kind as Network["kind"],
    directed: o.directed as boolean,
    weighted: o.weighted as boolean,
    rowLabels: rows,
    colLabels: cols,
    rowPtr: ptr,
    colIdx: idx,
    weights: w,
  };
  validateNetwork(net);
  return net;
}
