/**
 * Generalisation of sensitive sites (e.g. threatened taxa). The depositor chooses how far public
 * coordinates are generalised: "exact", or a grid of 0.01°, 0.1° or 1°. Public pages, the API and bundles
 * carry `generaliseLocality(locality)`: latitude and longitude rounded to the nearest grid point, and
 * Darwin Core `coordinatePrecision` set to the grid size (the precision a reader may assume). Elevation is
 * generalised with them (ELEVATION_STEPS: 50 m, 100 m, 500 m), since an exact elevation on a slope narrows
 * a grid cell down to one contour line. Only curators, admins and the owner see the exact values.
 */
import type { CoordinateGeneralisation, Locality } from "../types/dataset";

export const GENERALISATION_STEPS: Record<Exclude<CoordinateGeneralisation, "exact">, number> = { "0.01": 0.01, "0.1": 0.1, "1": 1 };

/** Metres public elevations are rounded to, per coordinate grid (about a tenth of the relief a cell spans). */
export const ELEVATION_STEPS: Record<Exclude<CoordinateGeneralisation, "exact">, number> = { "0.01": 50, "0.1": 100, "1": 500 };

function decimalsOf(step: number): number {
  return step >= 1 ? 0 : Math.round(-Math.log10(step));
}

/** Rounds a coordinate to the nearest multiple of `step`, written with the step's decimals (no 0.30000000000000004). */
export function roundToGrid(value: number, step: number): number {
  const d = decimalsOf(step);
  // value / step can land a hair below .5 (0.35 / 0.1 = 3.4999999999999996): round that noise away first.
  const rounded = Math.round(Number((value / step).toFixed(9))) * step;
  const out = Number(rounded.toFixed(d));
  return Object.is(out, -0) ? 0 : out;
}

/** The locality as the public may see it. Returns the same object when nothing is generalised. */
export function generaliseLocality<L extends Partial<Locality>>(locality: L): L {
  const g = locality.generalisation;
  if (!g || g === "exact" || !(g in GENERALISATION_STEPS)) return locality;
  const step = GENERALISATION_STEPS[g as keyof typeof GENERALISATION_STEPS];
  const out: L = { ...locality };
  if (typeof locality.decimalLatitude === "number") out.decimalLatitude = Math.max(-90, Math.min(90, roundToGrid(locality.decimalLatitude, step)));
  if (typeof locality.decimalLongitude === "number") {
    let lon = roundToGrid(locality.decimalLongitude, step);
    if (lon > 180) lon = 180;
    if (lon < -180) lon = -180;
    out.decimalLongitude = lon;
  }
  out.coordinatePrecision = Math.max(step, typeof locality.coordinatePrecision === "number" ? locality.coordinatePrecision : 0);
  if (typeof locality.elevation === "number" && Number.isFinite(locality.elevation)) {
    const m = ELEVATION_STEPS[g as keyof typeof ELEVATION_STEPS];
    out.elevation = Math.round(locality.elevation / m) * m + 0;
  }
  return out;
}
