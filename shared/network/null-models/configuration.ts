/**
 * The configuration model of one-mode networks: a random graph with exactly the observed degree sequence
 * (Bender & Canfield 1978, J Comb Theory A 24:296; Molloy & Reed 1995, Random Struct Algor 6:161;
 * Newman 2003, SIAM Rev 45:167 — from memory), the null whose expectation k_i k_j / 2m is built into
 * Newman–Girvan modularity. The product draws it on simple graphs (no multi-links, self-loops as
 * observed), uniformly over the graphs with the observed degrees, which is the fixed-degree null of a
 * one-mode network (the space of vertex-labelled simple graphs; Fosdick, Larremore, Nishimura & Ugander
 * 2018, SIAM Rev 60:315 — from memory). Random stub matching would create multi-links and self-loops,
 * i.e. a weighted object, where binary data needs a binary null.
 *
 * Sampler: the one-mode curveball chain (Carstens, Berger & Strona 2018, MethodsX 5:773,
 * doi:10.1016/j.mex.2018.06.018; ./curveball.ts): symmetric trades for undirected networks, row trades
 * with a fixed diagonal for directed ones (in- and out-degrees kept). In the product it is the one-mode
 * face of the "curveball" (fixed degrees) null model, so one catalogue column covers both kinds.
 * Keeps: every degree (directed: in and out), L, self-loops. Does not keep: anything beyond degrees.
 * Weighted input: the structure is drawn as above, then carries the observed weights in random order
 * (weights.ts), so strengths are not kept. Cost O(trades × mean degree), trades = max(1000, 5 S).
 */
import { NetworkEngineError } from "../errors";
import type { Rng } from "../random";
import type { Network } from "../types";
import { curveballNull, type CurveballOptions } from "./curveball";
import { withShuffledWeights } from "./weights";

export function configurationNull(net: Network, rng: Rng, options: CurveballOptions = {}): Network {
  if (net.kind !== "unipartite") {
    throw new NetworkEngineError("unsupported", "The configuration model is a one-mode null; bipartite networks use curveball");
  }
  return withShuffledWeights(curveballNull(net, rng, options), net, rng);
}
