/**
 * Catalogue search: filters, facet counts (each facet counted with every *other* filter applied, so a
 * reader sees how many networks each value would give), sorting and pagination, in one pass over the
 * in-memory catalogue.
 */
import { searchIndex, type SearchMode } from "./catalogue.search-index";
import type { CatalogueEntry } from "./catalogue.rows";
import { catalogueStore } from "./catalogue.store";
import { DEFAULT_CATALOGUE_NULL_MODEL, type CatalogueQuery, type Range, type SortKey } from "./catalogue.schemas";
import { NULL_MODELS } from "@shared/network/null-models/index";
import { CONTINENT_NAMES, continentOf } from "../../lib/continents";

const nullCountCache = new WeakMap<CatalogueEntry[], FacetValue[]>();

/** How many catalogue networks have figures of each null model (the reader's choice of the z column). */
function nullModelCounts(all: CatalogueEntry[]): FacetValue[] {
  const cached = nullCountCache.get(all);
  if (cached) return cached;
  const counts = new Map<string, number>();
  for (const e of all) for (const m of Object.keys(e.nulls)) counts.set(m, (counts.get(m) ?? 0) + 1);
  const out = NULL_MODELS.filter((m) => counts.has(m)).map((m) => ({ value: m, count: counts.get(m)! }));
  nullCountCache.set(all, out);
  return out;
}
import type { CatalogueFacets, CataloguePage, CatalogueRow, FacetValue, RangeFacet } from "@shared/types/catalogue";
import { NOT_RECORDED_FIELDS } from "@shared/validation/not-recorded";

export type { CatalogueFacets, CatalogueRow, FacetValue, RangeFacet };

/** The catalogue's figures of one null model for a network (null when its run did not compute that model). */
function nullOf(e: CatalogueEntry, model: string) {
  return e.nulls[model] ?? null;
}

export function toRow(e: CatalogueEntry, nullModel: string = DEFAULT_CATALOGUE_NULL_MODEL): CatalogueRow {
  const f = nullOf(e, nullModel);
  return {
    ref: e.ref,
    networkId: e.networkId,
    accession: e.accession,
    version: e.version,
    position: e.position,
    name: e.name,
    title: e.title,
    licence: e.licence,
    interactionType: e.interactionType,
    kind: e.kind,
    directed: e.directed,
    weighted: e.weighted,
    habitat: e.habitat,
    country: e.countryCode,
    placeName: e.placeName,
    startYear: e.startYear,
    endYear: e.endYear,
    S: e.nNodes,
    rows: e.nRows,
    cols: e.nCols,
    L: e.nLinks,
    C: e.connectance,
    Q: e.q,
    modules: e.modules,
    nullModel,
    z: f?.z ?? null,
    zSe: f?.zSe ?? null,
    qRel: f?.qRel ?? null,
    deltaQ: f?.deltaQ ?? null,
    p: f?.p ?? null,
    pAtFloor: f?.pAtFloor ?? false,
    nullN: f?.n ?? null,
    primaryNull: e.primaryNull,
    nodf: e.nodf,
    metricsStatus: e.runId ? "succeeded" : "none",
    currentSettings: e.runId ? e.currentSettings : null,
  };
}

/** How many matching networks have each field marked not recorded (fields with none are left out). */
function notRecordedFacet(matches: CatalogueEntry[]): FacetValue[] {
  const counts = new Map<string, number>(NOT_RECORDED_FIELDS.map((f) => [f, 0]));
  for (const e of matches) for (const f of e.notRecorded) counts.set(f, (counts.get(f) ?? 0) + 1);
  return [...counts].filter(([, c]) => c > 0).map(([value, count]) => ({ value, count }));
}

const CATEGORICAL = ["interactionType", "kind", "weighted", "habitat", "country", "licence", "continent"] as const;
type Categorical = (typeof CATEGORICAL)[number];
const RANGES = ["year", "nodes", "connectance", "Q", "z", "p", "latitude", "elevation"] as const;
type RangeName = (typeof RANGES)[number];

function categoryValue(e: CatalogueEntry, f: Categorical): string | null {
  switch (f) {
    case "interactionType":
      return e.interactionType;
    case "kind":
      return e.kind;
    case "weighted":
      return String(e.weighted);
    case "habitat":
      return e.habitat;
    case "country":
      return e.countryCode;
    case "licence":
      return e.licence;
    case "continent":
      return continentOf(e.countryCode);
  }
}

