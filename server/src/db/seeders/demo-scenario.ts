/**
 * The invented demo scenario (demo only): the fictional Northmoor Field Station surveyed three invented
 * regions — the Verrin Hills, the Lake Osk basin and the Tallow Coast — from 2019 to 2024. Twelve datasets
 * of 1–6 bipartite networks (pollination, seed dispersal, host–parasitoid; 10 to 400 nodes) with planted
 * module structure, drawn by a seeded generator, with invented Latin-looking taxon names made from
 * syllables (clearly fictional). Deposited by the three demo depositors and decided by the two demo
 * curators THROUGH THE SAME SERVICES as the UI (create draft, upload, set metadata, submit, decide, new
 * version, withdraw), so the demo data pass the same rules. States shown: published (most, TB-000001
 * onwards), one with a version 2, one withdrawn, one resubmitted after a change request (with the
 * depositor's reply), one with changes requested (and the depositor's comment), one draft.
 * Idempotent: skipped when any dataset exists.
 */
import { createRng, type Rng } from "@shared/network/random";
import type { StudyMetadata } from "@shared/types/dataset";
import { Dataset, User } from "../../models";
import { createDeposit, updateStudyMetadata } from "../../api/deposits/deposits.service";
import { addNetworks, updateNetwork } from "../../api/deposits/deposits.networks";
import { submitDeposit } from "../../api/deposits/deposits.submission";
import { decide } from "../../api/reviews/reviews.service";
import { startNewVersion } from "../../api/datasets/datasets.versions";
import { withdrawDataset } from "../../api/datasets/datasets.withdrawal";
import { createCollection } from "../../api/collections/collections.service";
import { addComment } from "../../api/deposits/deposits.comments";
import type { Viewer } from "../../api/datasets/datasets.service";
import { demoOrcidOf } from "./demo-researchers";
import { csvText } from "@shared/csv";

const SEED = 20190501;

// ---------- invented names ----------
const ONSETS = ["br", "c", "d", "f", "g", "l", "m", "n", "p", "qu", "r", "s", "t", "v", "th", "ph", "st", "tr", "cr", "pl"];
const VOWELS = ["a", "e", "i", "o", "u", "ae", "ia", "eo"];
const PLANT_ENDINGS = ["aria", "ella", "ium", "ago", "anthus", "ostis", "ina"];
const ANIMAL_ENDINGS = ["ops", "ius", "idus", "ella", "ura", "ax", "ides"];
const EPITHETS = ["verrinensis", "oskiana", "tallowensis", "northmoorii", "minor", "palustris", "montana", "hirta", "lutea", "borealis", "fulva", "ripicola", "nigrans", "obscura", "brevis", "gracilis", "pallida", "rubens", "sylvestris", "vernalis"];

function syllable(rng: Rng): string {
  return ONSETS[rng.nextInt(ONSETS.length)] + VOWELS[rng.nextInt(VOWELS.length)];
}

function genus(rng: Rng, endings: string[]): string {
  const g = syllable(rng) + (rng.next() < 0.5 ? syllable(rng) : "") + endings[rng.nextInt(endings.length)];
  return g[0].toUpperCase() + g.slice(1);
}

/** `n` distinct binomials sharing a few genera, e.g. "Verania oskiana". */
function binomials(rng: Rng, n: number, endings: string[]): string[] {
  const genera = Array.from({ length: Math.max(2, Math.ceil(n / 4)) }, () => genus(rng, endings));
  const out = new Set<string>();
  let guard = 0;
  while (out.size < n && guard++ < n * 50) {
    const g = genera[rng.nextInt(genera.length)];
    const e = EPITHETS[rng.nextInt(EPITHETS.length)];
    out.add(out.has(`${g} ${e}`) ? `${g} ${e} ${syllable(rng)}a` : `${g} ${e}`);
  }
  return [...out];
}

