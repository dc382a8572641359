/** Download addresses of bundles (GET streams the zip; long selections go by POST instead). */
export const MAX_REFS_IN_URL = 300;

/** How the zip packs its files: "fast" stores them (the server's default), "small" deflates them. */
export type BundlePacking = "fast" | "small";

/** The optional parts of a bundle (the server's `include`), in the order the dialog lists them. */
export const BUNDLE_PARTS = ["partitions", "roles", "nulls", "edges", "originals"] as const;
export type BundlePart = (typeof BUNDLE_PARTS)[number];
/** What the server puts in a bundle when `include` is not given. */
export const DEFAULT_PARTS: readonly BundlePart[] = ["partitions", "roles", "nulls"];

export const PART_LABELS: Record<BundlePart, { label: string; hint: string }> = {
  partitions: { label: "Partitions", hint: "module of every node (partitions.csv)" },
  roles: { label: "Node roles", hint: "within-module degree z and participation P (roles.csv)" },
  nulls: { label: "Null distributions", hint: "Q of every null replicate with its model and seed (null_distribution.csv)" },
  edges: { label: "Edge lists", hint: "every link as source, target, weight (edges.csv)" },
  originals: { label: "Original files", hint: "the files as deposited, byte for byte (originals/)" },
};

export interface BundleChoice {
  packing: BundlePacking;
  parts: readonly BundlePart[];
}

export const DEFAULT_CHOICE: BundleChoice = { packing: "fast", parts: DEFAULT_PARTS };

/** The choice as request parameters (only what differs from the server's defaults). */
export function choiceParams(choice: BundleChoice): Record<string, string> {
  const out: Record<string, string> = {};
  if (choice.packing === "small") out.compression = "small";
  const parts = BUNDLE_PARTS.filter((p) => choice.parts.includes(p));
  if (parts.join(",") !== DEFAULT_PARTS.join(",")) out.include = parts.join(",");
  return out;
}

export function bundleUrlForFilter(filter: URLSearchParams, choice: BundleChoice = DEFAULT_CHOICE): string {
  const params = new URLSearchParams(filter);
  params.delete("compression");
  params.delete("include");
  for (const [k, v] of Object.entries(choiceParams(choice))) params.set(k, v);
  const q = params.toString();
  return `/api/v1/bundles${q ? `?${q}` : ""}`;
}

export function bundleUrlForRefs(refs: string[], choice: BundleChoice = DEFAULT_CHOICE): string {
  const extra = new URLSearchParams(choiceParams(choice)).toString();
  return `/api/v1/bundles?refs=${refs.map(encodeURIComponent).join(",")}${extra ? `&${extra}` : ""}`;
}

export function formatBytes(n: number): string {
  if (n < 1024 * 1024) return `${Math.max(1, Math.round(n / 1024))} kB`;
  if (n < 1024 * 1024 * 1024) return `${(n / 1024 / 1024).toFixed(n < 10 * 1024 * 1024 ? 1 : 0)} MB`;
  return `${(n / 1024 / 1024 / 1024).toFixed(1)} GB`;
}
