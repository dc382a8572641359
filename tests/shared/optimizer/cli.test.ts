/**
 * The command-line tool (scripts/analyze.ts): one run as a child process like a user would (`tsx`, exit
 * status, standard output), the rest through its exported `main` with the same arguments in this process.
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { afterAll, describe, expect, it } from "vitest";
import { main } from "../../../scripts/analyze";
import { FIXTURES } from "./helpers";

const ROOT = fileURLToPath(new URL("../../../", import.meta.url));
const TSX = join(ROOT, "node_modules/.bin/tsx");
const tmp = mkdtempSync(join(tmpdir(), "tb-analyze-"));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

/** The tool in this process: exit status and what it wrote. */
async function analyze(args: string[]) {
  let stdout = "";
  let stderr = "";
  const code = await main(args, { out: (t) => (stdout += t), err: (t) => (stderr += t) });
  return { code, stdout, stderr };
}

/** The tool as a user runs it: a child process. */
function analyzeSpawned(args: string[]) {
  const r = spawnSync(TSX, [join(ROOT, "scripts/analyze.ts"), ...args], { cwd: ROOT, encoding: "utf8", timeout: 60_000 });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe("npm run analyze", () => {
  it("prints one JSON object for the karate club with the documented fields (a child process, as a user runs it)", async () => {
    const r = analyzeSpawned([join(FIXTURES, "karate.edgelist.csv"), "--json", "--restarts", "5", "--nulls", "3", "--seed", "7"]);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    // Zachary 1977: 34 members, 78 links; maximum Q 0.4198 (Brandes et al. 2008).
    expect(out.nodes).toBe(34);
    expect(out.links).toBe(78);
    expect(out.rows).toBeNull();
    expect(out.totalWeight).toBe(78);
    expect(out.connectance).toBeCloseTo((2 * 78) / (34 * 33), 12);
    expect(out.modularity.objective).toBe("newman");
    expect(out.modularity.Q).toBeCloseTo(1277 / 3042, 4);
    expect(out.modularity.modules).toBe(4);
    expect(Object.keys(out.modularity.partition)).toHaveLength(34);
    expect(out.modularity.partition["1"]).toBe(0);
    expect(out.modularity.restarts).toMatchObject({ n: 5 });
    for (const k of ["min", "median", "max", "bestShare"]) expect(typeof out.modularity.restarts[k]).toBe("number");
    expect(out.null).toMatchObject({ model: "curveball", n: 3 });
    for (const k of ["mean", "sd", "z", "qRel", "deltaQ", "p", "zSe", "pSe"]) expect(typeof out.null[k]).toBe("number");
    // Every null model of the standard set, each with its name; the primary first and equal to `null`.
    expect(out.nulls.map((f: { model: string }) => f.model)).toEqual(["curveball", "er"]);
    expect(out.nulls[0]).toMatchObject({ ...out.null, primary: true });
    expect(typeof out.nodf).toBe("number");
    expect(out.roles.nodes).toHaveLength(34);
    expect(out.algorithm).toMatchObject({ seed: 7, version: expect.stringMatching(/^tanglebank-engine /) });
    expect(typeof out.algorithm.name).toBe("string");
    expect(typeof out.elapsedMs).toBe("number");
    expect(out.kindDetection).toMatch(/one-mode/);
    // the exported main, which the other tests call in this process, prints the same (elapsed time aside)
    const inProcess = await analyze([join(FIXTURES, "karate.edgelist.csv"), "--json", "--restarts", "5", "--nulls", "3", "--seed", "7"]);
    expect(inProcess.code).toBe(0);
    expect({ ...JSON.parse(inProcess.stdout), elapsedMs: 0 }).toEqual({ ...out, elapsedMs: 0 });
  });

  it("reads the Davis matrix as bipartite and reaches Q_B = 0.3455; no null block with --nulls 0", async () => {
    // Davis, Gardner & Gardner 1941: 18 × 14, 89 links; maximum Barber Q_B 2737/7921 (scripts/derive-reference-optima.ts).
    const r = await analyze([join(FIXTURES, "davis-southern-women.csv"), "--json", "--nulls", "0"]);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out).toMatchObject({ nodes: 32, rows: 18, cols: 14, links: 89 });
    expect(out.connectance).toBeCloseTo(89 / (18 * 14), 12);
    expect(out.modularity.objective).toBe("barber");
    expect(out.modularity.Q).toBeCloseTo(2737 / 7921, 4);
    expect(out.null).toBeUndefined();
  });

  it("a bipartite edge list: source is the row node, target the column node", async () => {
    const f = join(tmp, "visits.csv");
    writeFileSync(f, "source,target,weight\nplant A,bee 1,3\nplant A,bee 2,1\nplant B,bee 2,4\n");
    const r = await analyze([f, "--kind", "bipartite", "--json", "--nulls", "0"]);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out).toMatchObject({ rows: 2, cols: 2, links: 3, totalWeight: 8 });
    const p = out.modularity.partition;
    expect(p["plant A"]).toBe(p["bee 1"]);
    expect(p["plant B"]).toBe(p["bee 2"]);
    // The roles name the level of each node.
    expect(out.roles.nodes.find((n: { label: string }) => n.label === "bee 1").level).toBe("col");
  });

  it("prints a readable summary without --json", async () => {
    const r = await analyze([join(FIXTURES, "karate.edgelist.csv"), "--restarts", "3", "--nulls", "0"]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/Q = 0\.41979\d* with 4 modules/);
    expect(r.stdout).toMatch(/nodes 34, links 78/);
  });

  it("bad input: non-zero exit and the file, row and column on stderr", async () => {
    const f = join(tmp, "bad.csv");
    writeFileSync(f, "plant,bee1,bee2\np1,1,0\np2,1,lots\n");
    const r = await analyze([f, "--json"]);
    expect(r.code).toBe(1);
    expect(r.stdout).toBe("");
    expect(r.stderr).toContain("bad.csv, row 3, column 3");
  });

  it("bad options and missing files: non-zero exit with the reason", async () => {
    const karate = join(FIXTURES, "karate.edgelist.csv");
    expect(await analyze([karate, "--restarts", "0"])).toMatchObject({ code: 2, stderr: expect.stringContaining("--restarts") });
    expect(await analyze([karate, "--null-model", "shuffle"])).toMatchObject({ code: 2, stderr: expect.stringContaining("--null-model") });
    expect(await analyze([karate, "--kind", "bipartite", "--directed"])).toMatchObject({ code: 2 });
    expect(await analyze([karate, "--frobnicate"])).toMatchObject({ code: 2 });
    // An option the data cannot take: Patefield keeps totals of a bipartite or directed matrix only.
    expect(await analyze([karate, "--null-model", "patefield", "--nulls", "2"])).toMatchObject({
      code: 2,
      stderr: expect.stringContaining("undirected"),
    });
    expect(await analyze([join(tmp, "nope.csv")])).toMatchObject({ code: 1, stderr: expect.stringContaining("cannot read") });
  });

});
