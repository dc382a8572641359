/**
 * Null models for the significance of modularity: one entry point, `generateNull(model, net, rng)`, and the
 * individual generators. Each call draws one independent replicate from the injected seeded `Rng`
 * (random.ts); seed replicate r with `createRng(deriveSeed(runSeed, r))` so replicates can run on any
 * thread and still match a single-threaded run.
 *
 * - "er": Erdős–Rényi type, same size and exactly L links (./er.ts) — the product's default.
 * - "curveball": fixed row and column degrees (Strona et al. 2014; ./curveball.ts).
 * - "patefield": fixed row and column totals of an integer-weighted matrix (Patefield 1981; ./patefield.ts).
 * Every output is a valid canonical `Network` (sorted column indices, positive weights) with the input's
 * labels, kind and direction. An edge-less input is refused with `NetworkEngineError("no-links")`:
 * modularity and its null distribution are undefined there.
 */
import { NetworkEngineError } from "../errors";
import type { Rng } from "../random";
import type { Network } from "../types";
import { curveballNull, type CurveballOptions } from "./curveball";
import { erdosRenyiNull } from "./er";
import { patefieldNull, type PatefieldOptions } from "./patefield";

export { curveballNull, defaultCurveballTrades, type CurveballOptions } from "./curveball";
export { erdosRenyiNull } from "./er";
export { patefieldNull, type PatefieldOptions } from "./patefield";

export type NullModelName = "er" | "curveball" | "patefield";

export const NULL_MODELS: readonly NullModelName[] = ["er", "curveball", "patefield"];

export type NullModelOptions = CurveballOptions & PatefieldOptions;

export function nullModelLabel(model: NullModelName): string {
  switch (model) {
    case "er":
      return "Erdős–Rényi type: same size, exactly L links placed uniformly (binary)";
    case "curveball":
      return "Fixed row and column degrees, curveball (Strona et al. 2014; binary)";
    case "patefield":
      return "Fixed row and column totals, Patefield 1981 (AS 159; integer weights)";
  }
}

export function generateNull(model: NullModelName, net: Network, rng: Rng, options: NullModelOptions = {}): Network {
  if (net.rowPtr[net.rowLabels.length] === 0) {
    throw new NetworkEngineError("no-links", "A null model of a network with no links is undefined");
  }
  switch (model) {
    case "er":
      return erdosRenyiNull(net, rng);
    case "curveball":
      return curveballNull(net, rng, options);
    case "patefield":
      return patefieldNull(net, rng, options);
    default:
      throw new NetworkEngineError("bad-option", `Unknown null model ${String(model)}`);
  }
}
