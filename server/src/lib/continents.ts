/**
 * The continent of a country, from the countries-list package (ISO 3166-1 alpha-2 → one continent code
 * each: AF, AN, AS, EU, NA, OC, SA), never a hand-typed table. One continent per country: countries that
 * span two are filed under one of them by that dataset (Russia and Turkey under Asia, for example), which
 * the catalogue states beside the filter.
 */
import { continents, countries } from "countries-list";

export const CONTINENT_NAMES: Readonly<Record<string, string>> = continents;
export const CONTINENT_CODES = Object.keys(continents).sort();

const byCountry = countries as Record<string, { continent?: string } | undefined>;

export function continentOf(countryCode: string | null | undefined): string | null {
  if (!countryCode) return null;
  return byCountry[countryCode.toUpperCase()]?.continent ?? null;
}