function rangeValue(e: CatalogueEntry, f: RangeName, model: string): number | null {
  switch (f) {
    case "nodes":
      return e.nNodes;
    case "connectance":
      return e.connectance;
    case "Q":
      return e.q;
    case "z":
      return nullOf(e, model)?.z ?? null;
    case "p":
      return nullOf(e, model)?.p ?? null;
    case "year":
      return e.startYear;
    case "latitude":
      return e.latitude;
    case "elevation":
      return e.elevation;
  }
}

/**
 * The catalogue as columns (built once per catalogue snapshot): categorical values as small integer
 * codes (0 = missing), numbers as Float64Arrays (NaN = missing). One pass over typed arrays then filters
 * and counts 10,000 networks in well under a millisecond.
 */
interface Columns {
  ids: Int32Array;
  values: string[][];
  codes: Uint16Array[];
  nums: Float64Array[];
  endYear: Float64Array;
  /** Public longitude (NaN when not recorded), for the area filter. */
  longitude: Float64Array;
}
const columnCache = new WeakMap<CatalogueEntry[], Map<string, Columns>>();

/** Columns of one catalogue snapshot with z and p of one null model (never a mix). */
function columnsOf(all: CatalogueEntry[], model: string): Columns {
  let perModel = columnCache.get(all);
  if (!perModel) columnCache.set(all, (perModel = new Map()));
  const cached = perModel.get(model);
  if (cached) return cached;
  const n = all.length;
  const values = CATEGORICAL.map(() => [""]);
  const lookup = CATEGORICAL.map(() => new Map<string, number>());
  const codes = CATEGORICAL.map(() => new Uint16Array(n));
  const nums = RANGES.map(() => new Float64Array(n));
  const endYear = new Float64Array(n);
  const longitude = new Float64Array(n);
  const ids = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const e = all[i];
    ids[i] = e.networkId;
    for (let c = 0; c < CATEGORICAL.length; c++) {
      const v = categoryValue(e, CATEGORICAL[c]);
      if (v === null) continue;
      let code = lookup[c].get(v);
      if (code === undefined) {
        code = values[c].length;
        values[c].push(v);
        lookup[c].set(v, code);
      }
      codes[c][i] = code;
    }
    for (let j = 0; j < RANGES.length; j++) nums[j][i] = rangeValue(e, RANGES[j], model) ?? NaN;
    endYear[i] = e.endYear ?? e.startYear ?? NaN;
    longitude[i] = e.longitude ?? NaN;
  }
  const cols = { ids, values, codes, nums, endYear, longitude };
  perModel.set(model, cols);
  return cols;
}

function sortValue(e: CatalogueEntry, key: SortKey, hits: Map<number, number> | null, model: string): string | number | null {
  switch (key) {
    case "accession":
      return null; // the base order
    case "title":
      return e.title.toLowerCase();
    case "type":
      return e.interactionType;
    case "S":
      return e.nNodes;
    case "C":
      return e.connectance;
    case "Q":
      return e.q;
    case "z":
      return nullOf(e, model)?.z ?? null;
    case "year":
      return e.startYear;
    case "relevance":
      return hits?.get(e.networkId) ?? 0;
  }
}

export interface MatchResult {
  /** The matches in the query's order (only the first `limit` when a limit was given). */
  matches: CatalogueEntry[];
  /** How many networks match. */
  total: number;
  facets: CatalogueFacets;
  /** How the search words matched (null without a search). */
  searchMatch: SearchMode | null;
}

const YEAR = RANGES.indexOf("year");
const LATITUDE = RANGES.indexOf("latitude");
const SEARCH_BIT = 1 << (CATEGORICAL.length + RANGES.length);
const AREA_BIT = SEARCH_BIT << 1;

/**
 * Every entry matching the query, in the requested order, with facet counts. `limit`: only the first
 * `limit` matches are needed (a page needs page × page size), which saves ordering the rest.
 */
