import { Worker } from "node:worker_threads";
import { describe, expect, it } from "vitest";
import { analyzeNetwork, resolveNullModels } from "@shared/network/analyze";
import { serializeNetwork } from "@shared/network/parse/index";
import { nullReplicateNetwork, nullReplicateQ, nullReplicateStats, summarizeNulls, zStandardError } from "@shared/network/significance";
import { bipartite, createRng, davis, karate, randomMatrix } from "./helpers";

describe("summarizeNulls", () => {
  it("computes mean, sd (n−1), z, Q_rel, ΔQ and p on a hand-made sample", () => {
    // Hand computation from the formulas of docs/science.md ("Significance"):
    // nulls 0.3, 0.4, 0.5, 0.2, 0.35: mean 0.35; squared deviations sum 0.05, sd = √(0.05/4) = 0.1118034;
    // z = 0.15/0.1118034 = 1.3416408; Q_rel = 0.15/0.35 = 0.4285714; p = (1 + 1)/(5 + 1) = 1/3
    // (the null value 0.5 equals Q and counts as ≥ Q).
    const s = summarizeNulls(0.5, [0.3, 0.4, 0.5, 0.2, 0.35]);
    expect(s.n).toBe(5);
    expect(s.mean!).toBeCloseTo(0.35, 12);
    expect(s.sd!).toBeCloseTo(Math.sqrt(0.0125), 12);
    expect(s.z!).toBeCloseTo(0.15 / Math.sqrt(0.0125), 10);
    expect(s.qRel!).toBeCloseTo(0.15 / 0.35, 12);
    expect(s.deltaQ!).toBeCloseTo(0.15, 12);
    expect(s.p!).toBeCloseTo(1 / 3, 12);
    expect(s.unstable).toBe(false);
  });

  it("p is 1/(N+1) when no null reaches Q and 1 when all do", () => {
    expect(summarizeNulls(0.9, [0.1, 0.2, 0.3, 0.25]).p).toBeCloseTo(1 / 5, 12);
    expect(summarizeNulls(0.0, [0.1, 0.2, 0.3, 0.25]).p).toBeCloseTo(1, 12);
  });

  it("flags z as unstable when sd is 0 or null values are few and repeated", () => {
    const flat = summarizeNulls(0.4, [0.3, 0.3, 0.3, 0.3]);
    expect(flat.z).toBeNull();
    expect(flat.unstable).toBe(true);
    expect(flat.unstableReason).toMatch(/sd/);
    const few = summarizeNulls(0.4, Array.from({ length: 20 }, (_, i) => (i % 2 ? 0.3 : 0.31)));
    expect(few.z).not.toBeNull();
    expect(few.unstable).toBe(true);
    expect(few.unstableReason).toMatch(/2 distinct/);
    const one = summarizeNulls(0.4, [0.3]);
    expect(one.sd).toBeNull();
    expect(one.unstable).toBe(true);
    const none = summarizeNulls(0.4, []);
    expect(none.p).toBeNull();
  });
});

