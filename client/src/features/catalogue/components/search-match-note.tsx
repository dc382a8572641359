/** Said when the search found no network holding every word whole, so the results match word beginnings. */
export function SearchPrefixNote({ q }: { q: string }) {
  return (
    <p className="text-sm text-stone-700" data-testid="search-prefix-note">
      No network has every word of “{q}” as a whole word, so these match words that <em>begin</em> with
      yours (e.g. “pollin” finds “pollinator”).
    </p>
  );
}
