/**
 * DOIs as people paste them: `10.1234/abc`, `doi:10.1234/abc`, `https://doi.org/10.1234/abc` (or the older
 * dx.doi.org resolver, http or https, URL-encoded). Stored in one form: the bare `10.prefix/suffix`, as the
 * study schema's `publication.doi` pattern wants it.
 */
const RESOLVER = /^(?:https?:\/\/)?(?:dx\.)?doi\.org\//i;
const PREFIX = /^doi:\s*/i;

/** The bare DOI for any accepted form; other text is returned trimmed, unchanged (the schema then names it). */
export function normaliseDoi(raw: string): string {
  let s = raw.trim();
  if (PREFIX.test(s)) s = s.replace(PREFIX, "");
  else if (RESOLVER.test(s)) {
    s = s.replace(RESOLVER, "");
    if (/%[0-9a-f]{2}/i.test(s)) {
      try {
        s = decodeURIComponent(s);
      } catch {
        /* keep it as typed; the schema reports it */
      }
    }
  }
  return /^10\.\d{4,9}\/\S+$/.test(s) ? s : raw.trim();
}

/** Study metadata with its publication DOI normalised (a copy; other fields untouched). */
export function withNormalisedDoi<T>(meta: T): T {
  if (!meta || typeof meta !== "object" || Array.isArray(meta)) return meta;
  const pub = (meta as Record<string, unknown>).publication;
  if (!pub || typeof pub !== "object" || typeof (pub as Record<string, unknown>).doi !== "string") return meta;
  const doi = normaliseDoi((pub as Record<string, string>).doi);
  return { ...meta, publication: { ...(pub as object), doi } } as T;
}
