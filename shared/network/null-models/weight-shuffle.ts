/**
 * Shuffled weights on the observed links: the observed structure (which cells are links) is kept and the
 * observed weights are put back on it in a uniformly random order (Fisher–Yates). It asks one question
 * only: given who interacts with whom, are the strong interactions arranged in modules? (The "structure
 * kept, weights randomised" null of quantitative webs; Dormann et al. 2009, Open Ecol J 2:7 — from memory.)
 *
 * Keeps: every link, hence degrees and connectance, and the multiset of weights. Does not keep: node
 * strengths (marginal totals). Because the structure is the observed one, a network whose modules are
 * in its structure keeps them in every null: this model has little power for structural modules and is
 * never a primary null; it is offered for weighted networks (binary data has no weights to shuffle:
 * refused with `unsupported`). One-mode undirected networks shuffle one weight per link (self-loops
 * included) and stay symmetric. Cost O(L log d).
 */
import { NetworkEngineError } from "../errors";
import type { Rng } from "../random";
import type { Network } from "../types";
import { withShuffledWeights } from "./weights";

export function weightShuffleNull(net: Network, rng: Rng): Network {
  if (!net.weighted) {
    throw new NetworkEngineError("unsupported", "A binary network has no weights to shuffle");
  }
  const structure: Network = { ...net, weighted: false, weights: new Float64Array(net.colIdx.length).fill(1) };
  return withShuffledWeights(structure, net, rng);
}
