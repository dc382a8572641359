/**
 * `npm run bench:significance` — calibration and power of the default null models, and their speed.
 *
 * For each size (30×40, 100×150, 300×500) and class (random binary, random structure with lognormal
 * weights, random integer counts, perfectly nested — none has modules — and planted modules; generators in
 * scripts/lib/significance-classes.ts) it draws N seeded networks (default 100) and tests each against every
 * null model of that kind's standard set (the pipeline's default), printing:
 *   - the false-positive rate: the share of non-modular networks with p ≤ 0.05 (nominal 5 %), with its
 *     binomial 95 % interval; for planted networks the same share is the power;
 *   - the mean z;
 *   - null replicates per second of one thread (generation + optimization).
 * Effort, stated in the output: 19 nulls per model (p ≤ 0.05 then means the observed Q beat all 19, which
 * under a calibrated null happens with probability exactly 1/20), one optimizer restart and no annealing
 * for observed and nulls alike (the same effort, so the test stays fair; the pipeline's 20 restarts cost
 * 20× more and do not change calibration). Connectance falls with size as in field data: C = 0.25, 0.1,
 * 0.05. Networks run on worker threads (default: all cores); results do not depend on the thread count.
 *
 * Options: --networks N (default 100)  --networks-large N (300 × 500, default 30: about 10 s of one thread per
 * network and class, so 100 take about 40 minutes on 2 cores)  --nulls N  --sizes 30x40,100x150,300x500
 * --threads N  --classes binary,…
 */
import { availableParallelism } from "node:os";
import { parseArgs } from "node:util";
import { Worker } from "node:worker_threads";
import { NULL_MODEL_INFO, standardNullModels, type NullModelName } from "@shared/network/null-models/index";
import { classNetwork, type ClassName } from "./lib/significance-classes";
import type { SignificanceJobResult, SignificanceTask } from "./lib/significance-job";

const { values } = parseArgs({
  options: {
    networks: { type: "string", default: "100" },
    "networks-large": { type: "string", default: "30" },
    nulls: { type: "string", default: "19" },
    sizes: { type: "string", default: "30x40,100x150,300x500" },
    threads: { type: "string" },
    classes: { type: "string", default: "binary,lognormal,counts,nested,planted" },
  },
});
const NETWORKS = Number(values.networks);
/** Networks per class at 300 × 500 (each costs about 10 s of one thread per class; 100 would take about 40 min on 2 cores). */
const NETWORKS_LARGE = Number(values["networks-large"]);
const networksAt = (I: number, J: number) => (I * J >= 300 * 500 ? NETWORKS_LARGE : NETWORKS);
const NULLS = Number(values.nulls);
const THREADS = Number(values.threads ?? availableParallelism());
const CONNECTANCE: Record<string, number> = { "30x40": 0.25, "100x150": 0.1, "300x500": 0.05 };
const sizes = values.sizes.split(",").map((s) => {
  const [I, J] = s.split("x").map(Number);
  return { I, J, C: CONNECTANCE[s] ?? 0.1, label: s };
});
const classes = values.classes.split(",") as ClassName[];

class Pool {
  private idle: Worker[] = [];
  private queue: Array<{ task: SignificanceTask; resolve: (r: SignificanceJobResult) => void }> = [];
  private all: Worker[] = [];
  async start(n: number) {
    await Promise.all(
      Array.from({ length: n }, () =>
        new Promise<void>((resolve, reject) => {
          const w = new Worker(new URL("./lib/significance-worker.mjs", import.meta.url));
          w.once("message", () => {
            this.all.push(w);
            this.idle.push(w);
            resolve();
          });
          w.once("error", reject);
        }),
      ),
    );
  }
  run(task: SignificanceTask): Promise<SignificanceJobResult> {
    return new Promise((resolve) => {
      this.queue.push({ task, resolve });
      this.pump();
    });
  }
  private pump() {
    while (this.idle.length && this.queue.length) {
      const w = this.idle.pop()!;
      const { task, resolve } = this.queue.shift()!;
      w.once("message", (r: SignificanceJobResult) => {
        this.idle.push(w);
        resolve(r);
        this.pump();
      });
      w.postMessage(task);
    }
  }
  async stop() {
    await Promise.all(this.all.map((w) => w.terminate()));
  }
}

