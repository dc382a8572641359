/**
 * The one fixture builder for tests and benchmarks: a dataset version, its networks and their metric runs
 * inserted straight through the models, as publishing and the metrics pipeline leave them (the publishing
 * service and the pipeline have tests of their own). Networks are parsed by the engine from their file's
 * text and stored with `serializeNetwork` and `basicMetrics`; a run's significance figures go to
 * metric_run_nulls as the worker writes them. Never used by the product's own paths.
 */
import { createHash } from "node:crypto";
import { basicMetrics, parseNetworkText, serializeNetwork, type Network as EngineNetwork } from "@shared/network/index";
import type { AnalysisResult } from "@shared/network/analyze";
import type { VersionState } from "@shared/types/dataset";
import { writeNullFigures } from "../../pipeline/null-figures";
import { settingsHash } from "../../pipeline/settings";
import { Dataset, DatasetVersion, MetricRun, Network, StoredFile } from "../../models";
import { sequelize } from "../sequelize";

export interface FixtureVersionSpec {
  ownerId: number;
  /** Adds the version to this dataset; otherwise a new dataset is made with `accession`. */
  datasetId?: number;
  /** The new dataset's accession: a string, null (a deposit never published), or "next" (the accession sequence). */
  accession?: string | null | "next";
  number?: number;
  state?: VersionState;
  metadata: object;
  /** When published (default now; set for published and withdrawn versions only). */
  publishedAt?: Date;
  submittedAt?: Date | null;
  withdrawnAt?: Date;
  withdrawalReason?: string;
}

/** A dataset version (a new dataset unless `datasetId` is given); published by default. */
export async function insertVersion(spec: FixtureVersionSpec): Promise<{ dataset: Dataset; version: DatasetVersion; accession: string | null }> {
  let dataset: Dataset;
  if (spec.datasetId !== undefined) dataset = (await Dataset.findByPk(spec.datasetId, { rejectOnEmpty: true })) as Dataset;
  else {
    let accession = spec.accession === undefined ? "next" : spec.accession;
    if (accession === "next") {
      const [[row]] = (await sequelize().query(`SELECT nextval('accession_seq') AS n`)) as [[{ n: string }], unknown];
      accession = `TB-${String(row.n).padStart(6, "0")}`;
    }
    dataset = await Dataset.create({ ownerId: spec.ownerId, accession });
  }
  const state = spec.state ?? "published";
  const released = state === "published" || state === "withdrawn";
  const version = await DatasetVersion.create({
    datasetId: dataset.id,
    number: spec.number ?? 1,
    state,
    metadata: spec.metadata as Record<string, unknown>,
    publishedAt: released ? (spec.publishedAt ?? new Date()) : null,
    ...(spec.submittedAt !== undefined ? { submittedAt: spec.submittedAt } : {}),
    withdrawnAt: state === "withdrawn" ? (spec.withdrawnAt ?? new Date()) : null,
    withdrawalReason: state === "withdrawn" ? (spec.withdrawalReason ?? "Withdrawn for a test.") : null,
  });
  return { dataset, version, accession: dataset.accession };
}

export interface FixtureNetworkSpec {
  versionId: number;
  position: number;
  /** The uploaded file's text (stored as the original file and parsed by the engine). */
  text: string;
  fileName?: string;
  kind?: "bipartite" | "unipartite";
  directed?: boolean;
  metadata: object;
  /** The engine's reading of `text` when the caller has it already (large benchmark networks). */
  parsed?: { network: EngineNetwork; format: string };
  /** A stored file of its own even when another one holds the same bytes (default: same bytes, one file, as uploads share them). */
  ownFile?: boolean;
  /** Stored instead of the serialized network (tests of a damaged stored form). */
  canonical?: unknown;
}

/** A network of a version with its stored file, as depositing leaves it. */
export async function insertNetwork(spec: FixtureNetworkSpec): Promise<Network> {
  const fileName = spec.fileName ?? `n${spec.position}.csv`;
  const kind = spec.kind ?? "bipartite";
  const bytes = Buffer.from(spec.text, "utf8");
  const hash = createHash("sha256").update(bytes);
  if (spec.ownFile) hash.update(`${spec.versionId}/${spec.position}/${Math.random()}`);
  const sha256 = hash.digest("hex");
  const file = (!spec.ownFile && (await StoredFile.findOne({ where: { sha256 } }))) || (await StoredFile.create({ sha256, size: bytes.length, bytes }));
  const { network, format } = spec.parsed ?? parseNetworkText(spec.text, { fileName, kind, directed: spec.directed ?? false });
  const b = basicMetrics(network);
  return Network.create({
    versionId: spec.versionId,
    position: spec.position,
    fileId: file.id,
    originalName: fileName,
    format: format === "edgelist" ? "edgelist" : "matrix",
    kind,
    directed: network.directed,
    weighted: network.weighted,
    metadata: spec.metadata as Record<string, unknown>,
    canonical: spec.canonical ?? serializeNetwork(network),
    nNodes: b.nodes,
    nRows: b.rows,
    nCols: b.cols,
    nLinks: b.links,
    totalWeight: b.totalWeight,
    connectance: b.connectance,
  });
}

