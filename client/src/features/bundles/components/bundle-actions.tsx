/**
 * "Bundle selection" and "Bundle everything matching": the number of networks and the estimated size are
 * shown before the download starts. "What goes in" opens the bundle's options: the optional parts
 * (partitions, node roles, null distributions, edge lists, original files; the first three by default, as
 * the API) and the packing (files stored: quickest; or deflated: about a seventh of the size).
 * Downloads are ordinary links (the browser streams the zip to disk); a selection too long for a link is
 * posted and saved from memory instead. Selected networks that can no longer be bundled (withdrawn since
 * they were selected) are named, with a button that drops them, and the download bundles the others (its
 * size shown) instead of failing.
 */
import { useId, useState } from "react";
import { ApiClientError } from "../../../lib/api-client";
import { useBundleEstimate } from "../api/estimate-bundle";
import {
  BUNDLE_PARTS,
  DEFAULT_CHOICE,
  MAX_REFS_IN_URL,
  PART_LABELS,
  bundleUrlForFilter,
  bundleUrlForRefs,
  choiceParams,
  formatBytes,
  type BundleChoice,
  type BundlePacking,
  type BundlePart,
} from "../utils/bundle-url";

const linkLook = "inline-flex items-center rounded bg-moss-700 px-3 py-1.5 text-sm font-semibold text-white hover:bg-moss-600";
const disabledLook = "inline-flex items-center rounded bg-stone-300 px-3 py-1.5 text-sm font-semibold text-stone-700 cursor-not-allowed";

async function downloadByPost(refs: string[], choice: BundleChoice): Promise<void> {
  const { csrf } = await fetch("/api/v1/auth/session", { credentials: "same-origin" }).then(async (r) => ({ csrf: ((await r.json()) as { csrfToken: string }).csrfToken }));
  const res = await fetch("/api/v1/bundles", {
    method: "POST",
    credentials: "same-origin",
    headers: { "content-type": "application/json", "x-csrf-token": csrf },
    body: JSON.stringify({ refs, ...choiceParams(choice), include: choice.parts.join(",") }),
  });
  if (!res.ok) {
    const body = (await res.json().catch(() => ({}))) as { code?: string; message?: string };
    throw new ApiClientError(res.status, body.code ?? "error", body.message ?? `The bundle failed (${res.status}).`);
  }
  const url = URL.createObjectURL(await res.blob());
  const a = document.createElement("a");
  a.href = url;
  a.download = /filename="([^"]+)"/.exec(res.headers.get("content-disposition") ?? "")?.[1] ?? "tanglebank-bundle.zip";
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 60_000);
}

export interface BundleActionsProps {
  /** Chosen network references (may be empty). */
  selected: string[];
  /** The filter for "everything matching" (omit to offer only the selection). */
  filter?: URLSearchParams;
  total?: number;
  /** Drops references that can no longer be bundled from the selection (offered when some cannot). */
  onDropUnavailable?: (refs: string[]) => void;
  /** Label of the selection button (default "Bundle selection"). */
  selectionLabel?: string;
}

