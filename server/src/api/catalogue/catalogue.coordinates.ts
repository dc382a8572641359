/**
 * Public coordinates of a locality for catalogue rows (map, bundles): the one public rule of
 * server/src/lib/public-locality.ts (rounded to the locality's generalisation grid; missing or unknown
 * generalisation means 0.1°; the elevation rounded with them), so sensitive sites never leave the server with more precision than allowed.
 */
import type { Locality } from "@shared/types/dataset";
import { publicLocality } from "../../lib/public-locality";

export function publicCoordinates(loc: Record<string, unknown>): { latitude: number | null; longitude: number | null; elevation: number | null; generalisation: Locality["generalisation"] } {
  const p = publicLocality(loc as Partial<Locality>);
  return {
    latitude: typeof p.decimalLatitude === "number" ? p.decimalLatitude : null,
    longitude: typeof p.decimalLongitude === "number" ? p.decimalLongitude : null,
    // rounded with the coordinates (a sensitive site's exact elevation would narrow its grid cell)
    elevation: typeof p.elevation === "number" ? p.elevation : null,
    // the grid actually applied (a missing or unknown one is 0.1), as bundles' networks.csv states it
    generalisation: p.generalisation,
  };
}