/** Wilson 95 % interval of a proportion. */
function wilson(k: number, n: number): [number, number] {
  const z = 1.96;
  const p = k / n;
  const d = 1 + (z * z) / n;
  const c = (p + (z * z) / (2 * n)) / d;
  const h = (z * Math.sqrt((p * (1 - p)) / n + (z * z) / (4 * n * n))) / d;
  return [Math.max(0, c - h), Math.min(1, c + h)];
}

const pct = (x: number) => `${(100 * x).toFixed(1)} %`;

async function main() {
  const pool = new Pool();
  await pool.start(THREADS);
  const t0 = Date.now();
  console.log(`Significance benchmark: ${NETWORKS} seeded networks per size and class (${NETWORKS_LARGE} at 300x500, to finish in minutes: --networks-large 100 for the full count), ${NULLS} nulls per null model, 1 optimizer restart and no annealing`);
  console.log(`for observed and nulls alike, ${THREADS} worker threads. p ≤ 0.05 = the observed Q beat all ${NULLS} nulls (probability 1/${NULLS + 1} under a calibrated null).`);
  console.log(`Connectance by size: ${sizes.map((s) => `${s.label} C = ${s.C}`).join(", ")}. Null models: each class's standard set (primary first).\n`);
  const header = ["size", "class", "null model", "", "networks", "p ≤ 0.05", "95 % interval", "mean z", "nulls/s/thread"];
  const rows: string[][] = [];
  for (const size of sizes) {
    for (const cls of classes) {
      const sample = classNetwork(cls, size.I, size.J, 1, size.C);
      const models: NullModelName[] = standardNullModels(sample).models;
      const started = Date.now();
      const results = await Promise.all(
        Array.from({ length: networksAt(size.I, size.J) }, (_, index) => pool.run({ cls, I: size.I, J: size.J, C: size.C, index, models, nulls: NULLS, restarts: 1 })),
      );
      for (const [k, model] of models.entries()) {
        let hits = 0;
        let n = 0;
        let zSum = 0;
        let zN = 0;
        let ms = 0;
        for (const r of results) {
          const m = r.models.find((x) => x.model === model);
          if (!m) continue;
          n++;
          ms += m.ms;
          if (m.p !== null && m.p <= 0.05 + 1e-12) hits++;
          if (m.z !== null) {
            zSum += m.z;
            zN++;
          }
        }
        const [lo, hi] = wilson(hits, Math.max(1, n));
        const role = k === 0 ? "primary" : NULL_MODEL_INFO[model].liberal ? "liberal" : "";
        rows.push([size.label, cls === "planted" ? "planted (power)" : cls, model, role, String(n), pct(hits / Math.max(1, n)), `${pct(lo)}–${pct(hi)}`, zN ? (zSum / zN).toFixed(2) : "—", ((n * NULLS) / (ms / 1000)).toFixed(0)]);
      }
      process.stderr.write(`  ${size.label} ${cls}: ${((Date.now() - started) / 1000).toFixed(0)} s\n`);
    }
  }
  await pool.stop();
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  const line = (r: string[]) => r.map((c, i) => (i >= 4 ? c.padStart(widths[i]) : c.padEnd(widths[i]))).join("  ");
  console.log(line(header));
  console.log(widths.map((w) => "-".repeat(w)).join("  "));
  for (const r of rows) console.log(line(r));
  console.log(`\nNon-modular classes: a calibrated null gives about 5 % (the interval should cover 5 %); "liberal" models are expected to exceed it on some class.`);
  console.log(`Planted: the share detected is the power. Wall time ${((Date.now() - t0) / 1000).toFixed(0)} s.`);
}

void main();
