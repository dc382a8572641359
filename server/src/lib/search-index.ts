/**
 * Full-text search over the catalogue with lunr: titles, descriptions, keywords, creators, localities
 * (place names) and node names, one document per published network.
 *
 * A lunr index is immutable, and building it over every network takes seconds, so changes go to a small
 * "delta" index: when a dataset is published or withdrawn, its networks are marked stale in the main index
 * and its current documents are indexed in the delta (rebuilt, it is small). When the delta grows past a
 * threshold the main index is rebuilt. Each server process keeps its own index current (see
 * catalogue-events.ts: PostgreSQL LISTEN/NOTIFY, plus a lazy change check in the catalogue store).
 */
import lunr from "lunr";
import { loadSearchDocuments, type SearchDocument } from "../api/catalogue/catalogue.rows";

const FIELDS: Array<[keyof SearchDocument, number]> = [
  ["title", 4],
  ["name", 3],
  ["keywords", 3],
  ["locality", 3],
  ["creators", 2],
  ["nodes", 2],
  ["description", 1],
  ["accession", 5],
];

function build(docs: SearchDocument[]): lunr.Index {
  return lunr(function () {
    this.ref("networkId");
    for (const [f, boost] of FIELDS) this.field(f, { boost });
    // Node names and place names are not English prose: no stemming, keep stop words out only.
    this.pipeline.remove(lunr.stemmer);
    this.searchPipeline.remove(lunr.stemmer);
    for (const d of docs) {
      const clean: Record<string, string | number> = { networkId: d.networkId };
      for (const [f] of FIELDS) clean[f] = normalise(String(d[f]));
      this.add(clean);
    }
  });
}

/** Both documents and queries split on anything that is not a letter or digit ("Bombus_terrestris" → two words). */
function normalise(text: string): string {
  return text.toLowerCase().replace(/[^\p{L}\p{N}]+/gu, " ");
}

const STOP = lunr.stopWordFilter as unknown as (t: lunr.Token) => lunr.Token | undefined;

/** Splits a user's query into lunr terms (no query syntax: any text is accepted). */
export function queryTerms(q: string): string[] {
  return normalise(q)
    .split(" ")
    .filter((t) => t.length > 0 && STOP(new lunr.Token(t, {})) !== undefined)
    .slice(0, 12);
}

const DELTA_LIMIT = 500;

export class SearchIndex {
  private main: lunr.Index | null = null;
  private delta: lunr.Index | null = null;
  /** Documents of datasets changed since the main index was built, by dataset id. */
  private deltaDocs = new Map<number, SearchDocument[]>();
  /** Datasets whose main-index documents are out of date. */
  private staleDatasets = new Set<number>();
  /** Dataset of every network in the main index. */
  private mainDatasetOf = new Map<number, number>();
  private building: Promise<void> | null = null;
  builtAt: Date | null = null;
  lastBuildMs = 0;

  get ready(): boolean {
    return this.main !== null;
  }

  /** (Re)builds the main index from the database. Concurrent callers share one build. */
  rebuild(): Promise<void> {
    this.building ??= (async () => {
      try {
        const started = Date.now();
        const docs = await loadSearchDocuments();
        const mainDatasetOf = new Map<number, number>();
        for (const d of docs) mainDatasetOf.set(d.networkId, d.datasetId);
        this.main = build(docs);
        this.mainDatasetOf = mainDatasetOf;
        this.deltaDocs.clear();
        this.staleDatasets.clear();
        this.delta = null;
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
    let total = 0;
    for (const d of this.deltaDocs.values()) total += d.length;
    if (total > DELTA_LIMIT) {
      await this.rebuild();
      return;
    }
    this.delta = total ? build([...this.deltaDocs.values()].flat()) : null;
  }

  /**
   * Network ids matching every term of `q` (prefix match; a term may appear in any field), with lunr
   * scores. An empty query matches nothing (callers skip search then).
   */
  async search(q: string): Promise<Map<number, number>> {
    await this.ensure();
    const terms = queryTerms(q);
    const out = new Map<number, number>();
    if (!terms.length) return out;
    const run = (idx: lunr.Index) =>
      idx.query((query) => {
        for (const t of terms) {
          query.term(t, { presence: lunr.Query.presence.REQUIRED, wildcard: lunr.Query.wildcard.TRAILING, usePipeline: false });
        }
      });
    for (const hit of run(this.main!)) {
      const id = Number(hit.ref);
      const ds = this.mainDatasetOf.get(id);
      if (ds !== undefined && this.staleDatasets.has(ds)) continue;
      out.set(id, hit.score);
    }
    if (this.delta) for (const hit of run(this.delta)) out.set(Number(hit.ref), hit.score);
    return out;
  }

  /** Forgets everything (tests). */
  reset(): void {
    this.main = null;
    this.delta = null;
    this.deltaDocs.clear();
    this.staleDatasets.clear();
    this.mainDatasetOf.clear();
  }
}

/** The process's search index. */
export const searchIndex = new SearchIndex();
