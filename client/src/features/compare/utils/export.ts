/** Exports of the compare view: a CSV of the metrics table (the charts use components/charts/image-export). */
import type { NetworkCompareRow } from "@shared/types/network-view";
import { csvText } from "@shared/csv";

export const COMPARE_COLUMNS = ["ref", "dataset", "network", "interaction_type", "kind", "directed", "weighted", "S", "I", "J", "L", "C", "objective", "Q", "modules", "null_model", "null_n", "null_mean", "null_sd", "z", "z_se", "Q_rel", "delta_Q", "p", "p_at_floor", "z_unstable", "NODF", "adjusted_measure", "adjusted_value", "metrics_status"] as const;

/**
 * The table as CSV: every significance column is against `nullModel` (named in the null_model column of
 * every row; empty figures when a network has no figures of that model, never another model's).
 * `adjusted` holds the size- and connectance-adjusted value of `adjusted.measure` per network (utils/adjust.ts).
 */
export function compareCsv(rows: NetworkCompareRow[], nullModel: string, adjusted?: { measure: string; values: Map<string, number> } | null): string {
  const table: unknown[][] = [[...COMPARE_COLUMNS]];
  for (const r of rows) {
    const m = r.metrics;
    const f = m.nulls?.find((x) => x.model === nullModel) ?? null;
    const adj = adjusted?.values.get(r.ref);
    table.push([
      r.ref, r.datasetTitle, r.name, r.interactionType, r.kind, r.directed, r.weighted, r.nNodes, r.nRows, r.nCols, r.nLinks, r.connectance, m.objective, m.Q, m.modules,
      nullModel, f?.n, f?.mean, f?.sd, f?.z, f?.zSe, f?.qRel, f?.deltaQ, f?.p, f ? f.pAtFloor : "", f ? f.unstable : "", m.nodf,
      adj === undefined ? "" : adjusted!.measure, adj, m.status,
    ]);
  }
  return csvText(table, { eol: "\r\n" });
}
