/**
 * Link-preview images of dataset and network pages, drawn on demand and kept in memory: a published
 * network's card changes only when its shown figures change (a new metrics run), so a card is cached
 * under its networks' ids and run ids. Drafts (visible to their owner and curators only) are drawn each
 * time and never cached.
 */
import { createHash } from "node:crypto";
import { ApiError } from "../../lib/api-error";
import { Network } from "../../models";
import { getCurrentMetrics } from "../../pipeline/metrics-read";
import type { AuthUser } from "../../types";
import { parseVersionParam, resolveVersion } from "../datasets/datasets.access";
import { getNetworkView } from "../network-views/network-views.service";
import { PREVIEW_MAX_TILES, previewPng, type PreviewNetwork } from "./previews.image";

const CACHE_LIMIT = 200;
const cache = new Map<string, Buffer>();

export interface Preview {
  png: Buffer;
  etag: string;
  /** Published content may be cached by browsers and link-card services. */
  cacheable: boolean;
}

async function draw(accession: string, versionNumber: number, positions: number[], user: AuthUser | undefined): Promise<PreviewNetwork[]> {
  const views = await Promise.all(positions.map((p) => getNetworkView(accession, versionNumber, p, user)));
  return views.map((v) => ({
    nRows: v.rowLabels.length,
    nCols: v.colLabels.length,
    ptr: v.cells.ptr,
    idx: v.cells.idx,
    rowModules: v.rowModules,
    colModules: v.colModules,
    square: v.kind !== "bipartite",
  }));
}

async function render(accession: string, versionParam: string, position: number | null, user: AuthUser | undefined): Promise<Preview> {
  const { version } = await resolveVersion(accession, parseVersionParam(versionParam), user);
  const networks = await Network.findAll({
    where: position === null ? { versionId: version.id } : { versionId: version.id, position },
    attributes: ["id", "position"],
    order: [["position", "ASC"]],
    limit: PREVIEW_MAX_TILES,
  });
  if (!networks.length) throw ApiError.notFound(position === null ? `${accession} v${version.number} has no networks.` : `No network ${position} in ${accession} v${version.number}.`);
  const published = version.state === "published";
  const runs = await getCurrentMetrics(networks.map((n) => n.id));
  const key = `${version.id}|` + networks.map((n) => `${n.id}:${runs.get(n.id)?.runId ?? 0}`).join(",");
  const etag = `"${createHash("sha256").update(key).digest("base64url").slice(0, 27)}"`;
  let png = published ? cache.get(key) : undefined;
  if (!png) {
    png = previewPng(await draw(accession, version.number, networks.map((n) => n.position), published ? undefined : user));
    if (published) {
      cache.set(key, png);
      if (cache.size > CACHE_LIMIT) cache.delete(cache.keys().next().value!);
    }
  }
  return { png, etag, cacheable: published };
}

/** The card of a dataset version: its first networks side by side. */
export function datasetPreview(accession: string, version: string, user: AuthUser | undefined): Promise<Preview> {
  return render(accession, version, null, user);
}

/** The card of one network. */
export function networkPreview(accession: string, version: string, position: number, user: AuthUser | undefined): Promise<Preview> {
  return render(accession, version, position, user);
}

/** Forgets every card (tests). */
export function clearPreviewCache(): void {
  cache.clear();
}
