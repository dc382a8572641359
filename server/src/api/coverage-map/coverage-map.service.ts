/** The coverage map's points: where the catalogue's networks were sampled. */
import type { MapPointRow } from "@shared/types/network-view";
import { matchCatalogue } from "../catalogue/catalogue.service";
import type { CatalogueQuery } from "../catalogue/catalogue.schemas";

/**
 * Every catalogue network matching the catalogue's own filters (the same parser and matcher as
 * GET /api/v1/catalogue), with its public (generalised) coordinates, for the coverage map. The catalogue
 * rows do not carry coordinates, and paging through them 200 at a time would be slow for a map.
 */
export async function getMapPoints(q: CatalogueQuery): Promise<{ data: MapPointRow[]; meta: { total: number; placed: number } }> {
  const { matches } = await matchCatalogue(q);
  const data: MapPointRow[] = [];
  for (const e of matches) {
    if (e.latitude === null || e.longitude === null) continue;
    data.push({
      ref: e.ref,
      name: e.name,
      title: e.title,
      interactionType: e.interactionType ?? "other",
      placeName: e.placeName,
      countryCode: e.countryCode,
      latitude: e.latitude,
      longitude: e.longitude,
      nNodes: e.nNodes,
    });
  }
  return { data, meta: { total: matches.length, placed: data.length } };
}
