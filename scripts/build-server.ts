/**
 * Compiles the server for deployment (`npm run build` runs it after the client build): each entry point
 * becomes one ES module in dist/server/ with our own code bundled in and the npm packages left as
 * imports, so `node dist/server/main.js` runs without tsx or TypeScript.
 *
 *   dist/server/main.js            the web server with its background work (README: "Deploying")
 *   dist/server/worker.js          one more metrics worker process (`npm run worker` from the source)
 *   dist/server/set-role.js        gives an account a role (a deployment's first admin; `npm run set-role`)
 *   dist/server/metrics-thread.mjs the body of the metrics worker threads; the pool starts the file of
 *                                  that name beside the module that creates it (server/src/pipeline/pool.ts)
 *   dist/server/parse-process.mjs  the body of the processes that read uploaded files (server/src/lib/parse/pool.ts
 *                                  starts the file of that name beside the module that creates the pool)
 *   dist/server/migrations/*.js    the migrations, found by the migrator beside the compiled server
 *
 * Checks afterwards that every package the compiled server imports is a runtime dependency in
 * package.json (so `npm ci --omit=dev` installs all it needs), and that none of it is tsx.
 */
import { readdirSync, readFileSync, rmSync } from "node:fs";
import { builtinModules } from "node:module";
import { join } from "node:path";
import { build, type BuildOptions, type Metafile } from "esbuild";

const ROOT = join(import.meta.dirname, "..");
const SRC = join(ROOT, "server", "src");
const OUT = join(ROOT, "dist", "server");

const common: BuildOptions = {
  absWorkingDir: ROOT,
  bundle: true,
  platform: "node",
  format: "esm",
  target: "node20",
  packages: "external",
  sourcemap: true,
  metafile: true,
  logLevel: "warning",
  legalComments: "none",
};

rmSync(OUT, { recursive: true, force: true });
const migrations = readdirSync(join(SRC, "db", "migrations")).filter((f) => /^\d{8}-\d{4}-[a-z0-9-]+\.ts$/.test(f));
const results = await Promise.all([
  build({ ...common, entryPoints: [join(SRC, "main.ts"), join(SRC, "worker.ts"), join(SRC, "set-role.ts")], outdir: OUT }),
  build({ ...common, entryPoints: { "metrics-thread": join(SRC, "pipeline", "metrics-thread.ts"), "parse-process": join(SRC, "lib", "parse", "parse-process.ts") }, outdir: OUT, outExtension: { ".js": ".mjs" } }),
  build({ ...common, entryPoints: migrations.map((f) => join(SRC, "db", "migrations", f)), outdir: join(OUT, "migrations") }),
]);

// Every bare import left in the output must be a runtime dependency (builtins aside).
const pkg = JSON.parse(readFileSync(join(ROOT, "package.json"), "utf8")) as { dependencies: Record<string, string> };
const builtins = new Set(builtinModules);
const packageName = (spec: string) => (spec.startsWith("@") ? spec.split("/").slice(0, 2).join("/") : spec.split("/")[0]);
const imported = new Set<string>();
for (const r of results) {
  for (const out of Object.values((r.metafile as Metafile).outputs)) {
    for (const imp of out.imports) {
      if (!imp.external || imp.path.startsWith("node:") || builtins.has(imp.path)) continue;
      imported.add(packageName(imp.path));
    }
  }
}
const missing = [...imported].filter((p) => !(p in pkg.dependencies));
if (missing.length) {
  console.error(`The compiled server imports packages that are not runtime dependencies in package.json: ${missing.join(", ")}`);
  process.exit(1);
}
console.log(`Server compiled to ${OUT} (${migrations.length} migrations; imports ${imported.size} packages, all runtime dependencies)`);
