/**
 * Command-line analysis of one network file, with the same engine and defaults as the web pipeline:
 *
 *   npm run -s analyze -- FILE [--kind bipartite|unipartite] [--directed] [--format auto|matrix|edgelist]
 *                          [--sheet NAME] [--missing no-interaction|not-observed] [--blank no-interaction|not-observed]
 *                          [--restarts N] [--nulls N] [--null-models M1,M2,…] [--seed N]
 *                          [--annealing auto|on|off] [--objective newman|newman-directed|barber] [--json]
 *
 * Files are read as the upload reads them: CSV/TSV/space-separated text (R's write.csv and write.table
 * output, spreadsheet exports) and .xlsx workbooks, recognised by their content whatever their name.
 * A workbook with several sheets holding data needs `--sheet`. Cells such as `NA` or `-` are never read
 * silently: `--missing` says whether they mean no interaction or not observed (unobserved cells count as
 * no link in the analysis; the answer is printed); `--blank` does the same for empty matrix cells (default
 * no interaction).
 *
 * Null models: by default the standard set of the network's kind of data (fixed degrees first, the
 * primary); `--null-models` names others (the first is the primary; `--null-model M` is one model).
 * In --json, `null` holds the primary's figures (same fields as always) and `nulls` every model's, each
 * with its `model`.
 *
 * Without --json: a readable summary. With --json: one JSON object on stdout (shared/network/analyze.ts
 * describes every field). Exit codes: 0 done; 1 the file cannot be read or parsed (the message names
 * file, row and column); 2 bad options.
 *
 * Kind when --kind is not given (stated on stderr, and in the JSON as `kindDetection`):
 * - with --directed: a one-mode (unipartite) network;
 * - a matrix is one-mode when it is square and its column names are its row names (in any order),
 *   otherwise bipartite (rows × columns);
 * - an edge list is bipartite (source = row node, target = column node) when no label is used both as a
 *   source and as a target, otherwise one-mode.
 */
import { readFileSync } from "node:fs";
import { pathToFileURL } from "node:url";
import { parseArgs } from "node:util";
import { analyzeNetwork, ANALYZE_DEFAULTS, type AnalysisResult } from "@shared/network/analyze";
import { NetworkEngineError } from "@shared/network/errors";
import { objectiveLabel } from "@shared/network/modularity/quality";
import { NULL_MODEL_INFO, NULL_MODELS, nullModelLabel, type NullModelName } from "@shared/network/null-models/index";
import type { AnnealingMode } from "@shared/network/optimizer/optimize";
import type { OptimizerObjective } from "@shared/network/optimizer/quality-graph";
import { NetworkParseError, parseNetworkFile, type ParseResult } from "@shared/network/parse/index";
import type { CellMeaning } from "@shared/network/parse/options";

const CELL_MEANINGS: readonly CellMeaning[] = ["no-interaction", "not-observed"];
import type { NetworkKind } from "@shared/network/types";

const USAGE = `usage: npm run -s analyze -- FILE [--kind bipartite|unipartite] [--directed]
         [--format auto|matrix|edgelist] [--sheet NAME] [--missing no-interaction|not-observed]
         [--blank no-interaction|not-observed] [--restarts N] [--nulls N] [--null-models ${NULL_MODELS.join("|")},…]
         [--seed N] [--annealing auto|on|off] [--objective newman|newman-directed|barber] [--json]`;

class OptionError extends Error {}

function intOption(name: string, raw: string | undefined, fallback: number, min: number, max: number): number {
  if (raw === undefined) return fallback;
  if (!/^\d+$/.test(raw.trim())) throw new OptionError(`--${name} must be a whole number, got "${raw}"`);
  const v = Number(raw);
  if (v < min || v > max) throw new OptionError(`--${name} must be from ${min} to ${max}, got ${v}`);
  return v;
}

function oneOf<T extends string>(name: string, raw: string | undefined, allowed: readonly T[]): T | undefined {
  if (raw === undefined) return undefined;
  if (!(allowed as readonly string[]).includes(raw)) {
    throw new OptionError(`--${name} must be one of ${allowed.join(", ")}, got "${raw}"`);
  }
  return raw as T;
}

