/**
 * A comparison of a selection that is honest about size and connectance: each network's figure adjusted to
 * the selection's mean size and connectance by least squares (covariate adjustment as in the analysis of
 * covariance; e.g. Sokal & Rohlf, Biometry, ch. 14 — from memory).
 *
 * Method: fit y = b0 + b1·ln S + b2·C by ordinary least squares over the networks of the selection that
 * have y; the adjusted figure of network i is y_i − b1 (ln S_i − mean ln S) − b2 (C_i − mean C), i.e. its
 * figure at the selection's mean ln S and mean C. It removes the linear trend of this selection only (not
 * the dependence in general, and not sampling effort); it needs at least 4 networks and some spread in S
 * and C, else it is not computed (the normal equations would be singular or leave no residual freedom).
 */
export interface AdjustInput {
  id: string;
  y: number;
  S: number;
  C: number;
}

export interface AdjustResult {
  n: number;
  /** Intercept, slope on ln S, slope on C. */
  coefficients: [number, number, number];
  /** Share of the variance of y explained by ln S and C. */
  r2: number;
  meanLnS: number;
  meanC: number;
  adjusted: Map<string, number>;
}

export const MIN_ADJUST_NETWORKS = 4;

/** Null when fewer than 4 networks or no spread in S or C (see the file header). */
export function adjustForSizeAndConnectance(rows: AdjustInput[]): AdjustResult | null {
  const pts = rows.filter((r) => Number.isFinite(r.y) && r.S > 0 && Number.isFinite(r.C));
  const n = pts.length;
  if (n < MIN_ADJUST_NETWORKS) return null;
  const x1 = pts.map((p) => Math.log(p.S));
  const x2 = pts.map((p) => p.C);
  const y = pts.map((p) => p.y);
  const mean = (a: number[]) => a.reduce((s, v) => s + v, 0) / a.length;
  const m1 = mean(x1);
  const m2 = mean(x2);
  const my = mean(y);
  // Centred normal equations for the two slopes.
  let s11 = 0, s22 = 0, s12 = 0, s1y = 0, s2y = 0, syy = 0;
  for (let i = 0; i < n; i++) {
    const a = x1[i] - m1, b = x2[i] - m2, c = y[i] - my;
    s11 += a * a; s22 += b * b; s12 += a * b; s1y += a * c; s2y += b * c; syy += c * c;
  }
  const det = s11 * s22 - s12 * s12;
  if (!(Math.abs(det) > 1e-12 * Math.max(1, s11 * s22))) return null;
  const b1 = (s22 * s1y - s12 * s2y) / det;
  const b2 = (s11 * s2y - s12 * s1y) / det;
  const b0 = my - b1 * m1 - b2 * m2;
  let sse = 0;
  const adjusted = new Map<string, number>();
  for (let i = 0; i < n; i++) {
    const fit = b0 + b1 * x1[i] + b2 * x2[i];
    sse += (y[i] - fit) ** 2;
    adjusted.set(pts[i].id, y[i] - b1 * (x1[i] - m1) - b2 * (x2[i] - m2));
  }
  return { n, coefficients: [b0, b1, b2], r2: syy > 0 ? 1 - sse / syy : 0, meanLnS: m1, meanC: m2, adjusted };
}
