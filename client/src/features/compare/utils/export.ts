/** Exports of the compare view: a CSV of the metrics table and the charts as standalone SVG files. */
import type { NetworkCompareRow } from "../../../../../shared/types/network-view";

function csvCell(v: unknown): string {
  if (v === null || v === undefined) return "";
  const s = String(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export const COMPARE_COLUMNS = ["ref", "dataset", "network", "interaction_type", "kind", "directed", "weighted", "S", "I", "J", "L", "C", "objective", "Q", "modules", "null_model", "null_n", "null_mean", "null_sd", "z", "Q_rel", "p", "z_unstable", "NODF", "metrics_status"] as const;

export function compareCsv(rows: NetworkCompareRow[]): string {
  const lines = [COMPARE_COLUMNS.join(",")];
  for (const r of rows) {
    const m = r.metrics;
    lines.push(
      [r.ref, r.datasetTitle, r.name, r.interactionType, r.kind, r.directed, r.weighted, r.nNodes, r.nRows, r.nCols, r.nLinks, r.connectance, m.objective, m.Q, m.modules, m.nullModel, m.nullN, m.nullMean, m.nullSd, m.z, m.qRel, m.p, m.zUnstable ?? "", m.nodf, m.status]
        .map(csvCell)
        .join(","),
    );
  }
  return lines.join("\r\n") + "\r\n";
}

/** The SVG element as a standalone file (namespace and font declared; the app's CSS classes do not travel). */
export function serializeSvg(svg: SVGSVGElement): string {
  const clone = svg.cloneNode(true) as SVGSVGElement;
  clone.setAttribute("xmlns", "http://www.w3.org/2000/svg");
  clone.removeAttribute("class");
  const vb = svg.viewBox.baseVal;
  if (vb && vb.width) {
    clone.setAttribute("width", String(vb.width));
    clone.setAttribute("height", String(vb.height));
  }
  clone.querySelectorAll("[tabindex]").forEach((el) => el.removeAttribute("tabindex"));
  clone.querySelectorAll("[class]").forEach((el) => el.removeAttribute("class"));
  return `<?xml version="1.0" encoding="UTF-8"?>\n${new XMLSerializer().serializeToString(clone)}\n`;
}

export function downloadText(name: string, type: string, text: string) {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const a = document.createElement("a");
  a.href = url;
  a.download = name;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}