/** Headline figures of a run given directly (no analysis), stored as the primary null model's (curveball). */
export interface FixtureFigures {
  q: number;
  z?: number | null;
  qRel?: number | null;
  p?: number | null;
  modules?: number;
  nullMean?: number | null;
  nullSd?: number | null;
  nodf?: number | null;
}

export interface FixtureRunSpec {
  networkId: number;
  settings: object;
  /** Default: the hash of `settings` (the run is current while the pipeline has these settings). */
  settingsHash?: string;
  status?: "succeeded" | "queued";
  /** The engine's analysis: the run's figures, partition and every null model's significance come from it. */
  analysis?: AnalysisResult;
  /** Stored beside the analysis in the run's results (null Q values and the like). */
  extraResults?: Record<string, unknown>;
  /** Or figures alone, without an analysis. */
  figures?: FixtureFigures;
  startedAt?: Date;
  finishedAt?: Date;
}

/** A metric run of a network: queued, or succeeded with the figures the worker would store. */
export async function insertRun(spec: FixtureRunSpec): Promise<MetricRun> {
  const common = { networkId: spec.networkId, settings: spec.settings as Record<string, unknown>, settingsHash: spec.settingsHash ?? settingsHash(spec.settings as Parameters<typeof settingsHash>[0]) };
  if (spec.status === "queued") return MetricRun.create({ ...common, status: "queued" });
  const a = spec.analysis;
  const f = spec.figures;
  if (!a && !f) throw new Error("insertRun: a succeeded run needs an analysis or figures");
  const when = { startedAt: spec.startedAt ?? new Date(), finishedAt: spec.finishedAt ?? new Date() };
  if (a) {
    const run = await MetricRun.create({
      ...common,
      ...when,
      status: "succeeded",
      algorithmName: a.algorithm.name,
      algorithmVersion: a.algorithm.version,
      seed: a.algorithm.seed,
      durationMs: a.elapsedMs,
      results: { phase: "complete", analysis: a, ...spec.extraResults } as unknown as Record<string, unknown>,
      nullModel: a.null?.model ?? null,
      objective: a.modularity.objective,
      q: a.modularity.Q,
      modules: a.modularity.modules,
      nullMean: a.null?.mean ?? null,
      nullSd: a.null?.sd ?? null,
      z: a.null?.z ?? null,
      qRel: a.null?.qRel ?? null,
      p: a.null?.p ?? null,
      nodf: a.nodf,
    });
    await writeNullFigures(run.id, a);
    return run;
  }
  const m = f!;
  const mean = m.nullMean ?? 0.2;
  const sd = m.nullSd ?? 0.05;
  const run = await MetricRun.create({
    ...common,
    ...when,
    status: "succeeded",
    algorithmName: "leiden+annealing",
    algorithmVersion: "tanglebank-engine 1.0.0",
    seed: 1,
    durationMs: 12,
    results: { analysis: { null: { model: "curveball", n: 100 } }, ...spec.extraResults },
    nullModel: "curveball",
    objective: "barber",
    q: m.q,
    modules: m.modules ?? 3,
    nullMean: mean,
    nullSd: sd,
    z: m.z ?? null,
    qRel: m.qRel ?? null,
    p: m.p ?? null,
    nodf: m.nodf ?? null,
  });
  await sequelize().query(
    `INSERT INTO metric_run_nulls (run_id, model, is_primary, n, mean, sd, z, q_rel, delta_q, p, p_at_floor)
     VALUES (:runId, 'curveball', true, 100, :mean, :sd, :z, :qRel, :deltaQ, :p, :floor)`,
    {
      replacements: {
        runId: run.id,
        mean,
        sd,
        z: m.z ?? null,
        qRel: m.qRel ?? null,
        deltaQ: m.q === null || m.q === undefined ? null : m.q - mean,
        p: m.p ?? null,
        floor: m.p !== null && m.p !== undefined && Math.abs(m.p - 1 / 101) < 1e-12,
      },
    },
  );
  return run;
}
