/**
 * The pipeline's computation through its worker-thread pool (piscina, server/src/pipeline/pool.ts) equals the
 * engine's single-threaded analyzeNetwork (shared/network/analyze.ts) for the same settings and seed:
 * null replicates spread over two threads in any chunking give the same numbers, and the combined result
 * is the very object analyzeNetwork returns. Reference data: Zachary's karate club (Zachary 1977,
 * J Anthropol Res 33:452; 34 nodes, 78 links) and the Davis Southern Women bipartite graph (Davis, Gardner
 * & Gardner 1941; 18 × 14, 89 links), from tests/fixtures (read by tests/shared/optimizer/helpers.ts).
 */
import { afterAll, describe, expect, it } from "vitest";
import { analyzeNetwork, serializeNetwork, type Network } from "@shared/network/index";
import type { PipelineSettings } from "@shared/types/pipeline";
import { chunkReplicates, combineAnalysis, nullChunk, type NullReplicatesByModel } from "../../../server/src/pipeline/compute";
import { closePool, runNulls, runObserved } from "../../../server/src/pipeline/pool";
import { davis, karate } from "../../shared/optimizer/helpers";

afterAll(closePool);

async function threaded(net: Network, s: PipelineSettings, parts: number) {
  const canonical = serializeNetwork(net);
  const observed = await runObserved({ canonical, settings: s });
  const chunks = chunkReplicates(s.nulls, parts);
  const byModel: NullReplicatesByModel = {};
  for (const model of observed.nullChoice.models) {
    const results = await Promise.all(
      chunks.map((replicates) => runNulls({ canonical, settings: s, model, objective: observed.analysis.modularity.objective, replicates })),
    );
    byModel[model] = results.flat();
  }
  return { observed, byModel };
}

describe("metrics computed on worker threads", () => {
  it("null replicates over threads in any chunking equal the single-threaded ones (karate, Erdős–Rényi null)", async () => {
    process.env.TB_METRICS_THREADS = "2";
    const s: PipelineSettings = { objective: "auto", restarts: 3, nullModels: ["er"], nulls: 12, seed: 11, annealing: "off" };
    const net = karate();
    const single = nullChunk({ canonical: serializeNetwork(net), settings: s, model: "er", objective: "newman", replicates: [...Array(12).keys()] });
    for (const parts of [1, 2, 5, 12]) {
      const { byModel } = await threaded(net, s, parts);
      expect(byModel.er).toEqual(single);
    }
  });

  it("the combined result is exactly analyzeNetwork's for the same settings (Davis, Barber's Q_B)", async () => {
    const s: PipelineSettings = { objective: "auto", restarts: 4, nullModels: "standard", nulls: 8, seed: 2, annealing: "auto" };
    const net = davis();
    const { observed, byModel } = await threaded(net, s, 3);
    const combined = combineAnalysis(observed, s.nulls, byModel, 0);
    const reference = analyzeNetwork(net, { restarts: 4, nulls: 8, seed: 2, annealing: "auto" });
    expect({ ...combined, elapsedMs: 0 }).toEqual({ ...reference, elapsedMs: 0 });
    expect(JSON.stringify({ ...combined, elapsedMs: 0 })).toBe(JSON.stringify({ ...reference, elapsedMs: 0 }));
    expect(combined.modularity.objective).toBe("barber");
    expect(combined.null!.n).toBe(8);
    expect(combined.nulls!.map((f) => f.model)).toEqual(["curveball", "probabilistic", "er"]);
  });

  it("splits replicates into contiguous chunks covering 0..n−1 once", () => {
    expect(chunkReplicates(10, 4)).toEqual([[0, 1, 2], [3, 4, 5], [6, 7, 8], [9]]);
    expect(chunkReplicates(3, 8)).toEqual([[0], [1], [2]]);
    expect(chunkReplicates(0, 4)).toEqual([]);
  });
});
