/**
 * Colours shared by the plots drawn in the browser and the preview images drawn on the server.
 *
 * Module colours: a set of eight hues that stay apart for common colour-vision deficiencies (built on the
 * Okabe & Ito 2008 "Color Universal Design" hues without their yellow and black, which are too light or
 * too dark for a filled cell, plus two darker hues of our own), repeated when a partition has more
 * modules. Each module also has a pale tint of its hue for its band in the matrix. Links between modules
 * are drawn in one neutral grey so that colour always means "inside module k".
 */
export const MODULE_HUES = ["#0072B2", "#D55E00", "#009E73", "#CC79A7", "#E69F00", "#56B4E9", "#6A4C93", "#8A5A00"] as const;

/** Links between modules (stone-400: clearly lighter than every module hue). */
export const BETWEEN_MODULES = "#a8a29e";
/** A link when there is no partition yet. */
export const NO_PARTITION = "#44403c";

export type Rgb = [number, number, number];

export function hexToRgb(hex: string): Rgb {
  const h = hex.replace("#", "");
  return [parseInt(h.slice(0, 2), 16), parseInt(h.slice(2, 4), 16), parseInt(h.slice(4, 6), 16)];
}

export function rgbToHex([r, g, b]: Rgb): string {
  return "#" + [r, g, b].map((v) => Math.round(v).toString(16).padStart(2, "0")).join("");
}

/** Mixes a colour with white: share 0 is the colour, 1 is white (whole numbers, as a pixel holds them). */
export function tint(rgb: Rgb, share: number): Rgb {
  return [0, 1, 2].map((c) => Math.round(rgb[c] + (255 - rgb[c]) * share)) as Rgb;
}

/** How pale a module's band is (share of white). */
export const BAND_TINT = 0.86;

/** The hue of module k (0-based), repeating after eight. */
export function moduleColour(k: number): string {
  return MODULE_HUES[((k % MODULE_HUES.length) + MODULE_HUES.length) % MODULE_HUES.length];
}

export function moduleRgb(k: number): Rgb {
  return hexToRgb(moduleColour(k));
}

/** The pale band colour of module k. */
export function moduleBand(k: number): string {
  return rgbToHex(tint(moduleRgb(k), BAND_TINT));
}