// ---------- planted modules ----------
/**
 * An I × J incidence matrix with `k` planted modules: rows and columns are dealt into modules; a cell
 * inside a module is a link with probability pIn, outside with pOut. Every row and column gets at least
 * one link (inside its module). Weighted matrices hold visit counts (1 + a geometric number).
 */
function plantedMatrix(rng: Rng, I: number, J: number, k: number, pIn: number, pOut: number, weighted: boolean): number[][] {
  const rm = Array.from({ length: I }, (_, i) => i % k);
  const cm = Array.from({ length: J }, (_, j) => j % k);
  const count = () => {
    let c = 1;
    while (rng.next() < 0.55 && c < 60) c++;
    return c;
  };
  const A = Array.from({ length: I }, (_, i) => Array.from({ length: J }, (_, j) => (rng.next() < (rm[i] === cm[j] ? pIn : pOut) ? (weighted ? count() : 1) : 0)));
  for (let i = 0; i < I; i++) {
    if (A[i].every((x) => x === 0)) {
      const js = cm.map((m, j) => (m === rm[i] ? j : -1)).filter((j) => j >= 0);
      A[i][js[rng.nextInt(js.length)]] = weighted ? count() : 1;
    }
  }
  for (let j = 0; j < J; j++) {
    if (A.every((row) => row[j] === 0)) {
      const is = rm.map((m, i) => (m === cm[j] ? i : -1)).filter((i) => i >= 0);
      A[is[rng.nextInt(is.length)]][j] = weighted ? count() : 1;
    }
  }
  return A;
}

function toCsv(rows: string[], cols: string[], A: number[][], corner: string): string {
  return csvText([[corner, ...cols], ...A.map((r, i) => [rows[i], ...r.map((x) => (x === 0 ? "" : x))])]);
}

// ---------- the scenario ----------
type Kind = "pollination" | "seed-dispersal" | "host-parasitoid";
const LEVELS: Record<Kind, { rows: string; cols: string; rowEndings: string[]; colEndings: string[]; protocol: string; unit: string }> = {
  pollination: { rows: "plants", cols: "flower visitors", rowEndings: PLANT_ENDINGS, colEndings: ANIMAL_ENDINGS, protocol: "Timed 15-minute watches of flowering plants along fixed transects; every visitor touching the reproductive parts was recorded.", unit: "observation hours" },
  "seed-dispersal": { rows: "fruiting plants", cols: "frugivores", rowEndings: PLANT_ENDINGS, colEndings: ANIMAL_ENDINGS, protocol: "Focal watches of fruiting plants at dawn and dusk; a fruit removed and swallowed or carried away counted as one interaction.", unit: "observation hours" },
  "host-parasitoid": { rows: "host caterpillars", cols: "parasitoids", rowEndings: ANIMAL_ENDINGS, colEndings: ANIMAL_ENDINGS, protocol: "Caterpillars collected by beating trays and reared in the laboratory until adult moths or parasitoids emerged.", unit: "reared hosts" },
};

interface Region {
  name: string;
  country: string;
  lat: number;
  lon: number;
  habitats: string[];
  sites: string[];
}

const REGIONS: Record<string, Region> = {
  verrin: { name: "Verrin Hills", country: "GB", lat: 54.43, lon: -2.99, habitats: ["upland heath", "hay meadow", "limestone grassland"], sites: ["Crook Heath", "Askel Fell", "Marren Edge", "Holby Scar", "Thorn Moss", "Gill Banks"] },
  osk: { name: "Lake Osk basin", country: "FI", lat: 61.23, lon: 25.99, habitats: ["lakeshore meadow", "birch woodland", "raised bog margin"], sites: ["Osk North Shore", "Kallio Point", "Rasti Bay", "Venla Marsh", "Osk Narrows", "Lehto Island"] },
  tallow: { name: "Tallow Coast", country: "IE", lat: 52.11, lon: -9.87, habitats: ["coastal dune grassland", "machair", "coastal scrub"], sites: ["Tallow Strand", "Brannock Dunes", "Seal Head", "Corra Machair", "Dunmare Links", "Lough Tallow"] },
};

