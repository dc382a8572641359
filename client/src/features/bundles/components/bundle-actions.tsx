/**
 * "Bundle selection" and "Bundle everything matching": the number of networks and the estimated size are
 * shown before the download starts, with a choice of packing (files stored: quickest; or deflated: about a
 * seventh of the size). Downloads are ordinary links (the browser streams the zip to disk);
 * a selection too long for a link is posted and saved from memory instead.
 */
import { useState } from "react";
import { ApiClientError } from "../../../lib/api-client";
import { useBundleEstimate } from "../api/estimate-bundle";
import { MAX_REFS_IN_URL, bundleUrlForFilter, bundleUrlForRefs, formatBytes, type BundlePacking } from "../utils/bundle-url";

const linkLook = "inline-flex items-center rounded bg-moss-700 px-3 py-1.5 text-sm font-semibold text-white hover:bg-moss-600";
const disabledLook = "inline-flex items-center rounded bg-stone-300 px-3 py-1.5 text-sm font-semibold text-stone-700 cursor-not-allowed";

async function downloadByPost(refs: string[], compression: BundlePacking): Promise<void> {
  const { csrf } = await fetch("/api/v1/auth/session", { credentials: "same-origin" }).then(async (r) => ({ csrf: ((await r.json()) as { csrfToken: string }).csrfToken }));
  const res = await fetch("/api/v1/bundles", { method: "POST", credentials: "same-origin", headers: { "content-type": "application/json", "x-csrf-token": csrf }, body: JSON.stringify({ refs, compression }) });
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

export function BundleActions({ selected, filter, total }: { selected: string[]; filter: URLSearchParams; total: number }) {
  const filterObj = Object.fromEntries(filter.entries());
  const everything = useBundleEstimate({ filter: filterObj }, total > 0);
  const chosen = useBundleEstimate({ refs: selected }, selected.length > 0);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [packing, setPacking] = useState<BundlePacking>("fast");
  const est = everything.data;
  const sel = chosen.data;

  return (
    <div className="flex flex-wrap items-center gap-3">
      {selected.length > 0 &&
        (selected.length <= MAX_REFS_IN_URL ? (
          <a className={linkLook} href={bundleUrlForRefs(selected, packing)} download>
            Bundle selection ({selected.length}
            {sel ? `, ~${formatBytes(sel.estimatedBytes)}` : ""})
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
              downloadByPost(selected, packing)
                .catch((e: Error) => setError(e.message))
                .finally(() => setBusy(false));
            }}
          >
            {busy ? "Preparing bundle…" : `Bundle selection (${selected.length}${sel ? `, ~${formatBytes(sel.estimatedBytes)}` : ""})`}
          </button>
        ))}
      {total > 0 &&
        (est?.overLimit ? (
          <span className={disabledLook} aria-disabled="true" title={`A bundle holds at most ${est.limit.toLocaleString("en")} networks`}>
            Everything matching: {est.count.toLocaleString("en")} networks is over the {est.limit.toLocaleString("en")} limit — narrow the filters
          </span>
        ) : (
          <a className={linkLook} href={bundleUrlForFilter(filter, packing)} download>
            Bundle everything matching ({total.toLocaleString("en")} network{total === 1 ? "" : "s"}
            {est ? `, ~${formatBytes(est.estimatedBytes)}` : ""})
          </a>
        ))}
      <label className="flex items-center gap-1.5 text-sm text-stone-800">
        Packing
        <select className="rounded border border-stone-400 bg-white px-1.5 py-1 text-sm" value={packing} onChange={(e) => setPacking(e.target.value as BundlePacking)}>
          <option value="fast">Uncompressed — quickest</option>
          <option value="small">Compressed — about a seventh of the size</option>
        </select>
      </label>
      <span className="text-xs text-stone-700">
        {packing === "fast" ? "Sizes are estimates of the download." : "Sizes are estimated before compression; the download is smaller, and takes the server longer to pack."}
      </span>
      {error && (
        <p role="alert" className="text-sm font-semibold text-red-800">
          {error}
        </p>
      )}
    </div>
  );
}