export function BundleActions({ selected, filter, total = 0, onDropUnavailable, selectionLabel = "Bundle selection" }: BundleActionsProps) {
  const [choice, setChoice] = useState<BundleChoice>(DEFAULT_CHOICE);
  const include = choice.parts.join(",");
  const filterObj = filter ? Object.fromEntries(filter.entries()) : {};
  const everything = useBundleEstimate({ filter: filterObj, include }, !!filter && total > 0);
  const chosen = useBundleEstimate({ refs: selected, include }, selected.length > 0);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const optionsId = useId();
  const est = everything.data;
  const sel = chosen.data;
  const unavailable = sel?.unavailable ?? [];
  const bundleable = unavailable.length ? selected.filter((r) => !unavailable.some((u) => u.ref === r)) : selected;
  const size = sel ? `, ~${formatBytes(sel.estimatedBytes)}` : "";
  // with networks left out, say how many go in: "Bundle selection: the other 3 networks (~120 kB)"
  const selLabel = unavailable.length
    ? `${selectionLabel}: the other ${bundleable.length} network${bundleable.length === 1 ? "" : "s"} (${size.slice(2)})`
    : `${selectionLabel} (${bundleable.length}${size})`;

  return (
    <div className="flex flex-wrap items-center gap-3" data-testid="bundle-actions">
      {selected.length > 0 &&
        (bundleable.length === 0 ? (
          <span className={disabledLook} aria-disabled="true">
            {selectionLabel}: nothing left to bundle
          </span>
        ) : bundleable.length <= MAX_REFS_IN_URL ? (
          <a className={linkLook} href={bundleUrlForRefs(bundleable, choice)} download>
            {selLabel}
          </a>
        ) : (
          <button
            type="button"
            className={linkLook}
            disabled={busy}
            aria-busy={busy || undefined}
            onClick={() => {
              setBusy(true);
              setError(null);
              downloadByPost(bundleable, choice)
                .catch((e: Error) => setError(e.message))
                .finally(() => setBusy(false));
            }}
          >
            {busy ? "Preparing bundle…" : selLabel}
          </button>
        ))}
      {filter &&
        total > 0 &&
        (est?.overLimit ? (
          <span className={disabledLook} aria-disabled="true" title={`A bundle holds at most ${est.limit.toLocaleString("en")} networks`}>
            Everything matching: {est.count.toLocaleString("en")} networks is over the {est.limit.toLocaleString("en")} limit — narrow the filters
          </span>
        ) : (
          <a className={linkLook} href={bundleUrlForFilter(filter, choice)} download>
            Bundle everything matching ({total.toLocaleString("en")} network{total === 1 ? "" : "s"}
            {est ? `, ~${formatBytes(est.estimatedBytes)}` : ""})
          </a>
        ))}
      <details className="group text-sm">
        <summary className="cursor-pointer font-semibold text-moss-700 underline">What goes in the bundle</summary>
        <BundleOptions id={optionsId} choice={choice} onChange={setChoice} />
      </details>
      {unavailable.length > 0 && (
        <div role="alert" className="w-full rounded border border-lichen-600 bg-lichen-300/40 p-2 text-sm text-stone-900">
          <p>
            {unavailable.length === 1 ? "One selected network" : `${unavailable.length} selected networks`} can no longer be bundled:{" "}
            {unavailable.map((u) => `${u.ref} (${u.reason === "withdrawn" ? "withdrawn" : "not published"})`).join(", ")}.{" "}
            {bundleable.length > 0
              ? `The bundle holds the other ${bundleable.length} (~${formatBytes(sel!.estimatedBytes)}).`
              : "No other network is selected."}
          </p>
          {onDropUnavailable && (
            <button type="button" className="mt-1 font-semibold underline" onClick={() => onDropUnavailable(unavailable.map((u) => u.ref))}>
              Remove {unavailable.length === 1 ? "it" : "them"} from the selection
            </button>
          )}
        </div>
      )}
      {chosen.error && (
        <p role="alert" className="text-sm font-semibold text-red-800">
          The size of the selection could not be worked out: {chosen.error.message}
        </p>
      )}
      {error && (
        <p role="alert" className="text-sm font-semibold text-red-800">
          {error}
        </p>
      )}
    </div>
  );
}

function BundleOptions({ id, choice, onChange }: { id: string; choice: BundleChoice; onChange: (c: BundleChoice) => void }) {
  const toggle = (p: BundlePart, on: boolean) => onChange({ ...choice, parts: BUNDLE_PARTS.filter((x) => (x === p ? on : choice.parts.includes(x))) });
  return (
    <div className="mt-2 w-full max-w-xl space-y-3 rounded border border-stone-300 bg-white p-3 text-stone-800">
      <p>Every bundle holds the matrices, metrics.csv, networks.csv, CITATIONS.bib, a README and a datapackage.json describing each file.</p>
      <fieldset>
        <legend className="font-semibold">Also include</legend>
        <ul className="mt-1 space-y-1">
          {BUNDLE_PARTS.map((p) => (
            <li key={p} className="flex items-start gap-2">
              <input
                id={`${id}-${p}`}
                type="checkbox"
                className="mt-0.5 h-4 w-4 accent-moss-700"
                checked={choice.parts.includes(p)}
                onChange={(e) => toggle(p, e.target.checked)}
              />
              <label htmlFor={`${id}-${p}`}>
                <span className="font-semibold">{PART_LABELS[p].label}</span> <span className="text-stone-600">— {PART_LABELS[p].hint}</span>
              </label>
            </li>
          ))}
        </ul>
      </fieldset>
      <label className="flex flex-wrap items-center gap-1.5">
        <span className="font-semibold">Packing</span>
        <select
          className="rounded border border-stone-400 bg-white px-1.5 py-1 text-sm"
          value={choice.packing}
          onChange={(e) => onChange({ ...choice, packing: e.target.value as BundlePacking })}
        >
          <option value="fast">Uncompressed — quickest</option>
          <option value="small">Compressed — about a seventh of the size</option>
        </select>
      </label>
      <p className="text-xs text-stone-700">
        {choice.packing === "fast" ? "Sizes are estimates of the download." : "Sizes are estimated before compression; the download is smaller, and takes the server longer to pack."}
      </p>
    </div>
  );
}