interface NetSpec {
  rows: number;
  cols: number;
  modules: number;
  pIn: number;
  pOut: number;
  weighted: boolean;
  year: number;
  generalisation?: "exact" | "0.01" | "0.1" | "1";
}

interface DatasetSpec {
  owner: string;
  kind: Kind;
  region: keyof typeof REGIONS;
  title: string;
  description: string;
  keywords: string[];
  nets: NetSpec[];
  outcome: "published" | "published+v2" | "withdrawn" | "submitted" | "changes_requested" | "draft";
  doi?: string;
}

const S = (rows: number, cols: number, modules: number, year: number, weighted = true, pIn = 0.45, pOut = 0.03): NetSpec => ({ rows, cols, modules, pIn, pOut, weighted, year });

const DATASETS: DatasetSpec[] = [
  { owner: "rowan.hale@northmoor.test", kind: "pollination", region: "verrin", title: "Flower visitors of upland heath in the Verrin Hills, 2019–2021", description: "Plant–flower visitor networks of three heath sites in the Verrin Hills, sampled every second week through three flowering seasons (invented demo data of the Northmoor Field Station scenario).", keywords: ["pollination", "heath", "Verrin Hills"], nets: [S(18, 32, 4, 2019), S(20, 35, 4, 2020), S(22, 38, 5, 2021)], outcome: "published", doi: "10.5555/northmoor.demo.001" },
  { owner: "ines.okafor@northmoor.test", kind: "seed-dispersal", region: "tallow", title: "Fruit-eating birds of the Tallow Coast dune scrub", description: "Seed-dispersal networks of fleshy-fruited shrubs and the birds that eat their fruit on two dune systems of the Tallow Coast (invented demo data).", keywords: ["seed dispersal", "frugivory", "dunes"], nets: [S(12, 16, 3, 2020), S(14, 18, 3, 2021)], outcome: "published" },
  { owner: "pavel.strand@northmoor.test", kind: "host-parasitoid", region: "osk", title: "Caterpillars and their parasitoids around Lake Osk", description: "Host–parasitoid networks from rearing of caterpillars beaten from birch and willow at four sites of the Lake Osk basin (invented demo data).", keywords: ["host-parasitoid", "rearing", "Lake Osk"], nets: [S(25, 15, 3, 2019, false, 0.4, 0.02), S(30, 18, 4, 2020, false, 0.4, 0.02), S(28, 16, 3, 2021, false, 0.4, 0.02), S(32, 20, 4, 2022, false, 0.4, 0.02)], outcome: "published" },
  { owner: "rowan.hale@northmoor.test", kind: "pollination", region: "verrin", title: "Hay-meadow pollination at Askel Fell", description: "One hay meadow watched over a whole season, first deposited as one network and revised with a second year in version 2 (invented demo data).", keywords: ["pollination", "hay meadow"], nets: [S(24, 40, 4, 2022)], outcome: "published+v2" },
  { owner: "ines.okafor@northmoor.test", kind: "pollination", region: "tallow", title: "Machair flower visitors along the Tallow Coast, 2019–2024", description: "Six yearly snapshots of small plant–pollinator networks on one machair transect of the Tallow Coast (invented demo data).", keywords: ["pollination", "machair", "time series"], nets: [S(5, 6, 2, 2019), S(6, 8, 2, 2020), S(7, 9, 2, 2021), S(8, 10, 3, 2022), S(9, 12, 3, 2023), S(10, 14, 3, 2024)], outcome: "published" },
  { owner: "pavel.strand@northmoor.test", kind: "pollination", region: "osk", title: "A basin-wide flower-visitor survey of the Lake Osk basin", description: "One large plant–flower visitor network pooled from eighteen lakeshore meadow plots of the Lake Osk basin (invented demo data).", keywords: ["pollination", "lakeshore meadow", "large network"], nets: [{ ...S(150, 250, 8, 2023, true, 0.12, 0.004) }], outcome: "published" },
  { owner: "rowan.hale@northmoor.test", kind: "seed-dispersal", region: "verrin", title: "Rowan and thrushes: seed dispersal at the Verrin woodland edge", description: "Seed-dispersal networks of a woodland edge in the Verrin Hills in two autumns (invented demo data).", keywords: ["seed dispersal", "woodland edge"], nets: [S(10, 12, 2, 2021), S(11, 13, 3, 2022)], outcome: "published" },
  { owner: "ines.okafor@northmoor.test", kind: "host-parasitoid", region: "tallow", title: "Leaf-miners and parasitoids of the Tallow Coast scrub", description: "Host–parasitoid network of leaf-mining larvae reared from coastal scrub (invented demo data; withdrawn in the demo scenario).", keywords: ["host-parasitoid", "leaf miners"], nets: [S(16, 12, 3, 2020, false, 0.4, 0.03)], outcome: "withdrawn" },
  { owner: "pavel.strand@northmoor.test", kind: "pollination", region: "osk", title: "Bog-margin pollinators with a sensitive orchid site", description: "Plant–pollinator networks of two raised-bog margins; one site holds a protected orchid, so its public coordinates are generalised to 0.1° (invented demo data).", keywords: ["pollination", "bog", "sensitive site"], nets: [{ ...S(26, 44, 5, 2023), generalisation: "0.1" }, S(70, 130, 6, 2024, true, 0.2, 0.01)], outcome: "published" },
  { owner: "rowan.hale@northmoor.test", kind: "pollination", region: "verrin", title: "Limestone grassland flower visitors at Marren Edge", description: "Plant–flower visitor networks from two limestone grassland slopes, awaiting a curator's review in the demo (invented demo data).", keywords: ["pollination", "limestone grassland"], nets: [S(15, 24, 3, 2024), S(16, 26, 3, 2024)], outcome: "submitted" },
  { owner: "pavel.strand@northmoor.test", kind: "seed-dispersal", region: "osk", title: "Frugivores of the Osk birch woodland", description: "Seed-dispersal network from berry-bearing shrubs under birch around Lake Osk; a curator asked for the sampling effort in the demo (invented demo data).", keywords: ["seed dispersal", "birch woodland"], nets: [S(9, 11, 2, 2023)], outcome: "changes_requested" },
  { owner: "ines.okafor@northmoor.test", kind: "pollination", region: "tallow", title: "Dune-slack pollinators (draft)", description: "A first dune-slack network being prepared (invented demo data; a draft in the demo).", keywords: ["pollination", "dune slack"], nets: [S(8, 12, 2, 2024)], outcome: "draft" },
];

