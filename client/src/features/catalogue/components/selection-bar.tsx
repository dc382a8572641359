/**
 * The selection bar above the table: how many networks are selected (across pages), compare and clear,
 * and the actions on the selection or on everything matching (bundles, collections) that the route passes in.
 */
import type { ReactNode } from "react";
import { Link } from "react-router-dom";
import { MAX_COMPARE } from "@shared/types/network-view";
import { paths } from "../../../config/paths";

export interface CatalogueActionsContext {
  /** Selected network references, across pages. */
  selected: string[];
  /** The current filters (no paging or sorting): "everything matching". */
  filter: URLSearchParams;
  /** How many networks match the filters. */
  total: number;
  clearSelection: () => void;
  /** Takes these references out of the selection. */
  dropFromSelection: (refs: string[]) => void;
}

export function SelectionBar({ context, actions }: { context: CatalogueActionsContext; actions?: (ctx: CatalogueActionsContext) => ReactNode }) {
  const { selected, clearSelection } = context;
  return (
    <div className="flex flex-wrap items-center gap-3 rounded-lg bg-moss-50 p-3 ring-1 ring-moss-200" aria-label="Selection">
      <p className="font-semibold text-moss-900" aria-live="polite" data-testid="selection-count">
        {selected.length} selected
      </p>
      {selected.length > 0 && (
        <>
          <Link className="font-semibold text-moss-700 underline" to={paths.compare.href(selected.slice(0, MAX_COMPARE))}>
            {selected.length > MAX_COMPARE ? `Compare the first ${MAX_COMPARE} selected` : "Compare selected"}
          </Link>
          <button type="button" className="text-sm font-semibold text-stone-700 underline" onClick={clearSelection}>
            Clear selection
          </button>
        </>
      )}
      {actions?.(context)}
    </div>
  );
}
