/**
 * datapackage.json of a bundle (Frictionless Data Package, profile tabular-data-package): the package's
 * head, a resource per table (metrics.csv, networks.csv, the chosen part tables) with its Table Schema,
 * and a resource per network CSV (its fields read from the CSV's header) and per original file. The
 * networks' resources are written to a temporary file as the networks stream past (bundles.tables.ts)
 * and copied into datapackage.json at the end, so the package is never held whole.
 */
import { QueryTypes } from "sequelize";
import { doiUrl, licenceUrl } from "@shared/citation";
import { sequelize } from "../../db/sequelize";
import type { CatalogueEntry } from "../catalogue/catalogue.rows";
import { csvHeaderLabels } from "../../lib/matrix-csv";
import type { SelectedNetwork } from "./bundles.selection";
import { MEDIATYPES, PART_TABLES, type TableField } from "./bundles.parts";
import { METRICS_FIELDS, NETWORK_FIELDS, type PartTable } from "./bundles.tables";

const licenseObj = (l: string) => ({ name: l, path: licenceUrl(l), title: l === "CC0-1.0" ? "CC0 1.0 Universal" : l === "CC-BY-4.0" ? "Creative Commons Attribution 4.0" : l });

function tableSchema(fields: Array<[string, string, string, unknown]>) {
  return { fields: fields.map(([name, type, description]) => ({ name, type, description })), missingValues: [""] };
}

/** Table Schema of a part's table: its fields, and network_ref pointing at metrics.csv. */
function partSchema(fields: TableField[]) {
  return { ...tableSchema(fields.map((f) => [...f, null])), foreignKeys: [{ fields: "network_ref", reference: { resource: "metrics", fields: "network_ref" } }] };
}

const NODE_FIELD_BIPARTITE = JSON.stringify({ name: "node", type: "string", description: "Row node (the other columns are the column nodes; cells are weights, 0 = no link)" });
const NODE_FIELD_ONE_MODE = JSON.stringify({ name: "node", type: "string", description: "Node (a link goes from the row node to the column node; cells are weights, 0 = no link)" });

/**
 * `,{"name":…,"type":"number"}` for every column of a matrix CSV (its header's labels after the corner
 * cell), as JSON.stringify would write them: a bundle writes hundreds of thousands of these. When the
 * header has no quote at all (so no label was quoted, and a comma always separates two labels) and nothing
 * JSON would escape, the header itself becomes the list with one replace; otherwise label by label.
 */
export function numberFieldsOfCsv(csv: Buffer): string {
  let end = csv.indexOf(0x0a);
  if (end < 0) end = csv.length;
  const header = csv.toString("utf8", 0, end);
  const comma = header.indexOf(",");
  if (comma < 0) return "";
  if (!JSON_SPECIAL.test(header)) return `,{"name":"${header.slice(comma + 1).replaceAll(",", '","type":"number"},{"name":"')}","type":"number"}`;
  return numberFields(csvHeaderLabels(csv));
}