function studyFor(d: DatasetSpec, owner: User): StudyMetadata {
  return {
    title: d.title,
    description: d.description,
    // made-up iDs of the ORCID stand-in's demo researchers (demo-researchers.ts)
    creators: [
      { name: owner.displayName, orcid: demoOrcidOf(owner.displayName), affiliation: owner.affiliation ?? "Northmoor Field Station" },
      { name: "Ada Quillfeather", orcid: demoOrcidOf("Ada Quillfeather"), affiliation: "Northmoor Field Station" },
    ],
    ...(d.doi ? { publication: { citation: `${owner.displayName} et al. (2024) ${d.title}. Northmoor Field Station Reports (invented) 7: 1–12.`, doi: d.doi } } : {}),
    licence: d.keywords.length % 2 ? "CC-BY-4.0" : "CC0-1.0",
    keywords: d.keywords,
    funding: "Northmoor Field Station core funding (invented)",
    contactEmail: owner.email,
  };
}

function networkMetadata(d: DatasetSpec, n: NetSpec, idx: number, rng: Rng, opts: { withEffort: boolean }): Record<string, unknown> {
  const r = REGIONS[d.region];
  const lv = LEVELS[d.kind];
  const site = r.sites[(idx + d.title.length) % r.sites.length];
  const lat = Number((r.lat + (rng.next() - 0.5) * 0.4).toFixed(5));
  const lon = Number((r.lon + (rng.next() - 0.5) * 0.6).toFixed(5));
  return {
    name: `${site}, ${n.year}`,
    interactionType: d.kind,
    weightMeaning: n.weighted ? (d.kind === "pollination" ? "visit-count" : "interaction-frequency") : "binary",
    rowLevel: lv.rows,
    colLevel: lv.cols,
    locality: { placeName: `${site}, ${r.name}`, countryCode: r.country, decimalLatitude: lat, decimalLongitude: lon, coordinatePrecision: 0.00001, elevation: 20 + rng.nextInt(600), generalisation: n.generalisation ?? "exact" },
    habitat: r.habitats[idx % r.habitats.length],
    startDate: `${n.year}-0${4 + (idx % 3)}-0${1 + (idx % 9)}`,
    endDate: `${n.year}-0${8 + (idx % 2)}-2${idx % 9}`,
    samplingProtocol: lv.protocol,
    ...(opts.withEffort ? { samplingEffort: { value: 40 + 10 * rng.nextInt(20), unit: lv.unit } } : {}),
    taxonomicResolution: "species; some insects as morphospecies",
  };
}

