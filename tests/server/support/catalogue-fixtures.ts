/**
 * Published datasets for catalogue, bundle and API tests, written directly through the models (the
 * publishing service has its own tests). Networks are real engine networks: a seeded random matrix with
 * the given labels, parsed by `parseNetworkText`, stored with `serializeNetwork` and `basicMetrics`.
 * Metric runs are stored under the current pipeline settings hash, as the pipeline would.
 * Invented data, for tests only.
 */
import { createHash } from "node:crypto";
import { basicMetrics, parseNetworkText, serializeNetwork } from "@shared/network/index";
import type { NetworkMetadata, StudyMetadata, VersionState } from "@shared/types/dataset";
import { sequelize } from "../../../server/src/db/sequelize";
import { DEFAULT_PIPELINE_SETTINGS, settingsHash } from "../../../server/src/pipeline/settings";
import { Dataset, DatasetVersion, MetricRun, Network, StoredFile, User } from "../../../server/src/models";
import { hashPassword } from "../../../server/src/lib/passwords";
import { storeMatrixCsvs } from "../../../server/src/api/bundles/bundles.stored-csv";
import { createRng } from "@shared/network/random";

export const CURRENT_HASH = settingsHash(DEFAULT_PIPELINE_SETTINGS);

let counter = 0;

export async function makeUser(role: "depositor" | "curator" | "admin" = "depositor", password = "correct horse battery"): Promise<User> {
  counter++;
  return User.create({
    email: `cat-user${counter}-${Date.now()}@example.test`,
    passwordHash: await hashPassword(password),
    displayName: `Catalogue user ${counter}`,
    role,
    emailVerifiedAt: new Date(),
  });
}

export interface FixtureMetrics {
  q: number;
  z?: number | null;
  qRel?: number | null;
  p?: number | null;
  modules?: number;
  nullMean?: number | null;
  nullSd?: number | null;
  nodf?: number | null;
  settingsHash?: string;
}

export interface FixtureNetwork {
  meta?: Partial<NetworkMetadata>;
  rows?: number;
  cols?: number;
  density?: number;
  seed?: number;
  kind?: "bipartite" | "unipartite";
  weighted?: boolean;
  rowLabels?: string[];
  colLabels?: string[];
  metrics?: FixtureMetrics | null;
}

/** Uniform numbers in [0, 1) from the engine's seeded generator (shared/network/random.ts). */
function rng(seed: number): () => number {
  const g = createRng(seed);
  return () => g.next();
}

/** A seeded random matrix CSV with every row linked (bipartite: rows × cols; unipartite: square). */
export function fixtureCsv(n: FixtureNetwork): string {
  const I = n.rows ?? 4;
  const J = n.kind === "unipartite" ? I : (n.cols ?? 5);
  const rowLabels = n.rowLabels ?? Array.from({ length: I }, (_, i) => `plant_${i + 1}`);
  const colLabels = n.kind === "unipartite" ? rowLabels : (n.colLabels ?? Array.from({ length: J }, (_, j) => `visitor_${j + 1}`));
  const r = rng(n.seed ?? 7);
  const p = n.density ?? 0.4;
  const lines = [["", ...colLabels].join(",")];
  for (let i = 0; i < I; i++) {
    const cells = Array.from({ length: J }, (_, j) => (r() < p || j === (i + 1) % J ? (n.weighted ? 1 + Math.floor(r() * 9) : 1) : 0));
    if (n.kind === "unipartite") cells[i] = 0;
    lines.push([rowLabels[i], ...cells].join(","));
  }
  return lines.join("\n") + "\n";
}

export const baseNetworkMeta = (over: Partial<NetworkMetadata> = {}): NetworkMetadata => ({
  name: "Meadow transect",
  interactionType: "pollination",
  weightMeaning: "binary",
  rowLevel: "plants",
  colLevel: "pollinators",
  locality: { placeName: "Verrin Hills", countryCode: "NO", decimalLatitude: 60.12345, decimalLongitude: 10.98765, generalisation: "0.1" },
  habitat: "meadow",
  startDate: "2020-05-01",
  endDate: "2020-08-31",
  samplingProtocol: "transect walks",
  samplingEffort: { value: 40, unit: "observation hours" },
  ...over,
});

export const baseStudy = (over: Partial<StudyMetadata> = {}): StudyMetadata => ({
  title: "Flower visitors of upland meadows",
  description: "Plant–pollinator networks from invented transects.",
  creators: [{ name: "Rowan Hale", affiliation: "Northmoor Field Station" }],
  licence: "CC-BY-4.0",
  keywords: ["pollination", "meadow"],
  contactEmail: "rowan.hale@northmoor.test",
  ...over,
});

export interface PublishedFixture {
  datasetId: number;
  accession: string;
  versionId: number;
  version: number;
  networkIds: number[];
}