export async function matchCatalogue(q: CatalogueQuery, opts: { limit?: number } = {}): Promise<MatchResult> {
  const all = await catalogueStore.entries();
  const found = q.q ? await searchIndex.search(q.q) : null;
  const hits = found?.hits ?? null;
  const cols = columnsOf(all, q.nullModel);
  // allowed[c][code] = 1 when the reader chose that value (null: no filter on c)
  const allowed = CATEGORICAL.map((f, c) => {
    const v = q[f];
    if (!v) return null;
    const a = new Uint8Array(cols.values[c].length);
    const chosen = new Set(v.map(String));
    cols.values[c].forEach((value, code) => {
      if (code > 0 && chosen.has(value)) a[code] = 1;
    });
    return a;
  });
  const ranges: Range[] = RANGES.map((r) => q[r]);
  const active = ranges.map((r) => r.min !== undefined || r.max !== undefined);
  const lo = ranges.map((r) => r.min ?? -Infinity);
  const hi = ranges.map((r) => r.max ?? Infinity);
  const counts = CATEGORICAL.map((_, c) => new Int32Array(cols.values[c].length));
  const rmin = RANGES.map(() => Infinity);
  const rmax = RANGES.map(() => -Infinity);
  const matchIdx: number[] = [];
  const n = all.length;
  // Column by column (tight, monomorphic loops): bit set = the network fails that filter.
  const mask = new Int32Array(n);
  for (let c = 0; c < CATEGORICAL.length; c++) {
    const a = allowed[c];
    if (a === null) continue;
    const codes = cols.codes[c];
    const bit = 1 << c;
    for (let i = 0; i < n; i++) if (a[codes[i]] !== 1) mask[i] |= bit;
  }
  for (let j = 0; j < RANGES.length; j++) {
    if (!active[j]) continue;
    const v = cols.nums[j];
    const bit = 1 << (CATEGORICAL.length + j);
    const l = lo[j];
    const h = hi[j];
    // year: the sampling years [start, end] overlap the range; missing values (NaN) never match a range
    if (j === YEAR) {
      const end = cols.endYear;
      for (let i = 0; i < n; i++) if (!(v[i] <= h && end[i] >= l)) mask[i] |= bit;
    } else {
      for (let i = 0; i < n; i++) if (!(v[i] >= l && v[i] <= h)) mask[i] |= bit;
    }
  }
  if (q.bbox) {
    // public coordinates inside the box (edges included); west > east: the box crosses the antimeridian
    const { west, south, east, north } = q.bbox;
    const lat = cols.nums[LATITUDE];
    const lon = cols.longitude;
    const wraps = west > east;
    for (let i = 0; i < n; i++) {
      const y = lat[i];
      const x = lon[i];
      const inLon = wraps ? x >= west || x <= east : x >= west && x <= east;
      if (!(y >= south && y <= north && inLon)) mask[i] |= AREA_BIT;
    }
  }
  if (hits !== null) {
    const ids = cols.ids;
    for (let i = 0; i < n; i++) if (!hits.has(ids[i])) mask[i] |= SEARCH_BIT;
  }
  const CAT_BITS = 1 << CATEGORICAL.length;
  for (let i = 0; i < n; i++) {
    const m = mask[i];
    if (m === 0) {
      matchIdx.push(i);
      for (let c = 0; c < CATEGORICAL.length; c++) counts[c][cols.codes[c][i]]++;
      for (let j = 0; j < RANGES.length; j++) {
        const v = cols.nums[j][i];
        if (v !== v) continue; // NaN
        if (v < rmin[j]) rmin[j] = v;
        const top = j === YEAR ? cols.endYear[i] : v;
        if (top > rmax[j]) rmax[j] = top;
      }
    } else if ((m & (m - 1)) === 0 && m < CAT_BITS) {
      // fails exactly one categorical filter: counts for that facet only
      const c = 31 - Math.clz32(m);
      counts[c][cols.codes[c][i]]++;
    }
  }
  const facetList = (c: number): FacetValue[] => {
    const out: FacetValue[] = [];
    for (let code = 1; code < counts[c].length; code++) {
      // values chosen by the reader stay listed even when the other filters leave none of them
      if (counts[c][code] > 0 || allowed[c]?.[code] === 1) out.push({ value: cols.values[c][code], count: counts[c][code] });
    }
    for (const v of q[CATEGORICAL[c]] ?? []) if (!out.some((f) => f.value === String(v))) out.push({ value: String(v), count: 0 });
    return out.sort((a, b) => b.count - a.count || (a.value < b.value ? -1 : 1));
  };
  const rf = (j: number): RangeFacet => (rmin[j] === Infinity ? { min: null, max: null } : { min: rmin[j], max: rmax[j] });
  const facets: CatalogueFacets = {
    interactionType: facetList(0),
    kind: facetList(1),
    weighted: facetList(2),
    habitat: facetList(3),
    country: facetList(4),
    licence: facetList(5),
    continent: facetList(6).map((f) => ({ ...f, label: CONTINENT_NAMES[f.value] ?? f.value })),
    year: rf(0),
    nodes: rf(1),
    connectance: rf(2),
    Q: rf(3),
    z: rf(4),
    notRecorded: [],
    p: rf(5),
    latitude: rf(6),
    elevation: rf(7),
    nullModel: q.nullModel,
    nullModels: nullModelCounts(all),
  };
  const matches = matchIdx.map((i) => all[i]);
  facets.notRecorded = notRecordedFacet(matches);
  const total = matches.length;
  const limit = Math.min(total, opts.limit ?? total);
  const searchMatch = found?.mode ?? null;
  if (q.sort === "accession" && q.order !== "desc") return { matches: limit < total ? matches.slice(0, limit) : matches, total, facets, searchMatch };
  return { matches: firstInOrder(matches, q, hits, limit), total, facets, searchMatch };
}

