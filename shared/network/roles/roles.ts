/**
 * Node roles from a partition: within-module degree z and participation coefficient P
 * (Guimerà & Amaral 2005, Nature 433:895, doi:10.1038/nature03288), and the four roles of pollination
 * networks with thresholds z = 2.5 and P = 0.62 (Olesen, Bascompte, Dupont & Jordano 2007, PNAS 104:19891,
 * doi:10.1073/pnas.0706375104).
 *
 *   κ_is = number of links of node i to nodes in module s;  k_i = Σ_s κ_is;  s_i = module of i
 *   z_i = (κ_{i,s_i} − mean κ_{·,s_i}) / sd κ_{·,s_i}    (mean and sd over the nodes of i's module)
 *   P_i = 1 − Σ_s (κ_is / k_i)²
 *   peripheral: z ≤ 2.5 and P ≤ 0.62; connector: z ≤ 2.5 and P > 0.62;
 *   module hub: z > 2.5 and P ≤ 0.62;   network hub: z > 2.5 and P > 0.62.
 *
 * Variant choices (our decisions, README):
 * - degrees count links (binary), as in both papers; `{ weighted: true }` uses strengths instead.
 * - bipartite: a node's links all go to nodes of the other kind, so z is computed within each node kind
 *   per module (rows of module s compared with rows of module s; columns with columns).
 * - directed one-mode: in- and out-links both count (κ_is = links to or from module s).
 * - self-loops / cannibal links are left out (they link a node to itself, not to a module).
 * - sd uses n − 1 (sample standard deviation). z is null when the comparison group has fewer than two
 *   nodes or sd = 0 (all nodes of the group have the same within-module degree, so none stands out); such
 *   a node gets no role (role null), so every node with a role has both z and P and can be plotted.
 * - isolated nodes (k = 0): z, P and role are null and they are left out of their module's mean and sd.
 */
import { checkPartition, nodeCount, nodeLabel } from "../graph";
import type { Network, Partition } from "../types";

export type NodeRoleName = "peripheral" | "connector" | "module-hub" | "network-hub";

export interface NodeRole {
  /** Node number (bipartite: rows first, then columns). */
  node: number;
  label: string;
  /** "row" or "col" for bipartite networks, null for one-mode networks. */
  level: "row" | "col" | null;
  module: number;
  /** k_i: links (or strength with `weighted`), self-loops excluded. */
  degree: number;
  /** Within-module degree z, null when undefined (see header). */
  z: number | null;
  /** Participation coefficient P, null for an isolated node. */
  participation: number | null;
  role: NodeRoleName | null;
}

export interface RoleOptions {
  /** z threshold for hubs (default 2.5, Olesen et al. 2007). */
  zThreshold?: number;
  /** P threshold for connectors (default 0.62, Olesen et al. 2007). */
  pThreshold?: number;
  /** Use strengths instead of link counts (default false). */
  weighted?: boolean;
}

export const ROLE_THRESHOLDS = { z: 2.5, p: 0.62 } as const;

export function classifyRole(z: number | null, p: number, zThreshold = 2.5, pThreshold = 0.62): NodeRoleName {
  const hub = z !== null && z > zThreshold;
  const connects = p > pThreshold;
  if (hub) return connects ? "network-hub" : "module-hub";
  return connects ? "connector" : "peripheral";
}