/** Creates a dataset version (published by default) with the given networks and their metric runs. */
export async function publishDataset(opts: {
  study?: Partial<StudyMetadata>;
  networks: FixtureNetwork[];
  state?: VersionState;
  owner?: User;
  /** Add a version to this dataset instead of creating a new dataset. */
  dataset?: { id: number; accession: string };
  number?: number;
  /** Store the networks' matrix CSVs as publishing does (default true for published and withdrawn). */
  storeMatrixCsvs?: boolean;
}): Promise<PublishedFixture> {
  const owner = opts.owner ?? (await makeUser());
  let datasetId: number;
  let accession: string;
  if (opts.dataset) {
    datasetId = opts.dataset.id;
    accession = opts.dataset.accession;
  } else {
    const [[row]] = (await sequelize().query(`SELECT nextval('accession_seq') AS n`)) as [[{ n: string }], unknown];
    accession = `TB-${String(row.n).padStart(6, "0")}`;
    const ds = await Dataset.create({ ownerId: owner.id, accession });
    datasetId = ds.id;
  }
  const state = opts.state ?? "published";
  const number = opts.number ?? 1;
  const v = await DatasetVersion.create({
    datasetId,
    number,
    state,
    metadata: baseStudy(opts.study) as unknown as Record<string, unknown>,
    publishedAt: state === "published" || state === "withdrawn" ? new Date() : null,
    withdrawnAt: state === "withdrawn" ? new Date() : null,
    withdrawalReason: state === "withdrawn" ? "Test withdrawal" : null,
  });
  const networkIds: number[] = [];
  for (let i = 0; i < opts.networks.length; i++) {
    const spec = opts.networks[i];
    const csv = fixtureCsv(spec);
    const bytes = Buffer.from(csv);
    const sha256 = createHash("sha256").update(bytes).update(`${datasetId}/${number}/${i}/${Math.random()}`).digest("hex");
    const file = await StoredFile.create({ sha256, size: bytes.length, bytes });
    const kind = spec.kind ?? "bipartite";
    const { network } = parseNetworkText(csv, { fileName: `n${i + 1}.csv`, kind, directed: kind === "unipartite" });
    const b = basicMetrics(network);
    const n = await Network.create({
      versionId: v.id,
      position: i + 1,
      fileId: file.id,
      originalName: `n${i + 1}.csv`,
      format: "matrix",
      kind,
      directed: network.directed,
      weighted: network.weighted,
      metadata: baseNetworkMeta(spec.meta) as unknown as Record<string, unknown>,
      canonical: serializeNetwork(network),
      nNodes: b.nodes,
      nRows: b.rows,
      nCols: b.cols,
      nLinks: b.links,
      totalWeight: b.totalWeight,
      connectance: b.connectance,
    });
    networkIds.push(n.id);
    if (spec.metrics) await addRun(n.id, spec.metrics);
  }
  // as publishing does: the matrix CSVs bundles copy (bundles.stored-csv.ts)
  if ((state === "published" || state === "withdrawn") && opts.storeMatrixCsvs !== false) await storeMatrixCsvs(networkIds);
  return { datasetId, accession, versionId: v.id, version: number, networkIds };
}

/**
 * A succeeded run with headline figures; its significance figures are stored as the primary null model's
 * (curveball, fixed degrees) in metric_run_nulls, as the pipeline stores them.
 */
export async function addRun(networkId: number, m: FixtureMetrics): Promise<MetricRun> {
  const run = await MetricRun.create({
    networkId,
    settings: { ...DEFAULT_PIPELINE_SETTINGS },
    settingsHash: m.settingsHash ?? CURRENT_HASH,
    status: "succeeded",
    algorithmName: "leiden+annealing",
    algorithmVersion: "tanglebank-engine 1.0.0",
    seed: 1,
    startedAt: new Date(),
    finishedAt: new Date(),
    durationMs: 12,
    results: { analysis: { null: { model: "curveball", n: 100 } } },
    nullModel: "curveball",
    objective: "barber",
    q: m.q,
    modules: m.modules ?? 3,
    nullMean: m.nullMean ?? 0.2,
    nullSd: m.nullSd ?? 0.05,
    z: m.z ?? null,
    qRel: m.qRel ?? null,
    p: m.p ?? null,
    nodf: m.nodf ?? null,
  });
  await MetricRun.sequelize!.query(
    `INSERT INTO metric_run_nulls (run_id, model, is_primary, n, mean, sd, z, q_rel, delta_q, p, p_at_floor)
     VALUES (:runId, 'curveball', true, 100, :mean, :sd, :z, :qRel, :deltaQ, :p, :floor)`,
    {
      replacements: {
        runId: run.id,
        mean: m.nullMean ?? 0.2,
        sd: m.nullSd ?? 0.05,
        z: m.z ?? null,
        qRel: m.qRel ?? null,
        deltaQ: m.q === null || m.q === undefined ? null : m.q - (m.nullMean ?? 0.2),
        p: m.p ?? null,
        floor: m.p !== null && m.p !== undefined && Math.abs(m.p - 1 / 101) < 1e-12,
      },
    },
  );
  return run;
}