function readOptions(argv: string[]) {
  let parsed;
  try {
    parsed = parseArgs({
      args: argv,
      allowPositionals: true,
      options: {
        kind: { type: "string" },
        directed: { type: "boolean", default: false },
        format: { type: "string" },
        sheet: { type: "string" },
        missing: { type: "string" },
        blank: { type: "string" },
        restarts: { type: "string" },
        nulls: { type: "string" },
        "null-model": { type: "string" },
        "null-models": { type: "string" },
        seed: { type: "string" },
        annealing: { type: "string" },
        objective: { type: "string" },
        json: { type: "boolean", default: false },
        help: { type: "boolean", short: "h", default: false },
      },
    });
  } catch (err) {
    throw new OptionError((err as Error).message);
  }
  const { values, positionals } = parsed;
  if (values.help) return null;
  if (positionals.length !== 1) {
    throw new OptionError(positionals.length === 0 ? "no input file given" : `one input file expected, got ${positionals.length}`);
  }
  const kind = oneOf<NetworkKind>("kind", values.kind, ["bipartite", "unipartite"]);
  if (kind === "bipartite" && values.directed) {
    throw new OptionError("--directed applies to one-mode networks; a bipartite network has no direction");
  }
  return {
    file: positionals[0],
    kind,
    directed: values.directed === true,
    format: oneOf("format", values.format, ["auto", "matrix", "edgelist"] as const) ?? "auto",
    sheet: values.sheet,
    missing: oneOf<CellMeaning>("missing", values.missing, CELL_MEANINGS),
    blank: oneOf<CellMeaning>("blank", values.blank, CELL_MEANINGS),
    restarts: intOption("restarts", values.restarts, ANALYZE_DEFAULTS.restarts, 1, 100000),
    nulls: intOption("nulls", values.nulls, ANALYZE_DEFAULTS.nulls, 0, 100000),
    nullModels: nullModelsOption(values["null-models"], values["null-model"]),
    seed: intOption("seed", values.seed, ANALYZE_DEFAULTS.seed, 0, 0xffffffff),
    annealing: oneOf<AnnealingMode>("annealing", values.annealing, ["auto", "on", "off"]) ?? ANALYZE_DEFAULTS.annealing,
    objective: oneOf<OptimizerObjective>("objective", values.objective, ["newman", "newman-directed", "barber"]),
    json: values.json === true,
  };
}

function nullModelsOption(list: string | undefined, one: string | undefined): NullModelName[] | undefined {
  if (list !== undefined && one !== undefined) throw new OptionError("give --null-models or --null-model, not both");
  const raw = list ?? one;
  if (raw === undefined) return undefined;
  const names = raw.split(",").map((x) => x.trim()).filter(Boolean);
  if (!names.length) throw new OptionError("--null-models needs at least one model");
  for (const n of names) if (!(NULL_MODELS as readonly string[]).includes(n)) throw new OptionError(`--null-model(s): unknown null model "${n}"; one of ${NULL_MODELS.join(", ")}`);
  return names as NullModelName[];
}

/** Parses the file (text or workbook), choosing the kind when it was not given (see the file header). */
async function parseWithKind(
  bytes: Uint8Array,
  opts: { file: string; kind?: NetworkKind; directed: boolean; format: "auto" | "matrix" | "edgelist"; sheet?: string; missing?: CellMeaning; blank?: CellMeaning },
): Promise<{ parsed: ParseResult; detection: string | null }> {
  const base = { fileName: opts.file, format: opts.format, sheet: opts.sheet, missing: opts.missing, blank: opts.blank };
  if (opts.kind) return { parsed: await parseNetworkFile(bytes, { ...base, kind: opts.kind, directed: opts.directed }), detection: null };
  if (opts.directed) {
    return {
      parsed: await parseNetworkFile(bytes, { ...base, kind: "unipartite", directed: true }),
      detection: "one-mode (unipartite), because --directed was given",
    };
  }
  let asBipartite: ParseResult;
  try {
    asBipartite = await parseNetworkFile(bytes, { ...base, kind: "bipartite" });
  } catch (err) {
    if (err instanceof NetworkParseError && err.code === "self-loop-bipartite") {
      return {
        parsed: await parseNetworkFile(bytes, { ...base, kind: "unipartite" }),
        detection: "one-mode (unipartite), because a link joins a node to itself",
      };
    }
    throw err;
  }
  const net = asBipartite.network;
  const rows = new Set(net.rowLabels);
  if (asBipartite.format === "matrix") {
    const square = net.rowLabels.length === net.colLabels.length && net.colLabels.every((l) => rows.has(l));
    if (!square) return { parsed: asBipartite, detection: "bipartite, because the matrix is not square with the same names on both sides" };
    return {
      parsed: await parseNetworkFile(bytes, { ...base, kind: "unipartite" }),
      detection: "one-mode (unipartite, undirected), because the matrix is square with the same names on both sides; use --directed for a food web or --kind bipartite to override",
    };
  }
  const shared = net.colLabels.some((l) => rows.has(l));
  if (!shared) return { parsed: asBipartite, detection: "bipartite (source = row node, target = column node), because no label is both a source and a target" };
  return {
    parsed: await parseNetworkFile(bytes, { ...base, kind: "unipartite" }),
    detection: "one-mode (unipartite, undirected), because some labels are both sources and targets; use --directed or --kind to override",
  };
}

