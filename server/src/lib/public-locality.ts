/**
 * Public coordinates of a locality, the one rule every public answer uses (dataset API, network JSON and
 * views, JSON-LD, catalogue, map, bundles): latitude and longitude rounded to the locality's generalisation
 * grid by the deposit validation's `generaliseLocality` (shared/validation/coordinates.ts). A missing or
 * unknown generalisation means 0.1°, the cautious default, never "exact"; coordinates that are not numbers
 * are left out; only the known locality fields are kept. The precision field then states the grid used;
 * the elevation is rounded with the coordinates (50, 100 or 500 m for the 0.01°, 0.1° and 1° grids).
 */
import type { CoordinateGeneralisation, Locality } from "@shared/types/dataset";
import { GENERALISATION_STEPS, generaliseLocality } from "@shared/validation/coordinates";

function generalisationOf(l: Partial<Locality>): CoordinateGeneralisation {
  const g = l.generalisation as string | undefined;
  return g === "exact" || (typeof g === "string" && Object.prototype.hasOwnProperty.call(GENERALISATION_STEPS, g)) ? (g as CoordinateGeneralisation) : "0.1";
}

export function publicLocality(loc: Locality | Partial<Locality> | undefined): Locality {
  const l = (loc && typeof loc === "object" ? loc : {}) as Partial<Locality>;
  const generalisation = generalisationOf(l);
  const lat = typeof l.decimalLatitude === "number" && Number.isFinite(l.decimalLatitude) ? l.decimalLatitude : undefined;
  const lon = typeof l.decimalLongitude === "number" && Number.isFinite(l.decimalLongitude) ? l.decimalLongitude : undefined;
  const precision = typeof l.coordinatePrecision === "number" ? l.coordinatePrecision : undefined;
  const elevation = typeof l.elevation === "number" && Number.isFinite(l.elevation) ? l.elevation : undefined;
  const p = generaliseLocality<Partial<Locality>>({ decimalLatitude: lat, decimalLongitude: lon, coordinatePrecision: precision, elevation, generalisation });
  return {
    placeName: typeof l.placeName === "string" ? l.placeName : "",
    countryCode: typeof l.countryCode === "string" ? l.countryCode : "",
    decimalLatitude: (p.decimalLatitude ?? null) as unknown as number,
    decimalLongitude: (p.decimalLongitude ?? null) as unknown as number,
    ...(p.coordinatePrecision !== undefined ? { coordinatePrecision: p.coordinatePrecision } : {}),
    ...(typeof p.elevation === "number" ? { elevation: p.elevation } : {}),
    generalisation,
  };
}
