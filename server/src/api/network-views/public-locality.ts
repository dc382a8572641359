/**
 * Public coordinates of a locality: rounded to its generalisation grid ("exact", "0.01", "0.1" or "1"
 * degrees; missing means 0.1, the cautious default), so sensitive sites never leave the server with more
 * precision than allowed. The precision field then states the grid actually used.
 */
import type { Locality } from "../../../../shared/types/dataset";

const STEP: Record<string, number> = { exact: 0, "0.01": 0.01, "0.1": 0.1, "1": 1 };

export function generalise(v: number, step: number): number {
  if (step === 0) return v;
  const decimals = step >= 1 ? 0 : Math.round(-Math.log10(step));
  return Number((Math.round(v / step) * step).toFixed(decimals));
}

export function publicLocality(loc: Locality | undefined): Locality {
  const l = (loc ?? {}) as Partial<Locality>;
  const step = STEP[l.generalisation ?? "0.1"] ?? 0.1;
  const lat = typeof l.decimalLatitude === "number" ? generalise(l.decimalLatitude, step) : (null as unknown as number);
  const lon = typeof l.decimalLongitude === "number" ? generalise(l.decimalLongitude, step) : (null as unknown as number);
  const precision = step === 0 ? l.coordinatePrecision : Math.max(step, l.coordinatePrecision ?? 0);
  return {
    placeName: l.placeName ?? "",
    countryCode: l.countryCode ?? "",
    decimalLatitude: lat,
    decimalLongitude: lon,
    ...(precision !== undefined ? { coordinatePrecision: precision } : {}),
    ...(l.elevation !== undefined ? { elevation: l.elevation } : {}),
    generalisation: (l.generalisation ?? "0.1") as Locality["generalisation"],
  };
}