/** A quote, backslash, control character or surrogate (any of which needs a closer look). */
// eslint-disable-next-line no-control-regex -- control characters are exactly what JSON escapes
const JSON_SPECIAL = /["\\\u0000-\u001f\ud800-\udfff]/;

/** The same for a list of labels. */
export function numberFields(cols: string[]): string {
  let out = "";
  for (const c of cols) out += `,{"name":${plainJson(c) ? `"${c}"` : JSON.stringify(c)},"type":"number"}`;
  return out;
}

/** True when JSON.stringify would write the string unchanged between quotes. */
function plainJson(s: string): boolean {
  for (let k = 0; k < s.length; k++) {
    const c = s.charCodeAt(k);
    if (c < 0x20 || c === 0x22 || c === 0x5c || (c >= 0xd800 && c <= 0xdfff)) return false;
  }
  return true;
}

function resourceName(path: string): string {
  return path.replace(/^networks\//, "network-").replace(/\.csv$/, "").toLowerCase().replace(/[^a-z0-9._-]/g, "-");
}

/**
 * Registered DOIs of the bundle's dataset versions ("TB-000042/2" → DOI), for the resources' sources.
 */
export async function registeredDois(networks: SelectedNetwork[]): Promise<Map<string, string>> {
  const versionKeys = [...new Set(networks.map((n) => `${n.accession}/${n.version}`))];
  const versionDois = new Map<string, string>();
  for (let i = 0; i < versionKeys.length; i += 500) {
    const rows = await sequelize().query<{ key: string; doi: string }>(
      `SELECT d.accession || '/' || v.number AS key, x.doi FROM dataset_dois x JOIN dataset_versions v ON v.id = x.version_id JOIN datasets d ON d.id = v.dataset_id
        WHERE x.state = 'registered' AND (d.accession || '/' || v.number) IN (:keys)`,
      { replacements: { keys: versionKeys.slice(i, i + 500) }, type: QueryTypes.SELECT },
    );
    for (const r of rows) versionDois.set(r.key, r.doi);
  }
  return versionDois;
}

/** Where a network's data comes from: its dataset version's page, and the version's DOI when it has one. */
export interface ResourceSource {
  net: SelectedNetwork;
  licence: string;
  doi: string | undefined;
  publicUrl: string;
}

function sourcesOf({ net, doi, publicUrl }: ResourceSource) {
  return [{ title: `${net.accession} version ${net.version}`, path: `${publicUrl}/datasets/${net.accession}/v/${net.version}` }, ...(doi ? [{ title: `DOI ${doi}`, path: doiUrl(doi) }] : [])];
}

/**
 * The resource of a network's matrix CSV at `path`, its schema's fields after the node column being
 * `fields` (numberFieldsOfCsv or numberFields).
 */
export function networkResource(src: ResourceSource, e: CatalogueEntry, path: string, fields: string): string {
  return (
    JSON.stringify({
      path,
      name: resourceName(path),
      title: `${src.net.ref}: ${e.title ?? ""}`.trim(),
      profile: "tabular-data-resource",
      format: "csv",
      mediatype: "text/csv",
      encoding: "utf-8",
      licenses: [licenseObj(src.licence)],
      sources: sourcesOf(src),
    }).slice(0, -1) + `,"schema":{"fields":[${e.kind === "bipartite" ? NODE_FIELD_BIPARTITE : NODE_FIELD_ONE_MODE}${fields}],"primaryKey":["node"]}}`
  );
}

/** The resource of a network's file as deposited, at `path` (bundles.parts.ts, originalPath). */
export function originalResource(src: ResourceSource, original: { name: string; bytes: Buffer; sha256: string }, path: string, format: string): string {
  return JSON.stringify({
    path,
    name: resourceName(path.replace(/^originals\//, "original-")),
    title: `${src.net.ref}: the file as deposited (${original.name})`,
    profile: "data-resource",
    format,
    ...(MEDIATYPES[format] ? { mediatype: MEDIATYPES[format] } : {}),
    bytes: original.bytes.length,
    hash: `sha256:${original.sha256}`,
    licenses: [licenseObj(src.licence)],
    sources: sourcesOf(src),
  });
}

export interface PackageInput {
  title: string;
  count: number;
  generated: Date;
  publicUrl: string;
  licences: Set<string>;
  partTables: PartTable[];
  /** The networks' resources as written (bundles.tables.ts), read only when datapackage.json is written. */
  networkResources: () => AsyncIterable<unknown>;
  hasNetworkResources: boolean;
}

/** datapackage.json in pieces: header, the tables' resources, then the networks' resources. */
export async function* datapackageChunks(p: PackageInput): AsyncGenerator<string | Buffer> {
  const licenceList = [...p.licences].sort();
  const head = {
    profile: "tabular-data-package",
    name: `tanglebank-bundle-${p.generated.toISOString().slice(0, 10)}`,
    title: `Tanglebank bundle: ${p.title}`,
    description: `${p.count} interaction networks from Tanglebank with their metadata and metrics. See README.txt for how the metrics were computed.`,
    created: p.generated.toISOString(),
    homepage: p.publicUrl,
    licenses: licenceList.map(licenseObj),
    sources: [{ title: "Tanglebank", path: p.publicUrl }],
  };
  const tables = [
    { path: "metrics.csv", name: "metrics", title: "Current metrics of every network", schema: { ...tableSchema(METRICS_FIELDS), primaryKey: "network_ref" } },
    { path: "networks.csv", name: "networks", title: "Metadata of every network", schema: tableSchema(NETWORK_FIELDS) },
    ...p.partTables.map((k) => ({ path: PART_TABLES[k].path, name: PART_TABLES[k].name, title: PART_TABLES[k].title, schema: partSchema(PART_TABLES[k].fields) })),
  ].map((t) => ({ ...t, profile: "tabular-data-resource", format: "csv", mediatype: "text/csv", encoding: "utf-8", licenses: licenceList.map(licenseObj), sources: head.sources }));
  yield JSON.stringify(head, null, 2).slice(0, -2) + ',\n  "resources": [\n';
  yield tables.map((t) => "    " + JSON.stringify(t)).join(",\n") + (p.hasNetworkResources ? ",\n" : "");
  for await (const chunk of p.networkResources()) yield chunk as Buffer;
  yield "\n  ]\n}\n";
}
