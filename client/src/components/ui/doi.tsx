/**
 * A DOI as pages show it: a link to its resolver once DataCite has registered it, "DOI pending" before
 * (publishing reserves the name; a background job registers it, usually within a minute).
 */
import type { DoiSummary } from "@shared/types/dataset";

export function DoiLine({ doi, label = "DOI", note }: { doi: DoiSummary | null; label?: string; note?: string }) {
  if (!doi) return null;
  if (doi.state === "pending") {
    return (
      <span data-testid="doi-pending" title={`${doi.doi} is reserved and being registered with DataCite; cite the page address until it is.`}>
        {label} pending <span className="text-stone-600">(being registered)</span>
      </span>
    );
  }
  return (
    <span data-testid="doi">
      {label}{" "}
      <a className="font-mono text-moss-700 underline" href={doi.url} rel="noopener">
        {doi.doi}
      </a>
      {note && <span className="text-stone-600"> {note}</span>}
    </span>
  );
}