/** The option that answers a question the parser asked (which sheet, what NA-like cells mean). */
function parseHint(err: NetworkParseError): string {
  if (err.code === "choose-sheet") return "  give --sheet NAME with one of the sheets named above\n";
  if (err.code === "missing-values") return "  give --missing no-interaction or --missing not-observed to say what these cells mean\n";
  return "";
}

function fmt(x: number | null | undefined, digits = 4): string {
  if (x === null || x === undefined) return "undefined";
  return Number.isInteger(x) ? String(x) : x.toFixed(digits);
}

function summary(file: string, r: AnalysisResult, detection: string | null, warnings: string[], workbook?: ParseResult["workbook"]): string {
  const lines: string[] = [];
  lines.push(`${file}`);
  if (workbook) lines.push(`  workbook: sheet "${workbook.sheet}" (of ${workbook.sheets.map((n) => `"${n}"`).join(", ")})`);
  if (detection) lines.push(`  kind: ${detection}`);
  for (const w of warnings) lines.push(`  warning: ${w}`);
  const kind = r.kind === "bipartite" ? "bipartite" : r.directed ? "one-mode, directed" : "one-mode, undirected";
  lines.push(`  network: ${kind}${r.weighted ? ", weighted" : ", binary"}`);
  lines.push(
    `  nodes ${r.nodes}` + (r.rows !== null ? ` (rows ${r.rows}, columns ${r.cols})` : "") +
      `, links ${r.links}, total weight ${fmt(r.totalWeight)}, connectance ${fmt(r.connectance)}`,
  );
  const m = r.modularity;
  lines.push(`  modularity: ${objectiveLabel(m.objective)}`);
  if (m.Q === null) lines.push(`    Q undefined: ${m.undefinedReason}`);
  else {
    const lone =
      r.isolated === 1 ? " (1 of them a single node without links)" : r.isolated > 1 ? ` (${r.isolated} of them single nodes without links)` : "";
    lines.push(`    Q = ${fmt(m.Q, 6)} with ${m.modules} ${m.modules === 1 ? "module" : "modules"} of linked nodes${lone ? ` (not counting isolated nodes${lone})` : ""}`);
    lines.push(
      `    ${m.restarts.n} restarts: min ${fmt(m.restarts.min, 6)}, median ${fmt(m.restarts.median, 6)}, max ${fmt(m.restarts.max, 6)}; ` +
        `${Math.round((m.restarts.bestShare ?? 0) * 100)} % reached the reported Q`,
    );
  }
  if (r.nulls && r.nulls.length) {
    lines.push(`  significance (${r.nulls[0].n} null networks per model, each optimized like the observed one):`);
    for (const n of r.nulls) {
      const p = n.p === null ? "—" : `${n.pAtFloor ? "≤ " : ""}${fmt(n.p, 4)}`;
      lines.push(`    ${nullModelLabel(n.model)}${n.primary ? " [primary]" : ""}${n.liberal ? " [liberal]" : ""}`);
      lines.push(`      null Q mean ${fmt(n.mean, 6)}, sd ${fmt(n.sd, 6)}; z = ${fmt(n.z, 2)} ± ${fmt(n.zSe, 2)}, Q_rel = ${fmt(n.qRel, 3)}, ΔQ = ${fmt(n.deltaQ, 6)}, p = ${p}`);
      if (n.nodf && n.nodf.mean !== null) lines.push(`      NODF of the same nulls: mean ${fmt(n.nodf.mean, 2)}, z = ${fmt(n.nodf.z, 2)}, p = ${n.nodf.pAtFloor ? "≤ " : ""}${fmt(n.nodf.p, 4)}`);
      if (n.unstable) lines.push(`      caution: ${n.unstableReason}`);
      if (n.cappedNulls > 0) lines.push(`      caution: the optimizer hit its safety cap on ${n.cappedNulls} of these null networks (not converged)`);
      if (n.liberal) lines.push(`      liberal: ${NULL_MODEL_INFO[n.model].caution}`);
    }
  } else if (r.nullSkippedReason) lines.push(`  significance: ${r.nullSkippedReason}`);
  if (r.roles) {
    const c = r.roles.counts;
    lines.push(`  node roles (z > ${r.roles.thresholds.z}, P > ${r.roles.thresholds.p}): ${c.peripheral} peripherals, ${c.connector} connectors, ${c["module-hub"]} module hubs, ${c["network-hub"]} network hubs`);
  }
  lines.push(`  NODF ${fmt(r.nodf, 2)}` + (r.nodf !== null ? ` (rows ${fmt(r.nodfRows, 2)}, columns ${fmt(r.nodfCols, 2)})` : ""));
  lines.push(`  ${r.algorithm.name}, ${r.algorithm.version}, seed ${r.algorithm.seed}; ${r.elapsedMs} ms`);
  lines.push("  What the figures control for: z, Q_rel, ΔQ and p compare Q with its null model only (the model named above);");
  lines.push("  none of them is free of size, connectance or sampling effort — z and Q_rel grow with network size for the same");
  lines.push("  process — so compare networks of similar S and C, or adjust for S and C across a selection. Modularity maxima are");
  lines.push("  degenerate (partitions of near-equal Q can differ) and have a resolution limit: small modules can merge in large networks.");
  return lines.join("\n");
}

