/** Number formatting for metrics: fixed decimals, "—" for missing values. */
export function fmt(v: number | null | undefined, digits = 3): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return "—";
  return v.toFixed(digits);
}

export function fmtP(p: number | null | undefined): string {
  if (p === null || p === undefined) return "—";
  return p < 0.001 ? p.toExponential(1) : p.toFixed(3);
}

export const objectiveName: Record<string, string> = {
  barber: "Barber's bipartite modularity Q_B",
  newman: "Newman–Girvan modularity Q",
  "newman-directed": "Leicht–Newman directed modularity Q_d",
};

export const nullModelName: Record<string, string> = {
  er: "Erdős–Rényi type (same size and connectance)",
  curveball: "fixed row and column degrees (curveball)",
  patefield: "fixed row and column totals (Patefield)",
};