function fileFor(d: DatasetSpec, n: NetSpec, idx: number, rng: Rng): { name: string; bytes: Buffer } {
  const lv = LEVELS[d.kind];
  const rows = binomials(rng, n.rows, lv.rowEndings);
  const cols = binomials(rng, n.cols, lv.colEndings);
  const A = plantedMatrix(rng, rows.length, cols.length, n.modules, n.pIn, n.pOut, n.weighted);
  const slug = REGIONS[d.region].sites[(idx + d.title.length) % REGIONS[d.region].sites.length].toLowerCase().replace(/[^a-z]+/g, "-");
  return { name: `${slug}-${n.year}.csv`, bytes: Buffer.from(toCsv(rows, cols, A, lv.rows)) };
}

function viewerOf(u: User): Viewer {
  return { id: u.id, role: u.role };
}

export async function seedDemoScenario(ctx: { log: (msg: string) => void } = { log: () => undefined }): Promise<{ datasets: number; networks: number; ms: number } | null> {
  if ((await Dataset.count()) > 0) return null;
  const started = Date.now();
  const users = new Map((await User.findAll()).map((u) => [u.email, u]));
  const need = (email: string) => {
    const u = users.get(email);
    if (!u) throw new Error(`demo scenario: the demo account ${email} is missing (seed the demo accounts first)`);
    return u;
  };
  const curators = [need("curator.brand@northmoor.test"), need("curator.ilves@northmoor.test")].map(viewerOf);
  const rng = createRng(SEED);
  let networks = 0;
  const toV2: Array<{ d: DatasetSpec; accession: string; owner: User }> = [];
  const toWithdraw: string[] = [];

  for (const [di, d] of DATASETS.entries()) {
    const owner = need(d.owner);
    const who = viewerOf(owner);
    const curator = curators[di % 2];
    const dep = await createDeposit(who, studyFor(d, owner));
    const files = d.nets.map((n, i) => fileFor(d, n, i, rng));
    const up = await addNetworks(dep.versionId, who, files, { kind: "bipartite", directed: false, format: "matrix" });
    networks += up.networks.length;
    const metas: Array<Record<string, unknown>> = [];
    for (const [i, n] of up.networks.entries()) {
      const meta = networkMetadata(d, d.nets[i], i, rng, { withEffort: d.outcome !== "changes_requested" });
      if (d.outcome === "draft") delete (meta as Record<string, unknown>).samplingProtocol;
      await updateNetwork(dep.versionId, n.id, who, { metadata: meta });
      metas.push(meta);
    }
    if (d.outcome === "draft") continue;
    await submitDeposit(dep.versionId, who);
    if (d.outcome === "submitted") {
      // A resubmission waiting in the queue: the review page shows what changed and the conversation.
      await decide(dep.versionId, curator, { decision: "request_changes", comment: "The habitat of the second slope reads like the first one's; is that right? Please check it against the field sheet." });
      const last = up.networks[up.networks.length - 1];
      await updateNetwork(dep.versionId, last.id, who, { metadata: { ...metas[metas.length - 1], habitat: "species-rich limestone grassland on a south-facing slope" } });
      await submitDeposit(dep.versionId, who, "You were right: the second slope is the south-facing one. Its habitat now follows the field sheet; the counts were checked and stay as they were.");
      continue;
    }
    if (d.outcome === "changes_requested") {
      await decide(dep.versionId, curator, { decision: "request_changes", comment: "Please give the sampling effort (how many observation hours) of the network; it is needed to compare modularity across studies." });
      await addComment(dep.versionId, who, "The hours are in the field notebooks at the station; I will add them when I am back next week.", "session");
      continue;
    }
    const res = await decide(dep.versionId, curator, { decision: "publish", comment: null });
    if (d.outcome === "published+v2" && res.accession) toV2.push({ d, accession: res.accession, owner });
    if (d.outcome === "withdrawn" && res.accession) toWithdraw.push(res.accession);
  }

  // Version 2: a second year added to the hay-meadow dataset.
  for (const { d, accession, owner } of toV2) {
    const who = viewerOf(owner);
    const v2 = await startNewVersion(accession, who);
    const extra: NetSpec = S(26, 42, 4, 2023);
    const file = fileFor(d, extra, 1, rng);
    const up = await addNetworks(v2.versionId, who, [file], { kind: "bipartite", directed: false, format: "matrix" });
    networks += up.networks.length;
    await updateNetwork(v2.versionId, up.networks[0].id, who, { metadata: networkMetadata(d, extra, 1, rng, { withEffort: true }) });
    await updateStudyMetadata(v2.versionId, who, { ...studyFor(d, owner), description: `${d.description} Version 2 adds the 2023 season.` });
    await submitDeposit(v2.versionId, who);
    await decide(v2.versionId, curators[1], { decision: "publish", comment: "Thank you for the second season." });
  }
  // A public collection saved from a filter before the withdrawal below, so it keeps the withdrawn network
  // listed with its tombstone (what a paper's saved set looks like after a correction).
  const pavel = need("pavel.strand@northmoor.test");
  await createCollection(
    { id: pavel.id, email: pavel.email, displayName: pavel.displayName, role: pavel.role, emailVerified: true },
    {
      name: "Host–parasitoid webs of the Northmoor study regions",
      description: "Every host–parasitoid network published from the Lake Osk basin and the Tallow Coast, the set of a comparison of parasitoid modules across regions (invented demo data).",
      visibility: "public",
      filter: { interactionType: "host-parasitoid" },
    },
  );
  for (const accession of toWithdraw) {
    await withdrawDataset(accession, curators[0], "The depositor found that the parasitoid identifications of one rearing batch were mixed up; a corrected dataset will follow.");
  }
  const ms = Date.now() - started;
  ctx.log(`Demo scenario: ${DATASETS.length} datasets with ${networks} networks deposited and reviewed in ${ms} ms.`);
  return { datasets: DATASETS.length, networks, ms };
}

/** The startup task registered in server/src/startup.ts. */
export async function seedDemoScenarioTask(ctx: { log: (msg: string) => void }): Promise<void> {
  const r = await seedDemoScenario(ctx);
  if (!r) ctx.log("Demo scenario: datasets exist already; nothing seeded.");
}