/** Where the tool writes: the process's standard output and error, or a test's buffers. */
export interface AnalyzeIo {
  out: (text: string) => void;
  err: (text: string) => void;
}

const processIo: AnalyzeIo = { out: (t) => void process.stdout.write(t), err: (t) => void process.stderr.write(t) };

/** Runs the tool on `argv` (the arguments after the script) and returns its exit status. */
export async function main(argv: string[], io: AnalyzeIo = processIo): Promise<number> {
  let opts;
  try {
    opts = readOptions(argv);
  } catch (err) {
    if (err instanceof OptionError) {
      io.err(`analyze: ${err.message}\n${USAGE}\n`);
      return 2;
    }
    throw err;
  }
  if (opts === null) {
    io.out(`${USAGE}\n`);
    return 0;
  }
  let bytes: Uint8Array;
  try {
    bytes = readFileSync(opts.file);
  } catch (err) {
    io.err(`analyze: cannot read ${opts.file}: ${(err as Error).message}\n`);
    return 1;
  }
  let parsed: ParseResult;
  let detection: string | null;
  try {
    ({ parsed, detection } = await parseWithKind(bytes, opts));
  } catch (err) {
    if (err instanceof NetworkParseError) {
      io.err(`analyze: ${err.message}\n${parseHint(err)}`);
      return 1;
    }
    throw err;
  }
  let result: AnalysisResult;
  try {
    result = analyzeNetwork(parsed.network, {
      objective: opts.objective,
      restarts: opts.restarts,
      nulls: opts.nulls,
      nullModels: opts.nullModels,
      seed: opts.seed,
      annealing: opts.annealing,
    });
  } catch (err) {
    if (err instanceof NetworkEngineError || err instanceof RangeError) {
      io.err(`analyze: ${opts.file}: ${err.message}\n`);
      // An option the data cannot take (e.g. Patefield on an undirected network) is a usage error (2);
      // a defect of the data itself is an input error (1).
      return err instanceof NetworkEngineError && (err.code === "no-links" || err.code === "bad-network") ? 1 : 2;
    }
    throw err;
  }
  const warnings = parsed.warnings.map((w) => w.message);
  if (opts.json) {
    const out = {
      file: opts.file,
      format: parsed.format,
      ...(parsed.workbook ? { workbook: parsed.workbook } : {}),
      missing: parsed.missing,
      ...(detection ? { kindDetection: detection } : {}),
      warnings,
      ...result,
    };
    io.out(`${JSON.stringify(out)}\n`);
  } else {
    io.out(`${summary(opts.file, result, detection, warnings, parsed.workbook)}\n`);
  }
  return 0;
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  main(process.argv.slice(2)).then(
    (code) => {
      process.exitCode = code;
    },
    (err: unknown) => {
      process.stderr.write(`analyze: ${(err as Error).stack ?? String(err)}\n`);
      process.exitCode = 1;
    },
  );
}
