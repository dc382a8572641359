/**
 * The tables of a bundle: metrics.csv and networks.csv (one row per network, their columns below), the
 * chosen part tables (bundles.parts.ts), and the temporary files they are gathered in while the networks
 * stream past, together with the datapackage resources of the networks. At the end of the bundle the
 * files become zip entries (metrics.csv, networks.csv, the part tables; resources.jsonl goes into
 * datapackage.json, bundles.datapackage.ts).
 */
import { createReadStream } from "node:fs";
import { open, type FileHandle } from "node:fs/promises";
import { join } from "node:path";
import type { Readable } from "node:stream";
import { NULL_MODEL_INFO, NULL_MODELS, type NullModelName } from "@shared/network/null-models/index";
import type { CatalogueEntry } from "../catalogue/catalogue.rows";
import { fileNameOf } from "./bundles.selection";
import { PART_TABLES, REF_FIELD as REF_COLUMN, type BundlePart, type FieldType } from "./bundles.parts";

/** A column of metrics.csv or networks.csv: name, Table Schema type, description, and its value for a network. */
export type EntryField = [name: string, type: FieldType, description: string, value: (e: CatalogueEntry) => unknown];

const REF_FIELD: EntryField = [...REF_COLUMN, (e) => e.ref];

/**
 * One explicit column set per null model (metrics.csv never mixes models in a column): the model name
 * with "-" as "_" before each figure, e.g. curveball_z, totals_connectance_p. Empty when the network's
 * run did not compute that model (it is not in its kind's standard set, or metrics are pending).
 */
function nullModelColumns(model: NullModelName): EntryField[] {
  const prefix = model.replaceAll("-", "_");
  const info = NULL_MODEL_INFO[model];
  const of = (e: CatalogueEntry) => e.nulls[model];
  const what = `null model ${model} (${info.title}; keeps ${info.keeps})`;
  return [
    [`${prefix}_n`, "integer", `Null replicates of the ${what}`, (e) => of(e)?.n],
    [`${prefix}_mean`, "number", `Mean Q of the ${model} null replicates`, (e) => of(e)?.mean],
    [`${prefix}_sd`, "number", `Standard deviation (n − 1) of Q of the ${model} null replicates`, (e) => of(e)?.sd],
    [`${prefix}_z`, "number", `z = (Q − null mean) / null sd against the ${model} null model`, (e) => of(e)?.z],
    [`${prefix}_z_se`, "number", `Monte Carlo standard error of ${prefix}_z: sqrt(1/n + z²/(2(n − 1)))`, (e) => of(e)?.zSe],
    [`${prefix}_Q_rel`, "number", `Q_rel = (Q − null mean) / null mean against the ${model} null model`, (e) => of(e)?.qRel],
    [`${prefix}_delta_Q`, "number", `ΔQ = Q − null mean against the ${model} null model`, (e) => of(e)?.deltaQ],
    [`${prefix}_p`, "number", `p = (1 + #{Q_null ≥ Q}) / (n + 1) against the ${model} null model`, (e) => of(e)?.p],
    [`${prefix}_p_at_floor`, "boolean", `true when no ${model} null reached Q: ${prefix}_p is the floor 1/(n + 1), read it as "p ≤"`, (e) => of(e)?.pAtFloor],
  ];
}