describe("null replicates", () => {
  const net = davis();
  const settings = { model: "er" as const, seed: 42, restarts: 3, objective: "barber" as const, annealing: "off" as const };

  it("replicate r depends only on (seed, r): any order and any chunking give the same numbers", () => {
    const inOrder = [0, 1, 2, 3, 4, 5].map((r) => nullReplicateQ(net, { ...settings, replicate: r }));
    const reversed = [5, 4, 3, 2, 1, 0].map((r) => nullReplicateQ(net, { ...settings, replicate: r })).reverse();
    const chunkA = [4, 0, 2].map((r) => [r, nullReplicateQ(net, { ...settings, replicate: r })] as const);
    const chunkB = [5, 3, 1].map((r) => [r, nullReplicateQ(net, { ...settings, replicate: r })] as const);
    const merged = [...chunkA, ...chunkB].sort((x, y) => x[0] - y[0]).map((x) => x[1]);
    expect(reversed).toEqual(inOrder);
    expect(merged).toEqual(inOrder);
    // Different replicates are different random networks.
    expect(new Set(inOrder).size).toBeGreaterThan(1);
    // ER keeps the number of links (Erdős–Rényi G(n, L) form).
    expect(nullReplicateNetwork(net, "er", 42, 3).rowPtr[18]).toBe(89);
  });

  it("worker threads computing chunks give the single-threaded numbers", async () => {
    const single = [0, 1, 2, 3].map((r) => nullReplicateQ(net, { ...settings, replicate: r }));
    const run = (replicates: number[]) =>
      new Promise<Array<[number, number]>>((resolve, reject) => {
        const w = new Worker(new URL("./null-worker.mjs", import.meta.url), {
          workerData: { network: serializeNetwork(net), settings, replicates },
        });
        w.once("message", (m) => {
          resolve(m);
          void w.terminate();
        });
        w.once("error", reject);
      });
    const [a, b] = await Promise.all([run([3, 1]), run([0, 2])]);
    const threaded = [...a, ...b].sort((x, y) => x[0] - y[0]).map((x) => x[1]);
    expect(threaded).toEqual(single);
  });

  it("analyzeNetwork gives the same result with replicates computed elsewhere", () => {
    const k = karate();
    const s = { restarts: 4, nulls: 6, seed: 9, annealing: "off" as const };
    const here = analyzeNetwork(k, s);
    const choice = resolveNullModels(k);
    const nullReplicates = Object.fromEntries(
      choice.models.map((model) => [
        model,
        [5, 4, 3, 2, 1, 0].map((r) => nullReplicateStats(k, { model, seed: 9, replicate: r, restarts: 4, objective: "newman", annealing: "off" })).reverse(),
      ]),
    );
    const passed = analyzeNetwork(k, { ...s, nullReplicates });
    expect({ ...passed, elapsedMs: 0 }).toEqual({ ...here, elapsedMs: 0 });
    expect(here.null!.n).toBe(6);
    // One-mode undirected: fixed degrees (the configuration model) is the primary, Erdős–Rényi the liberal comparison.
    expect(here.null!.model).toBe("curveball");
    expect(here.nulls!.map((f) => [f.model, f.primary])).toEqual([["curveball", true], ["er", false]]);
    // Karate is far more modular than random graphs of its size and degrees (z well above 2; p at its floor 1/7).
    expect(here.null!.z!).toBeGreaterThan(2);
    expect(here.null!.p).toBeCloseTo(1 / 7, 12);
    expect(here.null!.pAtFloor).toBe(true);
    expect(here.null!.zSe).toBeCloseTo(zStandardError(here.null!.z!, 6), 12);
  });

  it("the standard set fits each kind of data, with fixed degrees as the primary null", () => {
    const rng = createRng(3);
    expect(resolveNullModels(davis())).toMatchObject({ dataKind: "binary-bipartite", primary: "curveball", models: ["curveball", "probabilistic", "er"] });
    expect(resolveNullModels(bipartite(randomMatrix(rng, 5, 6, 0.5, 7)))).toMatchObject({ dataKind: "integer-bipartite", models: ["curveball", "totals-connectance", "er"] });
    expect(resolveNullModels(bipartite([[0.5, 1], [1, 2]]))).toMatchObject({ dataKind: "real-bipartite", models: ["curveball", "weight-shuffle", "er"] });
    expect(() => resolveNullModels(davis(), { nullModels: ["patefield"] })).toThrow(/binary/);
    expect(() => resolveNullModels(karate(), { nullModel: "totals-connectance" })).toThrow(/undirected/);
  });

  it("optimizes Patefield replicates of a weighted network when asked and keeps its totals", () => {
    const w = bipartite(randomMatrix(createRng(11), 8, 10, 0.5, 5));
    const res = analyzeNetwork(w, { restarts: 3, nulls: 4, seed: 5, nullModel: "patefield" });
    expect(res.null!.model).toBe("patefield");
    expect(res.nulls!.map((f) => f.model)).toEqual(["patefield"]);
    expect(res.null!.n).toBe(4);
    const nul = nullReplicateNetwork(w, "patefield", 5, 0);
    const total = (n: typeof w) => n.weights.reduce((s, x) => s + x, 0);
    expect(total(nul)).toBe(total(w));
  });
});
