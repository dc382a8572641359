/**
 * One network of a dataset version, for scripts: metadata (public coordinates), counts, current metrics,
 * and the data as JSON (labels and links) or CSV (matrix or edge list, the engine's writers). Access as
 * everywhere: published for everyone, withdrawn → 410, unpublished only for the owner and curators.
 */
import type { NetworkMetadata, NetworkMetricsSummary } from "@shared/types/dataset";
import { deserializeNetwork, networkToEdgeListCsv, networkToMatrixCsv } from "@shared/network";
import { MatrixCsvError, matrixCsvPieces } from "../../lib/matrix-csv";
import { logger } from "../../lib/logger";
import { publicLocality } from "../../lib/public-locality";
import { getCurrentMetrics } from "../../pipeline/metrics-read";
import { ApiError } from "../../lib/api-error";
import { Network, StoredFile } from "../../models";
import type { AuthUser } from "../../types";
import { resolveVersion } from "../datasets/datasets.access";
import type { NetworkRef } from "../common.schemas";

async function findNetwork(p: NetworkRef, user: AuthUser | undefined, withCanonical: boolean) {
  const { dataset, version, latestPublishedVersion } = await resolveVersion(p.accession, p.version, user);
  const network = await Network.findOne({
    where: { versionId: version.id, position: p.position },
    attributes: withCanonical ? { include: ["canonical"] } : undefined,
  });
  if (!network) throw ApiError.notFound(`${p.accession} v${version.number} has no network ${p.position}.`);
  return { dataset, version, network, latestPublishedVersion, ref: `${dataset.accession}/v${version.number}/${network.position}` };
}

export interface NetworkJson {
  ref: string;
  accession: string;
  version: number;
  position: number;
  state: string;
  latestPublishedVersion: number | null;
  originalName: string;
  format: string;
  kind: string;
  directed: boolean;
  weighted: boolean;
  S: number;
  rows: number | null;
  cols: number | null;
  L: number;
  totalWeight: number;
  C: number | null;
  sha256: string | null;
  metadata: NetworkMetadata;
  metrics: NetworkMetricsSummary | null;
  links?: { data: string; metrics: string };
  data?: { rowLabels: string[]; colLabels: string[] | null; links: Array<[string, string, number]> };
}

export async function getNetworkJson(p: NetworkRef, user: AuthUser | undefined, includeData: boolean, baseUrl: string): Promise<NetworkJson> {
  const { dataset, version, network, latestPublishedVersion, ref } = await findNetwork(p, user, includeData);
  const file = await StoredFile.findByPk(network.fileId, { attributes: ["id", "sha256"] });
  const metrics = (await getCurrentMetrics([network.id])).get(network.id) ?? null;
  const meta = network.metadata as unknown as NetworkMetadata;
  const out: NetworkJson = {
    ref,
    accession: dataset.accession!,
    version: version.number,
    position: network.position,
    state: version.state,
    latestPublishedVersion,
    originalName: network.originalName,
    format: network.format,
    kind: network.kind,
    directed: network.directed,
    weighted: network.weighted,
    S: network.nNodes,
    rows: network.nRows,
    cols: network.nCols,
    L: network.nLinks,
    totalWeight: network.totalWeight,
    C: network.connectance,
    sha256: file?.sha256 ?? null,
    metadata: { ...meta, locality: meta.locality ? publicLocality(meta.locality) : meta.locality },
    metrics,
    links: { data: `${baseUrl}/${ref}/data.csv`, metrics: `${baseUrl}/${ref}/metrics` },
  };
  if (includeData) {
    const net = deserializeNetwork(network.canonical);
    const cols = net.kind === "bipartite" ? net.colLabels : net.rowLabels;
    const links: Array<[string, string, number]> = [];
    const undirected = net.kind === "unipartite" && !net.directed;
    for (let i = 0; i < net.rowLabels.length; i++) {
      for (let q = net.rowPtr[i]; q < net.rowPtr[i + 1]; q++) {
        const j = net.colIdx[q];
        if (undirected && j < i) continue;
        links.push([net.rowLabels[i], cols[j], net.weights[q]]);
      }
    }
    out.data = { rowLabels: net.rowLabels, colLabels: net.kind === "bipartite" ? net.colLabels : null, links };
  }
  return out;
}

/**
 * A network as CSV, in pieces: the edge list (as long as the links) at once, the matrix (rows × columns
 * cells, 800 MB for a 20,000-node network) row by row, the same bytes as the engine's networkToMatrixCsv.
 */
export async function getNetworkCsv(
  p: NetworkRef,
  user: AuthUser | undefined,
  layout: "matrix" | "edgelist",
  spreadsheetSafe = false,
): Promise<{ ref: string; bytes: number; pieces: Iterable<Buffer> }> {
  const { network, ref } = await findNetwork(p, user, true);
  try {
    if (layout === "edgelist" || spreadsheetSafe) {
      // the spreadsheet-safe form changes labels, so it is written afresh (not the stored exact bytes)
      const net = deserializeNetwork(network.canonical);
      const csv = Buffer.from(layout === "edgelist" ? networkToEdgeListCsv(net, { spreadsheetSafe }) : networkToMatrixCsv(net, { spreadsheetSafe }), "utf8");
      return { ref, bytes: csv.length, pieces: [csv] };
    }
    return { ref, ...matrixCsvPieces(network.canonical) };
  } catch (err) {
    if (err instanceof MatrixCsvError) throw storedNetworkDamaged(ref, err);
    throw err;
  }
}

/**
 * A stored network that fails the writer's checks (changed by hand, or a defect): our fault, not the
 * request's, so 500 — but a named one, logged with the reference, never a crash.
 */
function storedNetworkDamaged(ref: string, err: Error): ApiError {
  logger.error({ err, ref }, "stored network damaged: cannot be written as CSV");
  return new ApiError(500, "network_damaged", `The stored data of network ${ref} are damaged and cannot be written as CSV. This is a fault on our side and has been logged.`);
}

export async function getNetworkMetrics(p: NetworkRef, user: AuthUser | undefined): Promise<{ ref: string; metrics: NetworkMetricsSummary | null }> {
  const { network, ref } = await findNetwork(p, user, false);
  return { ref, metrics: (await getCurrentMetrics([network.id])).get(network.id) ?? null };
}
