/**
 * Datasets as publishing and the metrics pipeline would leave them, through the one fixture builder
 * (server/src/db/seeders/published-network.ts): dataset + version (any state) + stored file + parsed network
 * + a succeeded metric run whose results are the engine's real `analyzeNetwork` output (computed here with
 * small effort) plus the null Q values.
 * The pipeline settings are set to that effort so the run is the "current" one for getCurrentMetrics.
 * Metadata is invented (demo only); network data comes from files in tests/fixtures.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { analyzeNetwork, nullReplicateStats, parseNetworkText, type NullReplicate } from "@shared/network/index";
import { resolveNullModels, type AnalysisResult } from "@shared/network/analyze";
import type { NetworkMetadata, StudyMetadata, VersionState } from "@shared/types/dataset";
import type { PipelineSettings } from "@shared/types/pipeline";
import { hashPassword } from "../../../server/src/lib/passwords";
import { AuditLog, Dataset, Network, User } from "../../../server/src/models";
import { insertNetwork, insertRun, insertVersion } from "../../../server/src/db/seeders/published-network";
import type { Role } from "../../../server/src/models/user.model";
import { setPipelineSettings, DEFAULT_PIPELINE_SETTINGS } from "../../../server/src/pipeline/settings";

export const FIXTURE_PASSWORD = "moss-and-lichen-42";
export const FIXTURE_SETTINGS: PipelineSettings = { ...DEFAULT_PIPELINE_SETTINGS, restarts: 4, nulls: 30, seed: 7 };

let userCounter = 0;
export async function fixtureUser(role: Role = "depositor", displayName?: string): Promise<User> {
  userCounter++;
  return User.create({
    email: `fixture${userCounter}-${Date.now()}@example.test`,
    displayName: displayName ?? `Fixture Person ${userCounter}`,
    passwordHash: await hashPassword(FIXTURE_PASSWORD),
    role,
    emailVerifiedAt: new Date(),
  });
}

export const DAVIS_CSV = readFileSync(join(process.cwd(), "tests", "fixtures", "davis-southern-women.csv"), "utf8");
export const KARATE_CSV = readFileSync(join(process.cwd(), "tests", "fixtures", "karate.edgelist.csv"), "utf8");

export interface FixtureNetwork {
  text: string;
  fileName?: string;
  kind?: "bipartite" | "unipartite";
  directed?: boolean;
  metadata?: Partial<NetworkMetadata>;
  /** false: no metric run; "queued": a queued run only. */
  metrics?: boolean | "queued";
}

export interface FixtureOptions {
  owner?: User;
  state?: VersionState;
  accession?: string | null;
  study?: Partial<StudyMetadata>;
  networks?: FixtureNetwork[];
  /** Version number (the dataset may already exist: pass `dataset`). */
  number?: number;
  dataset?: Dataset;
  withdrawalReason?: string;
  publishedAt?: Date;
}

export const STUDY: StudyMetadata = {
  title: "Flower visitors of the Verrin Hills meadows",
  description: "Plant–pollinator interactions observed along transects in upland meadows of the Verrin Hills, 2021 season (invented demo data).",
  creators: [
    { name: "Rowan Hale", orcid: "0000-0002-1825-0097", affiliation: "Northmoor Field Station" },
    { name: "Okafor, Inès", affiliation: "Northmoor Field Station" },
  ],
  publication: { citation: "Hale R, Okafor I (2022) Meadow modules. Journal of Invented Ecology 1:1–10.", doi: "10.5555/tb.demo.1" },
  licence: "CC-BY-4.0",
  keywords: ["pollination", "meadow", "modularity"],
  contactEmail: "rowan.hale@northmoor.test",
};

export const NETWORK_MD: NetworkMetadata = {
  name: "Upper meadow",
  interactionType: "pollination",
  weightMeaning: "binary",
  rowLevel: "plants",
  colLevel: "pollinators",
  locality: { placeName: "Verrin Hills", countryCode: "NO", decimalLatitude: 61.23456, decimalLongitude: 8.98765, elevation: 900, generalisation: "0.1" },
  habitat: "upland meadow",
  startDate: "2021-06-01",
  endDate: "2021-08-31",
  samplingProtocol: "transect walks",
  samplingEffort: { value: 120, unit: "observation hours" },
};

