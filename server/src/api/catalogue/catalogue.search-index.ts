/**
 * Full-text search over the catalogue: titles, descriptions, keywords, creators, localities (place names)
 * and node names, one document per published network.
 *
 * Two structures, built from the same documents:
 * - a lunr index over the prose fields (title, description, keywords, creators, locality, network name,
 *   accession), with field boosts and lunr's relevance scores;
 * - an inverted index of node-name words (word → sorted network ids). Node names are most of the text
 *   (hundreds per network): in lunr they made a 10,000-network index take 27 s to build, ~0.7 GB of
 *   memory and about a second per query (measured by npm run bench:catalogue), while a plain inverted
 *   index builds in a fraction of a second and answers a prefix in microseconds.
 * A query's words must each match in some field or node name; the score is lunr's plus a constant per
 * node-name match. Whole words first: when networks contain every word of the query as a whole word, only
 * those are returned ("bee" does not bring "beetle"); otherwise each word is matched as a word beginning
 * (typing "pollin" finds "pollinator"), and the result says so (`mode: "prefix"`), so the page can tell
 * the reader. Per-word results are cached until the index changes.
 *
 * Both are immutable, so changes go to a small "delta" built from the changed datasets: when a dataset is
 * published or withdrawn its networks are marked stale in the main part and its current documents are
 * indexed in the delta. When the delta grows past a threshold the main part is rebuilt. Each server
 * process keeps its own index current (see catalogue.events.ts: PostgreSQL LISTEN/NOTIFY, plus a lazy
 * change check in the catalogue store).
 */
import lunr from "lunr";
import { loadSearchDocuments, type SearchDocument } from "./catalogue.rows";

const FIELDS: Array<[Exclude<keyof SearchDocument, "networkId" | "datasetId" | "nodes">, number]> = [
  ["title", 4],
  ["name", 3],
  ["keywords", 3],
  ["locality", 3],
  ["creators", 2],
  ["description", 1],
  ["accession", 5],
];
/** Score added for a word found among node names (lunr scores are of order 1–10). */
const NODE_SCORE = 1;

/** Documents and queries split on anything that is not a letter or digit ("Bombus_terrestris" → two words). */
function normalise(text: string): string {
  return text.toLowerCase().replace(/[^\p{L}\p{N}]+/gu, " ");
}

const STOP = lunr.stopWordFilter as unknown as (t: lunr.Token) => lunr.Token | undefined;

/** Splits a user's query into words (no query syntax: any text is accepted). */
export function queryTerms(q: string): string[] {
  return [...new Set(normalise(q).split(" ").filter((t) => t.length > 0 && STOP(new lunr.Token(t, {})) !== undefined))].slice(0, 12);
}

/** word → sorted network ids, with a sorted vocabulary for prefix lookups. */
class NodeWordIndex {
  private vocabulary: string[];
  private postings: Map<string, Uint32Array>;

  constructor(docs: SearchDocument[]) {
    const tmp = new Map<string, number[]>();
    for (const d of docs) {
      const seen = new Set<string>();
      for (const w of normalise(d.nodes).split(" ")) {
        if (!w || seen.has(w)) continue;
        seen.add(w);
        let list = tmp.get(w);
        if (!list) tmp.set(w, (list = []));
        list.push(d.networkId);
      }
    }
    this.postings = new Map();
    for (const [w, ids] of tmp) this.postings.set(w, Uint32Array.from(ids).sort());
    this.vocabulary = [...this.postings.keys()].sort();
  }

  /** Network ids having the node-name word `word`. */
  exact(word: string): Uint32Array {
    return this.postings.get(word) ?? new Uint32Array(0);
  }

  /** Network ids having a node-name word that starts with `prefix`. */
  match(prefix: string): Set<number> {
    const out = new Set<number>();
    let lo = 0;
    let hi = this.vocabulary.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (this.vocabulary[mid] < prefix) lo = mid + 1;
      else hi = mid;
    }
    for (let i = lo; i < this.vocabulary.length && this.vocabulary[i].startsWith(prefix); i++) {
      for (const id of this.postings.get(this.vocabulary[i])!) out.add(id);
    }
    return out;
  }
}

class IndexPart {
  readonly text: lunr.Index;
  readonly nodes: NodeWordIndex;

  constructor(docs: SearchDocument[]) {
    this.text = lunr(function () {
      this.ref("networkId");
      for (const [f, boost] of FIELDS) this.field(f, { boost });
      // Place and taxon names are not English prose: no stemming (stop words are still dropped).
      this.pipeline.remove(lunr.stemmer);
      this.searchPipeline.remove(lunr.stemmer);
      for (const d of docs) {
        const clean: Record<string, string | number> = { networkId: d.networkId };
        for (const [f] of FIELDS) clean[f] = normalise(String(d[f]));
        this.add(clean);
      }
    });
    this.nodes = new NodeWordIndex(docs);
  }

  /** Network ids matching one word in any field or node name, with scores: as a whole word or as a word beginning. */
  word(term: string, mode: SearchMode): Map<number, number> {
    const out = new Map<number, number>();
    const wildcard = mode === "prefix" ? lunr.Query.wildcard.TRAILING : lunr.Query.wildcard.NONE;
    const hits = this.text.query((q) => q.term(term, { wildcard, usePipeline: false }));
    for (const h of hits) out.set(Number(h.ref), h.score);
    for (const id of mode === "prefix" ? this.nodes.match(term) : this.nodes.exact(term)) out.set(id, (out.get(id) ?? 0) + NODE_SCORE);
    return out;
  }
}

