/**
 * What the compare view's "Add" field accepts: a network (TB-000042/v2/3), a whole dataset version
 * (TB-000042/v2) or its latest published version (TB-000042), or a collection (TBC-000007, optionally at a
 * revision: TBC-000007?revision=2) — written bare or pasted as a page address of this site.
 */
export type CompareInput =
  | { kind: "network"; ref: string }
  | { kind: "dataset"; accession: string; version: number | null }
  | { kind: "collection"; code: string; revision: number | null };

export { MAX_COMPARE } from "@shared/types/network-view";

export function parseCompareInput(raw: string): CompareInput | null {
  const s = raw.trim();
  if (!s) return null;
  let path = s;
  let revision: number | null = null;
  // a pasted page address: keep its path (and a collection's revision)
  if (/^https?:\/\//i.test(s)) {
    try {
      const u = new URL(s);
      path = decodeURIComponent(u.pathname).replace(/\/+$/, "");
      const r = u.searchParams.get("revision");
      if (r && /^\d{1,6}$/.test(r)) revision = Number(r);
    } catch {
      return null;
    }
  } else {
    const m = /^(.*?)\?revision=(\d{1,6})$/.exec(s);
    if (m) {
      path = m[1];
      revision = Number(m[2]);
    }
  }
  let m = /(?:^|\/datasets\/)(TB-\d{6})(?:\/v\/?(\d{1,6}))?(?:\/networks\/|\/)(\d{1,6})$/.exec(path);
  if (m && m[2]) return { kind: "network", ref: `${m[1]}/v${m[2]}/${m[3]}` };
  m = /^(TB-\d{6})\/v(\d{1,6})\/(\d{1,6})$/.exec(path);
  if (m) return { kind: "network", ref: `${m[1]}/v${m[2]}/${m[3]}` };
  m = /(?:^|\/datasets\/)(TB-\d{6})(?:\/v\/?(\d{1,6}))?$/.exec(path);
  if (m) return { kind: "dataset", accession: m[1], version: m[2] ? Number(m[2]) : null };
  m = /(?:^|\/collections\/)(TBC-\d{6})$/.exec(path);
  if (m) return { kind: "collection", code: m[1], revision };
  return null;
}

/** `refs` with `more` appended (no duplicates), and which of `more` were new. */
export function mergeRefs(refs: string[], more: string[]): { next: string[]; added: string[] } {
  const have = new Set(refs);
  const added: string[] = [];
  for (const r of more) {
    if (have.has(r)) continue;
    have.add(r);
    added.push(r);
  }
  return { next: [...refs, ...added], added };
}