export const METRICS_FIELDS: EntryField[] = [
  REF_FIELD,
  ["accession", "string", "Dataset accession", (e) => e.accession],
  ["version", "integer", "Dataset version number", (e) => e.version],
  ["network", "integer", "Network number within the version", (e) => e.position],
  ["kind", "string", "bipartite or unipartite (directed or not)", (e) => (e.kind === "unipartite" ? (e.directed ? "unipartite-directed" : "unipartite") : "bipartite")],
  ["S", "integer", "Number of nodes", (e) => e.nNodes],
  ["I", "integer", "Row nodes of a bipartite network (what they are: networks.csv, row_nodes)", (e) => e.nRows],
  ["J", "integer", "Column nodes of a bipartite network (what they are: networks.csv, column_nodes)", (e) => e.nCols],
  ["L", "integer", "Number of links (non-zero cells; an undirected link once)", (e) => e.nLinks],
  ["C", "number", "Connectance", (e) => e.connectance],
  ["Q", "number", "Optimised modularity of the best partition found", (e) => e.q],
  ["modules", "integer", "Number of modules in the best partition", (e) => e.modules],
  ["objective", "string", "Modularity objective (newman, newman-directed, barber)", (e) => e.objective],
  ["primary_null_model", "string", "The primary null model of the network's kind (fixed degrees, curveball); its columns are the first to read", (e) => e.primaryNull],
  ...NULL_MODELS.flatMap((m) => nullModelColumns(m)),
  ["NODF", "number", "Nestedness (NODF, 0–100)", (e) => e.nodf],
  ["algorithm", "string", "Algorithm name and version", (e) => (e.algorithmName ? `${e.algorithmName} ${e.algorithmVersion ?? ""}`.trim() : null)],
  ["seed", "integer", "Random seed of the run", (e) => e.seed],
  ["settings_hash", "string", "Pipeline settings hash of the run", (e) => e.settingsHash],
  ["settings_current", "boolean", "true when the run used the current pipeline settings; false: the last successful run of older settings (a newer run failed or is pending)", (e) => (e.runId ? e.currentSettings : null)],
];

export const NETWORK_FIELDS: EntryField[] = [
  REF_FIELD,
  ["accession", "string", "Dataset accession", (e) => e.accession],
  ["version", "integer", "Dataset version number", (e) => e.version],
  ["network", "integer", "Network number within the version", (e) => e.position],
  ["file", "string", "Path of the network's CSV in this bundle", (e) => fileNameOf(e.ref)],
  ["name", "string", "Network name", (e) => e.name],
  ["title", "string", "Dataset title", (e) => e.title],
  ["licence", "string", "Licence (SPDX identifier)", (e) => e.licence],
  ["interaction_type", "string", "Interaction type", (e) => e.interactionType],
  ["kind", "string", "bipartite or unipartite", (e) => e.kind],
  ["directed", "boolean", "Directed links", (e) => e.directed],
  ["weighted", "boolean", "Weighted links", (e) => e.weighted],
  ["weight_meaning", "string", "What the weights mean", (e) => e.weightMeaning],
  ["row_nodes", "string", "Bipartite: what the row nodes of the matrix are (e.g. plants)", (e) => e.rowLevel],
  ["column_nodes", "string", "Bipartite: what the column nodes of the matrix are (e.g. pollinators)", (e) => e.colLevel],
  ["habitat", "string", "Habitat", (e) => e.habitat],
  ["country_code", "string", "Country (ISO 3166-1 alpha-2)", (e) => e.countryCode],
  ["locality", "string", "Place name", (e) => e.placeName],
  ["decimal_latitude", "number", "Latitude (WGS84), generalised to the locality's public grid", (e) => e.latitude],
  ["decimal_longitude", "number", "Longitude (WGS84), generalised to the locality's public grid", (e) => e.longitude],
  ["coordinate_generalisation", "string", "Grid the public coordinates were rounded to (degrees) or exact", (e) => e.generalisation],
  ["elevation", "number", "Elevation (m), rounded with the coordinates on generalised sites (50, 100 or 500 m for the 0.01, 0.1 and 1 degree grids)", (e) => e.elevation],
  ["start_date", "date", "First day of sampling", (e) => e.startDate],
  ["end_date", "date", "Last day of sampling", (e) => e.endDate],
  ["sampling_protocol", "string", "Sampling protocol", (e) => e.samplingProtocol],
  ["sampling_effort", "number", "Sampling effort", (e) => e.samplingEffortValue],
  ["sampling_effort_unit", "string", "Unit of the sampling effort", (e) => e.samplingEffortUnit],
  ["taxonomic_resolution", "string", "Taxonomic resolution", (e) => e.taxonomicResolution],
  ["not_recorded", "string", "Fields the depositor marked not recorded, with the reason (their columns are empty; never a made-up value)", (e) => e.notRecordedText || null],
];

/** The part tables a bundle holds (partitions.csv, roles.csv, null_distribution.csv, edges.csv), in a fixed order. */
export type PartTable = keyof typeof PART_TABLES;

const RESOURCES_FILE = "resources.jsonl";

/**
 * The temporary files of one bundle, in `dir`: resources.jsonl (the networks' datapackage resources, one
 * JSON object a line after the first, comma-separated), metrics.csv, networks.csv and one file per chosen
 * part table. A batch's lines are gathered with `resource`, `metrics`, … and written with `flush`.
 */
