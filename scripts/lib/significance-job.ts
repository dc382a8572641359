/**
 * One network of the significance benchmark: generate it (significance-classes.ts), optimize it once,
 * then for each null model compute N null replicates optimized the same way, and return p and z per model
 * with the thread time spent on that model's replicates.
 */
import { optimizeModularity } from "@shared/network/optimizer/optimize";
import { nullReplicateQ, summarizeNulls } from "@shared/network/significance";
import { deriveSeed } from "@shared/network/random";
import type { NullModelName } from "@shared/network/null-models/index";
import { classNetwork, type ClassName } from "./significance-classes";

export interface SignificanceTask {
  cls: ClassName;
  I: number;
  J: number;
  C: number;
  index: number;
  models: NullModelName[];
  nulls: number;
  restarts: number;
}

export interface SignificanceJobResult {
  index: number;
  Q: number | null;
  models: Array<{ model: NullModelName; p: number | null; z: number | null; ms: number }>;
}

export function runJob(t: SignificanceTask): SignificanceJobResult {
  const seed = deriveSeed(0x5167, t.I, t.J, t.index);
  const net = classNetwork(t.cls, t.I, t.J, seed, t.C);
  const obs = optimizeModularity(net, { restarts: t.restarts, annealing: "off", seed });
  const out: SignificanceJobResult = { index: t.index, Q: obs.Q, models: [] };
  if (obs.Q === null) return out;
  for (const model of t.models) {
    const t0 = performance.now();
    const qs: number[] = [];
    for (let r = 0; r < t.nulls; r++) {
      const q = nullReplicateQ(net, { model, seed, replicate: r, restarts: t.restarts, objective: obs.objective, annealing: "off" });
      if (q !== null) qs.push(q);
    }
    const s = summarizeNulls(obs.Q, qs);
    out.models.push({ model, p: s.p, z: s.z, ms: performance.now() - t0 });
  }
  return out;
}
