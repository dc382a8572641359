/**
 * How every significance figure is shown: with the name of its null model, z with its Monte Carlo error,
 * p with "≤" at its floor, and the product's one wording of what the figures control for
 * (shared/figures/cautions.ts). Used by the network page, dataset page, catalogue and compare view.
 */
import { NULL_MODEL_INFO, type NullModelName } from "@shared/network/null-models/index";
import { FIGURE_CAUTIONS, RESOLUTION_LIMIT_CAUTION } from "@shared/figures/cautions";

export { FIGURE_CAUTIONS, FIGURE_CAUTION_SHORT, NODF_CAUTION, RESOLUTION_LIMIT_CAUTION } from "@shared/figures/cautions";

/** "fixed degrees" etc.; an unknown name is shown as it is. */
export function nullTitle(model: string | null | undefined): string {
  if (!model) return "—";
  return NULL_MODEL_INFO[model as NullModelName]?.title ?? model;
}

/** "fixed degrees (curveball)". */
export function nullLabel(model: string | null | undefined): string {
  if (!model) return "—";
  const info = NULL_MODEL_INFO[model as NullModelName];
  return info ? `${info.title} (${model})` : model;
}

export function isLiberal(model: string | null | undefined): boolean {
  return !!model && !!NULL_MODEL_INFO[model as NullModelName]?.liberal;
}

export function nullInfo(model: string) {
  return NULL_MODEL_INFO[model as NullModelName] ?? null;
}

function num(v: number | null | undefined, digits: number): string {
  return v === null || v === undefined || !Number.isFinite(v) ? "—" : v.toFixed(digits);
}

/** "12.3 ± 1.4" (z with its Monte Carlo standard error). */
export function fmtZ(z: number | null | undefined, se?: number | null): string {
  if (z === null || z === undefined || !Number.isFinite(z)) return "—";
  return se !== null && se !== undefined && Number.isFinite(se) ? `${z.toFixed(2)} ± ${se.toFixed(2)}` : z.toFixed(2);
}

/** p, with "≤" when it is the floor 1/(n + 1) of its n nulls. */
export function fmtPFloor(p: number | null | undefined, atFloor?: boolean): string {
  if (p === null || p === undefined) return "—";
  const v = p < 0.001 ? p.toExponential(1) : p.toFixed(3);
  return atFloor ? `≤ ${v}` : v;
}

export { num as fmtNum };

/** The list of what each figure controls for and what not, plus the resolution limit where modules are shown. */
export function FigureCautions({ modules = false, className = "" }: { modules?: boolean; className?: string }) {
  return (
    <ul className={`list-disc space-y-1 pl-5 ${className}`}>
      {FIGURE_CAUTIONS.map((c) => (
        <li key={c}>{c}</li>
      ))}
      {modules && <li>{RESOLUTION_LIMIT_CAUTION}</li>}
    </ul>
  );
}

/** A small badge naming the null model of a figure, marked when it is liberal. */
export function NullBadge({ model, primary, withTitle = true }: { model: string | null | undefined; primary?: boolean; withTitle?: boolean }) {
  if (!model) return null;
  const liberal = isLiberal(model);
  if (!withTitle && !primary && !liberal) return null;
  return (
    <span
      className={`ml-1 inline-block rounded px-1 font-sans text-xs ${liberal ? "bg-amber-100 text-amber-900" : "bg-moss-50 text-moss-800"}`}
      title={nullInfo(model) ? `${nullLabel(model)}: keeps ${nullInfo(model)!.keeps}. Does not keep ${nullInfo(model)!.doesNotKeep}.${liberal ? ` Liberal: ${nullInfo(model)!.caution}.` : ""}` : model}
    >
      {[withTitle ? nullTitle(model) : null, primary ? "primary" : null, liberal ? "liberal" : null].filter(Boolean).join(", ")}
    </span>
  );
}