export class TableFiles {
  /** The chosen part tables, in PART_TABLES order. */
  readonly partTables: PartTable[];
  /** True once a network's resource has been written (datapackage.json puts a comma after the tables). */
  hasResources = false;
  private resourceLines: string[] = [];
  private metricLines: string[] = [];
  private networkLines: string[] = [];
  private partLines: Map<PartTable, string[]>;

  private constructor(
    private readonly dir: string,
    partTables: PartTable[],
    private readonly resources: FileHandle,
    private readonly metricsOut: FileHandle,
    private readonly networksOut: FileHandle,
    private readonly partOut: Map<PartTable, FileHandle>,
  ) {
    this.partTables = partTables;
    this.partLines = new Map(partTables.map((k) => [k, []]));
  }

  /** Opens the files of the tables every bundle has and of the chosen parts' tables. */
  static async open(dir: string, parts: ReadonlySet<BundlePart>): Promise<TableFiles> {
    const [resources, metricsOut, networksOut] = await Promise.all([open(join(dir, RESOURCES_FILE), "w"), open(join(dir, "metrics.csv"), "w"), open(join(dir, "networks.csv"), "w")]);
    // one temporary file per chosen table part (partitions.csv, roles.csv, null_distribution.csv, edges.csv)
    const partTables = (Object.keys(PART_TABLES) as PartTable[]).filter((k) => parts.has(k));
    const partOut = new Map(await Promise.all(partTables.map(async (k) => [k, await open(join(dir, PART_TABLES[k].path), "w")] as const)));
    return new TableFiles(dir, partTables, resources, metricsOut, networksOut, partOut);
  }

  /** The CSV header lines. */
  async writeHeaders(): Promise<void> {
    await Promise.all([
      this.metricsOut.write(METRICS_FIELDS.map((f) => f[0]).join(",") + "\n"),
      this.networksOut.write(NETWORK_FIELDS.map((f) => f[0]).join(",") + "\n"),
      ...this.partTables.map((k) => this.partOut.get(k)!.write(PART_TABLES[k].fields.map((f) => f[0]).join(",") + "\n")),
    ]);
  }

  /** A datapackage resource (JSON text) for resources.jsonl. */
  resource(json: string): void {
    this.resourceLines.push((this.hasResources ? ",\n" : "") + "    " + json);
    this.hasResources = true;
  }

  /** A network's rows of metrics.csv and networks.csv. */
  entryRows(metricsLine: string, networkLine: string): void {
    this.metricLines.push(metricsLine);
    this.networkLines.push(networkLine);
  }

  /** Rows of a chosen part table. */
  partRows(table: PartTable, lines: string[]): void {
    this.partLines.get(table)!.push(...lines);
  }

  /** Writes the lines gathered since the last flush. */
  async flush(): Promise<void> {
    if (this.resourceLines.length) {
      await this.resources.write(this.resourceLines.join(""));
      await this.metricsOut.write(this.metricLines.join("\n") + "\n");
      await this.networksOut.write(this.networkLines.join("\n") + "\n");
    }
    for (const [k, lines] of this.partLines) if (lines.length) await this.partOut.get(k)!.write(lines.join("\n") + "\n");
    this.resourceLines = [];
    this.metricLines = [];
    this.networkLines = [];
    this.partLines = new Map(this.partTables.map((k) => [k, []]));
  }

  close(): Promise<unknown> {
    return Promise.all([this.resources.close(), this.metricsOut.close(), this.networksOut.close(), ...[...this.partOut.values()].map((f) => f.close())]);
  }

  /** The finished tables as zip entries: [content, name in the zip], metrics.csv first. */
  entries(): Array<[Readable, string]> {
    return [
      [createReadStream(join(this.dir, "metrics.csv")), "metrics.csv"],
      [createReadStream(join(this.dir, "networks.csv")), "networks.csv"],
      ...this.partTables.map((k): [Readable, string] => [createReadStream(join(this.dir, PART_TABLES[k].path)), PART_TABLES[k].path]),
    ];
  }

  /** The networks' datapackage resources, as written. */
  resourcesStream(): Readable {
    return createReadStream(join(this.dir, RESOURCES_FILE));
  }
}
