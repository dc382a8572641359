/** Download addresses of bundles (GET streams the zip; long selections go by POST instead). */
export const MAX_REFS_IN_URL = 300;

/** How the zip packs its files: "fast" stores them (the server's default), "small" deflates them. */
export type BundlePacking = "fast" | "small";

export function bundleUrlForFilter(filter: URLSearchParams, packing: BundlePacking = "fast"): string {
  const params = new URLSearchParams(filter);
  params.delete("compression");
  if (packing === "small") params.set("compression", "small");
  const q = params.toString();
  return `/api/v1/bundles${q ? `?${q}` : ""}`;
}

export function bundleUrlForRefs(refs: string[], packing: BundlePacking = "fast"): string {
  return `/api/v1/bundles?refs=${refs.map(encodeURIComponent).join(",")}${packing === "small" ? "&compression=small" : ""}`;
}

export function formatBytes(n: number): string {
  if (n < 1024 * 1024) return `${Math.max(1, Math.round(n / 1024))} kB`;
  if (n < 1024 * 1024 * 1024) return `${(n / 1024 / 1024).toFixed(n < 10 * 1024 * 1024 ? 1 : 0)} MB`;
  return `${(n / 1024 / 1024 / 1024).toFixed(1)} GB`;
}
