/**
 * One look for every chart: the app's palette, Noto Sans at readable sizes, and colour sets chosen to stay
 * apart for common colour-vision deficiencies (Okabe & Ito 2008 "Color Universal Design" palette, plus
 * the app's moss and lichen for single-series marks).
 */
export const chartTheme = {
  font: "Noto Sans, ui-sans-serif, system-ui, sans-serif",
  fontSize: 12,
  axis: "#57534e", // stone-600
  grid: "#e7e5e4", // stone-200
  text: "#292524", // stone-800
  mark: "#1f4d3a", // moss-700
  markLight: "#a9d3b9", // moss-200
  accent: "#b88a1c", // lichen-600
  accentStrong: "#8a5a00",
  margin: { top: 16, right: 20, bottom: 52, left: 64 },
} as const;

/** Okabe–Ito categorical colours (black last, used for "other"). */
export const categorical = ["#0072B2", "#E69F00", "#009E73", "#CC79A7", "#56B4E9", "#D55E00", "#F0E442", "#000000"] as const;

export function categoryColour(index: number): string {
  return categorical[index % categorical.length];
}

/** Stable colours for interaction types (so every chart and map agrees). */
export const interactionTypeColour: Record<string, string> = {
  pollination: "#E69F00",
  "seed-dispersal": "#009E73",
  "host-parasitoid": "#CC79A7",
  "predator-prey": "#D55E00",
  herbivory: "#0072B2",
  other: "#000000",
};

export const interactionTypeLabel: Record<string, string> = {
  pollination: "Pollination",
  "seed-dispersal": "Seed dispersal",
  "host-parasitoid": "Host–parasitoid",
  "predator-prey": "Predator–prey",
  herbivory: "Herbivory",
  other: "Other",
};
