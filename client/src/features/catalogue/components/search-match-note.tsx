/**
 * Said above the results when the search found no network holding every word whole, so the results match
 * word beginnings instead (the API's `searchMatch: "prefix"`).
 */
export function SearchPrefixNote({ q }: { q: string }) {
  const several = q.trim().split(/\s+/).length > 1;
  return (
    <p role="note" className="rounded border border-lichen-600 bg-lichen-300/40 px-3 py-2 text-sm text-stone-900" data-testid="search-prefix-note">
      {several ? (
        <>
          No network has all of “{q}” as whole words, so these are the networks with words that <em>begin</em> with each of yours.
        </>
      ) : (
        <>
          No network has the whole word “{q}”, so these are the networks with a word that <em>begins</em> with it.
        </>
      )}
    </p>
  );
}