const analysisCache = new Map<string, { analysis: AnalysisResult; nullQs: number[]; nullQsByModel: Record<string, number[]> }>();

/**
 * The engine's analysis as the pipeline would store it: `{ analysis, nullQs, nullQsByModel }` (every null
 * model of the standard set; nullQs are the primary's). Cached per file, kind and direction.
 */
export function analysisFor(text: string, kind: "bipartite" | "unipartite" = "bipartite", directed = false, fileName = "net.csv") {
  const { network } = parseNetworkText(text, { fileName, kind, directed });
  const key = `${kind}|${directed}|${fileName}|${text}`;
  let cached = analysisCache.get(key);
  if (!cached) {
    const s = FIXTURE_SETTINGS;
    // the engine's default objective by kind (analyze.ts)
    const objective = network.kind === "bipartite" ? "barber" : network.directed ? "newman-directed" : "newman";
    const choice = resolveNullModels(network);
    const nullReplicates: Record<string, Array<NullReplicate | null>> = {};
    const nullQsByModel: Record<string, number[]> = {};
    for (const model of choice.models) {
      const reps: Array<NullReplicate | null> = [];
      for (let r = 0; r < s.nulls; r++) reps.push(nullReplicateStats(network, { model, seed: s.seed, replicate: r, restarts: s.restarts, objective, annealing: "auto" }));
      nullReplicates[model] = reps;
      nullQsByModel[model] = reps.flatMap((x) => (x ? [x.q] : []));
    }
    const analysis = analyzeNetwork(network, { restarts: s.restarts, seed: s.seed, nulls: s.nulls, nullReplicates });
    cached = { analysis, nullQs: nullQsByModel[choice.primary], nullQsByModel };
    analysisCache.set(key, cached);
  }
  return { network, ...cached };
}

let accessionCounter = 0;

export async function createFixtureDataset(opts: FixtureOptions = {}) {
  await setPipelineSettings(FIXTURE_SETTINGS);
  const owner = opts.owner ?? (await fixtureUser("depositor", "Rowan Hale"));
  const state = opts.state ?? "published";
  if (!opts.dataset) accessionCounter++;
  const { dataset, version } = await insertVersion({
    ownerId: owner.id,
    datasetId: opts.dataset?.id,
    accession: opts.accession === undefined ? `TB-${String(900000 + accessionCounter).padStart(6, "0")}` : opts.accession,
    number: opts.number,
    state,
    metadata: { ...STUDY, ...opts.study },
    publishedAt: opts.publishedAt ?? new Date("2025-03-14T10:00:00Z"),
    withdrawnAt: new Date("2025-05-01T09:00:00Z"),
    withdrawalReason: opts.withdrawalReason ?? "The depositor found duplicated transects.",
  });
  const networks: Network[] = [];
  const specs = opts.networks ?? [{ text: DAVIS_CSV, fileName: "davis.csv" }];
  for (let k = 0; k < specs.length; k++) {
    const spec = specs[k];
    const kind = spec.kind ?? "bipartite";
    const fileName = spec.fileName ?? "net.csv";
    const net = await insertNetwork({ versionId: version.id, position: k + 1, text: spec.text, fileName, kind, directed: spec.directed ?? false, metadata: { ...NETWORK_MD, ...spec.metadata } });
    networks.push(net);
    const wantMetrics = spec.metrics ?? true;
    if (wantMetrics === "queued") await insertRun({ networkId: net.id, settings: FIXTURE_SETTINGS, status: "queued" });
    else if (wantMetrics) {
      const { analysis, nullQs, nullQsByModel } = analysisFor(spec.text, kind, spec.directed ?? false, spec.fileName);
      await insertRun({ networkId: net.id, settings: FIXTURE_SETTINGS, analysis, extraResults: { nullQs, nullQsByModel }, startedAt: new Date("2025-03-14T10:01:00Z"), finishedAt: new Date("2025-03-14T10:01:05Z") });
    }
  }
  await AuditLog.create({ actorId: owner.id, action: "version.submitted", entityType: "dataset_version", entityId: String(version.id), datasetId: dataset.id, details: { number: version.number } });
  return { owner, dataset, version, networks, accession: dataset.accession! };
}