/** How the query's words matched: as whole words, or (when no network has them all) as word beginnings. */
export type SearchMode = "words" | "prefix";

export interface SearchResult {
  /** network id → relevance score */
  hits: Map<number, number>;
  mode: SearchMode;
}

const DELTA_LIMIT = 500;
const CACHE_LIMIT = 1000;

export class SearchIndex {
  private main: IndexPart | null = null;
  private delta: IndexPart | null = null;
  /** Documents of datasets changed since the main part was built, by dataset id. */
  private deltaDocs = new Map<number, SearchDocument[]>();
  /** Datasets whose main-part documents are out of date. */
  private staleDatasets = new Set<number>();
  /** Dataset of every network in the main part. */
  private mainDatasetOf = new Map<number, number>();
  private building: Promise<void> | null = null;
  /** Per-word results of the current index (cleared on every change). */
  private cache = new Map<string, Map<number, number>>();
  private results = new Map<string, SearchResult>();
  builtAt: Date | null = null;
  lastBuildMs = 0;
  /** Changes whenever results may change (callers cache per generation). */
  generation = 0;

  get ready(): boolean {
    return this.main !== null;
  }

  /** (Re)builds the main part from the database. Concurrent callers share one build. */
  rebuild(): Promise<void> {
    this.building ??= (async () => {
      try {
        const started = Date.now();
        const docs = await loadSearchDocuments();
        const mainDatasetOf = new Map<number, number>();
        for (const d of docs) mainDatasetOf.set(d.networkId, d.datasetId);
        this.main = new IndexPart(docs);
        this.mainDatasetOf = mainDatasetOf;
        this.deltaDocs.clear();
        this.staleDatasets.clear();
        this.delta = null;
        this.cache.clear();
        this.results.clear();
        this.generation++;
        this.builtAt = new Date();
        this.lastBuildMs = Date.now() - started;
      } finally {
        this.building = null;
      }
    })();
    return this.building;
  }

  async ensure(): Promise<void> {
    if (!this.main) await this.rebuild();
  }

  /** Re-reads one dataset's current published networks (none if withdrawn or unpublished). */
  async refreshDataset(datasetId: number): Promise<void> {
    if (!this.main) return; // the first build will read it
    const docs = await loadSearchDocuments({ datasetIds: [datasetId] });
    this.staleDatasets.add(datasetId);
    this.deltaDocs.set(datasetId, docs);
    await this.afterDeltaChange();
  }

  /** Drops a dataset from search (e.g. on withdrawal). */
  async removeDataset(datasetId: number): Promise<void> {
    if (!this.main) return;
    this.staleDatasets.add(datasetId);
    this.deltaDocs.set(datasetId, []);
    await this.afterDeltaChange();
  }

  private async afterDeltaChange(): Promise<void> {
    this.cache.clear();
    this.results.clear();
    this.generation++;
    let total = 0;
    for (const d of this.deltaDocs.values()) total += d.length;
    if (total > DELTA_LIMIT) {
      await this.rebuild();
      return;
    }
    this.delta = total ? new IndexPart([...this.deltaDocs.values()].flat()) : null;
  }

  private word(term: string, mode: SearchMode): Map<number, number> {
    const key = mode + " " + term;
    const cached = this.cache.get(key);
    if (cached) {
      // keep recently used words at the end (least recently used are evicted first)
      this.cache.delete(key);
      this.cache.set(key, cached);
      return cached;
    }
    const out = new Map<number, number>();
    for (const [id, score] of this.main!.word(term, mode)) {
      const ds = this.mainDatasetOf.get(id);
      if (ds !== undefined && this.staleDatasets.has(ds)) continue;
      out.set(id, score);
    }
    if (this.delta) for (const [id, score] of this.delta.word(term, mode)) out.set(id, score);
    this.cache.set(key, out);
    if (this.cache.size > CACHE_LIMIT) this.cache.delete(this.cache.keys().next().value!);
    return out;
  }

  /** Network ids having every word of `terms` (in any field or node name), with summed scores. */
  private all(terms: string[], mode: SearchMode): Map<number, number> {
    const perWord = terms.map((t) => this.word(t, mode)).sort((a, b) => a.size - b.size);
    const out = new Map<number, number>();
    outer: for (const [id, score] of perWord[0]) {
      let total = score;
      for (let i = 1; i < perWord.length; i++) {
        const s = perWord[i].get(id);
        if (s === undefined) continue outer;
        total += s;
      }
      out.set(id, total);
    }
    return out;
  }

  /**
   * Network ids matching every word of `q`, with relevance scores: as whole words when any network has
   * them all, else as word beginnings (`mode` says which). An empty query matches nothing (callers skip
   * search then).
   */
  async search(q: string): Promise<SearchResult> {
    await this.ensure();
    const terms = queryTerms(q);
    if (!terms.length) return { hits: new Map(), mode: "words" };
    const key = [...terms].sort().join(" ");
    const cached = this.results.get(key);
    if (cached) return cached;
    const words = this.all(terms, "words");
    const result: SearchResult = words.size > 0 ? { hits: words, mode: "words" } : { hits: this.all(terms, "prefix"), mode: "prefix" };
    this.results.set(key, result);
    if (this.results.size > CACHE_LIMIT) this.results.delete(this.results.keys().next().value!);
    return result;
  }

  /** Forgets everything (tests). */
  reset(): void {
    this.main = null;
    this.delta = null;
    this.deltaDocs.clear();
    this.staleDatasets.clear();
    this.mainDatasetOf.clear();
    this.cache.clear();
    this.results.clear();
    this.generation++;
  }
}

/** The process's search index. */
export const searchIndex = new SearchIndex();
