/**
 * Public coordinates of a locality: the deposit validation's `publicLocality` (rounded to the locality's
 * generalisation grid), so sensitive sites never leave the server with more precision than allowed.
 */
import type { Locality } from "../../../../shared/types/dataset";
import { publicLocality } from "../../../../shared/validation/coordinates";

export function publicCoordinates(loc: Record<string, unknown>): { latitude: number | null; longitude: number | null } {
  const p = publicLocality(loc as Partial<Locality>);
  return {
    latitude: typeof p.decimalLatitude === "number" ? p.decimalLatitude : null,
    longitude: typeof p.decimalLongitude === "number" ? p.decimalLongitude : null,
  };
}
