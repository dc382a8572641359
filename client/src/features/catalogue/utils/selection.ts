/**
 * Networks selected in the catalogue, kept across pages and reloads of the tab (sessionStorage), as
 * network references ("TB-000042/v2/3").
 */
import { useCallback, useSyncExternalStore } from "react";

const KEY = "tanglebank.catalogue.selection";
const listeners = new Set<() => void>();
let cache: string[] | null = null;

function read(): string[] {
  if (cache) return cache;
  try {
    const raw = sessionStorage.getItem(KEY);
    const v = raw ? (JSON.parse(raw) as unknown) : [];
    cache = Array.isArray(v) ? v.filter((x): x is string => typeof x === "string") : [];
  } catch {
    cache = [];
  }
  return cache;
}

function write(refs: string[]): void {
  cache = refs;
  try {
    sessionStorage.setItem(KEY, JSON.stringify(refs));
  } catch {
    // storage full or disabled: the selection lives as long as the page
  }
  for (const l of listeners) l();
}

export function useSelection() {
  const selected = useSyncExternalStore(
    (cb) => {
      listeners.add(cb);
      return () => listeners.delete(cb);
    },
    read,
    () => [] as string[],
  );
  const toggle = useCallback((ref: string) => {
    const cur = read();
    write(cur.includes(ref) ? cur.filter((r) => r !== ref) : [...cur, ref]);
  }, []);
  const setMany = useCallback((refs: string[], on: boolean) => {
    const cur = read();
    if (on) write([...cur, ...refs.filter((r) => !cur.includes(r))]);
    else write(cur.filter((r) => !refs.includes(r)));
  }, []);
  const clear = useCallback(() => write([]), []);
  return { selected, toggle, setMany, clear };
}