/**
 * The first `k` matches in the query's order: missing values always last whatever the direction, ties in
 * accession order (`matches` come in accession order). A page needs only the first page × size, so when k
 * is small a bounded heap keeps the k best instead of sorting every match (the same k, in the same order).
 */
function firstInOrder(matches: CatalogueEntry[], q: CatalogueQuery, hits: Map<number, number> | null, k: number): CatalogueEntry[] {
  const n = matches.length;
  const dir = q.order === "desc" ? -1 : 1;
  const keys = matches.map((e) => sortValue(e, q.sort, hits, q.nullModel));
  const byAccession = q.sort === "accession";
  // < 0 when match a comes before match b
  const cmp = (a: number, b: number): number => {
    const ka = keys[a];
    const kb = keys[b];
    if (ka === null && kb !== null) return 1;
    if (kb === null && ka !== null) return -1;
    if (ka !== null && kb !== null && ka !== kb) return (ka < kb ? -1 : 1) * dir;
    return byAccession ? (a - b) * dir : a - b;
  };
  let chosen: number[];
  if (k * 8 >= n) {
    chosen = Array.from({ length: n }, (_, i) => i).sort(cmp);
    if (k < n) chosen.length = k;
  } else {
    // max-heap on cmp: heap[0] is the last of the k best so far
    const heap: number[] = [];
    const down = (i: number) => {
      for (;;) {
        const l = 2 * i + 1;
        const r = l + 1;
        let m = i;
        if (l < heap.length && cmp(heap[l], heap[m]) > 0) m = l;
        if (r < heap.length && cmp(heap[r], heap[m]) > 0) m = r;
        if (m === i) return;
        [heap[i], heap[m]] = [heap[m], heap[i]];
        i = m;
      }
    };
    for (let i = 0; i < n; i++) {
      if (heap.length < k) {
        heap.push(i);
        for (let c = heap.length - 1; c > 0; ) {
          const p = (c - 1) >> 1;
          if (cmp(heap[c], heap[p]) <= 0) break;
          [heap[c], heap[p]] = [heap[p], heap[c]];
          c = p;
        }
      } else if (k > 0 && cmp(i, heap[0]) < 0) {
        heap[0] = i;
        down(0);
      }
    }
    chosen = heap.sort(cmp);
  }
  return chosen.map((i) => matches[i]);
}

/** Recent pages, keyed by the query and valid while the catalogue and search index are unchanged. */
const pageCache = new Map<string, { all: CatalogueEntry[]; generation: number; body: unknown }>();
const PAGE_CACHE_LIMIT = 200;

export async function searchCatalogue(q: CatalogueQuery) {
  const all = await catalogueStore.entries();
  const key = JSON.stringify(q);
  const hit = pageCache.get(key);
  if (hit && hit.all === all && hit.generation === searchIndex.generation) {
    pageCache.delete(key);
    pageCache.set(key, hit);
    return hit.body;
  }
  const generation = searchIndex.generation;
  const start = (q.page - 1) * q.pageSize;
  const { matches, total, facets, searchMatch } = await matchCatalogue(q, { limit: start + q.pageSize });
  const body: CataloguePage = {
    data: matches.slice(start, start + q.pageSize).map((e) => toRow(e, q.nullModel)),
    meta: { total, page: q.page, pageSize: q.pageSize, facets, searchMatch },
  };
  pageCache.set(key, { all, generation, body });
  if (pageCache.size > PAGE_CACHE_LIMIT) pageCache.delete(pageCache.keys().next().value!);
  return body;
}
