/**
 * Networks selected in the catalogue, as network references ("TB-000042/v2/3"): kept across pages,
 * reloads and browser tabs until cleared (localStorage; another tab's change arrives by the `storage`
 * event, so every open catalogue shows the same selection).
 */
import { useCallback, useSyncExternalStore } from "react";

const KEY = "tanglebank.catalogue.selection";
const listeners = new Set<() => void>();
let cache: string[] | null = null;

function parse(raw: string | null): string[] {
  try {
    const v = raw ? (JSON.parse(raw) as unknown) : [];
    return Array.isArray(v) ? v.filter((x): x is string => typeof x === "string") : [];
  } catch {
    return [];
  }
}

function read(): string[] {
  if (cache) return cache;
  try {
    cache = parse(localStorage.getItem(KEY));
  } catch {
    cache = [];
  }
  return cache;
}

function notify(): void {
  for (const l of listeners) l();
}

function write(refs: string[]): void {
  cache = refs;
  try {
    if (refs.length) localStorage.setItem(KEY, JSON.stringify(refs));
    else localStorage.removeItem(KEY);
  } catch {
    // storage full or disabled: the selection lives as long as the page
  }
  notify();
}

/** Another tab changed the selection. */
function onStorage(e: StorageEvent): void {
  if (e.key !== KEY && e.key !== null) return;
  cache = parse(e.newValue);
  notify();
}

function subscribe(cb: () => void): () => void {
  if (!listeners.size && typeof window !== "undefined") window.addEventListener("storage", onStorage);
  listeners.add(cb);
  return () => {
    listeners.delete(cb);
    if (!listeners.size && typeof window !== "undefined") window.removeEventListener("storage", onStorage);
  };
}

export function useSelection() {
  const selected = useSyncExternalStore(subscribe, read, () => [] as string[]);
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