export function nodeRoles(net: Network, partition: Partition | ArrayLike<number>, options: RoleOptions = {}): NodeRole[] {
  const slots = checkPartition(net, partition);
  const zT = options.zThreshold ?? ROLE_THRESHOLDS.z;
  const pT = options.pThreshold ?? ROLE_THRESHOLDS.p;
  const useW = options.weighted === true;
  const n = nodeCount(net);
  const I = net.rowLabels.length;
  const bip = net.kind === "bipartite";
  const colOffset = bip ? I : 0;
  const { rowPtr, colIdx, weights } = net;

  // Neighbour lists in node numbering (both directions), self-loops dropped.
  const deg = new Float64Array(n);
  const within = new Float64Array(n);
  const sumSq = new Float64Array(n); // Σ_s κ_is², filled per node below
  // Build per-node module tallies with a sparse accumulator over incident cells.
  const adjPtr = new Uint32Array(n + 1);
  const symmetricStored = net.kind === "unipartite" && !net.directed;
  for (let i = 0; i < I; i++) {
    for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++) {
      const v = colIdx[p] + colOffset;
      if (v === i) continue;
      adjPtr[i + 1]++;
      if (!symmetricStored) adjPtr[v + 1]++;
    }
  }
  for (let v = 0; v < n; v++) adjPtr[v + 1] += adjPtr[v];
  const adj = new Uint32Array(adjPtr[n]);
  const adjW = new Float64Array(adjPtr[n]);
  const fill = adjPtr.slice(0, n);
  for (let i = 0; i < I; i++) {
    for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++) {
      const v = colIdx[p] + colOffset;
      if (v === i) continue;
      const w = useW ? weights[p] : 1;
      adj[fill[i]] = v;
      adjW[fill[i]++] = w;
      if (!symmetricStored) {
        adj[fill[v]] = i;
        adjW[fill[v]++] = w;
      }
    }
  }
  const tally = new Float64Array(slots);
  const touched: number[] = [];
  for (let v = 0; v < n; v++) {
    let k = 0;
    for (let q = adjPtr[v]; q < adjPtr[v + 1]; q++) {
      const s = partition[adj[q]];
      if (tally[s] === 0) touched.push(s);
      tally[s] += adjW[q];
      k += adjW[q];
    }
    deg[v] = k;
    within[v] = tally[partition[v]];
    let sq = 0;
    for (const s of touched) {
      sq += tally[s] * tally[s];
      tally[s] = 0;
    }
    touched.length = 0;
    sumSq[v] = sq;
  }

  // Mean and sample sd of κ within each (module, kind) group over non-isolated nodes.
  const groups = bip ? 2 * slots : slots;
  const groupOf = (v: number) => (bip && v >= I ? slots + partition[v] : partition[v]);
  const cnt = new Float64Array(groups);
  const sum = new Float64Array(groups);
  for (let v = 0; v < n; v++) {
    if (deg[v] === 0) continue;
    const g = groupOf(v);
    cnt[g]++;
    sum[g] += within[v];
  }
  const mean = new Float64Array(groups);
  for (let g = 0; g < groups; g++) mean[g] = cnt[g] > 0 ? sum[g] / cnt[g] : 0;
  const ss = new Float64Array(groups);
  for (let v = 0; v < n; v++) {
    if (deg[v] === 0) continue;
    const g = groupOf(v);
    const d = within[v] - mean[g];
    ss[g] += d * d;
  }
  const out: NodeRole[] = new Array(n);
  for (let v = 0; v < n; v++) {
    const level = bip ? (v < I ? "row" : "col") : null;
    if (deg[v] === 0) {
      out[v] = { node: v, label: nodeLabel(net, v), level, module: partition[v], degree: 0, z: null, participation: null, role: null };
      continue;
    }
    const g = groupOf(v);
    const sd = cnt[g] > 1 ? Math.sqrt(ss[g] / (cnt[g] - 1)) : 0;
    // Relative tolerance guards against a spurious non-zero sd from rounding of equal values.
    const z = sd > 1e-12 * Math.max(1, Math.abs(mean[g])) ? (within[v] - mean[g]) / sd : null;
    const P = 1 - sumSq[v] / (deg[v] * deg[v]);
    const participation = Math.abs(P) < 1e-15 ? 0 : P;
    out[v] = {
      node: v,
      label: nodeLabel(net, v),
      level,
      module: partition[v],
      degree: deg[v],
      z,
      participation,
      role: z === null ? null : classifyRole(z, participation, zT, pT),
    };
  }
  return out;
}
