/** How the review page writes the values of a diff. */
import type { NetworkSide } from "@shared/types/review";

/** A field's value: absent fields as "(none)", lists joined, true/false as yes/no, objects as JSON. */
export function formatValue(v: unknown): string {
  if (v === null || v === undefined || v === "") return "(none)";
  if (Array.isArray(v)) return v.length ? v.map((x) => (typeof x === "object" && x !== null ? JSON.stringify(x) : String(x))).join(", ") : "(none)";
  if (typeof v === "boolean") return v ? "yes" : "no";
  if (typeof v === "object") return JSON.stringify(v);
  return String(v);
}

/** "3 × 4, 6 links" (two-mode) or "12 nodes, 30 links" (one-mode). */
export function formatShape(s: NetworkSide): string {
  const size = s.nRows !== null && s.nCols !== null && s.kind === "bipartite" ? `${s.nRows} × ${s.nCols}` : `${s.nNodes} nodes`;
  return `${size}, ${s.nLinks} link${s.nLinks === 1 ? "" : "s"}`;
}

/** "+2 (Ling, Heath rush)" or "+60 (the first 50: …)". */
export function formatNames(sign: "+" | "−", names: string[], count: number): string {
  if (!count) return "";
  const shown = names.join(", ");
  return `${sign}${count} (${count > names.length ? `the first ${names.length}: ` : ""}${shown})`;
}
