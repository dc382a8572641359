/**
 * Published datasets for catalogue, bundle and API tests, written through the one fixture builder
 * (server/src/db/seeders/published-network.ts; the publishing service has its own tests). Networks are real engine networks: a seeded random matrix with
 * the given labels, parsed by `parseNetworkText`, stored with `serializeNetwork` and `basicMetrics`.
 * Metric runs are stored under the current pipeline settings hash, as the pipeline would.
 * Invented data, for tests only.
 */
import type { NetworkMetadata, StudyMetadata, VersionState } from "@shared/types/dataset";
import { DEFAULT_PIPELINE_SETTINGS, settingsHash } from "../../../server/src/pipeline/settings";
import { MetricRun, User } from "../../../server/src/models";
import { insertNetwork, insertRun, insertVersion, type FixtureFigures } from "../../../server/src/db/seeders/published-network";
import { hashPassword } from "../../../server/src/lib/passwords";
import { storeMatrixCsvs } from "../../../server/src/api/bundles/bundles.stored-csv";
import { createRng } from "@shared/network/random";
import { csvText } from "@shared/csv";

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

export interface FixtureMetrics extends FixtureFigures {
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
  const lines: unknown[][] = [["", ...colLabels]];
  for (let i = 0; i < I; i++) {
    const cells = Array.from({ length: J }, (_, j) => (r() < p || j === (i + 1) % J ? (n.weighted ? 1 + Math.floor(r() * 9) : 1) : 0));
    if (n.kind === "unipartite") cells[i] = 0;
    lines.push([rowLabels[i], ...cells]);
  }
  return csvText(lines);
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
  const state = opts.state ?? "published";
  const number = opts.number ?? 1;
  const { dataset, version } = await insertVersion({ ownerId: owner.id, datasetId: opts.dataset?.id, accession: "next", number, state, metadata: baseStudy(opts.study), withdrawalReason: "Test withdrawal" });
  const networkIds: number[] = [];
  for (let i = 0; i < opts.networks.length; i++) {
    const spec = opts.networks[i];
    const kind = spec.kind ?? "bipartite";
    const n = await insertNetwork({ versionId: version.id, position: i + 1, text: fixtureCsv(spec), kind, directed: kind === "unipartite", metadata: baseNetworkMeta(spec.meta), ownFile: true });
    networkIds.push(n.id);
    if (spec.metrics) await addRun(n.id, spec.metrics);
  }
  // as publishing does: the matrix CSVs bundles copy (bundles.stored-csv.ts)
  if ((state === "published" || state === "withdrawn") && opts.storeMatrixCsvs !== false) await storeMatrixCsvs(networkIds);
  return { datasetId: dataset.id, accession: dataset.accession!, versionId: version.id, version: number, networkIds };
}

/**
 * A succeeded run with headline figures; its significance figures are stored as the primary null model's
 * (curveball, fixed degrees) in metric_run_nulls, as the pipeline stores them.
 */
export async function addRun(networkId: number, m: FixtureMetrics): Promise<MetricRun> {
  const { settingsHash: hash, ...figures } = m;
  return insertRun({ networkId, settings: { ...DEFAULT_PIPELINE_SETTINGS }, settingsHash: hash ?? CURRENT_HASH, figures });
}
