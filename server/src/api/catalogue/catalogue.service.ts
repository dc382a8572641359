/**
 * Catalogue search: filters, facet counts (each facet counted with every *other* filter applied, so a
 * reader sees how many networks each value would give), sorting and pagination, in one pass over the
 * in-memory catalogue.
 */
import { searchIndex } from "../../lib/search-index";
import type { CatalogueEntry } from "./catalogue.rows";
import { catalogueStore } from "./catalogue.store";
import type { CatalogueQuery, Range, SortKey } from "./catalogue.validation";

export interface FacetValue {
  value: string;
  count: number;
}
export interface RangeFacet {
  min: number | null;
  max: number | null;
}
export interface CatalogueFacets {
  interactionType: FacetValue[];
  kind: FacetValue[];
  weighted: FacetValue[];
  habitat: FacetValue[];
  country: FacetValue[];
  licence: FacetValue[];
  year: RangeFacet;
  nodes: RangeFacet;
  connectance: RangeFacet;
  Q: RangeFacet;
  z: RangeFacet;
}

/** The public shape of a catalogue row. */
export interface CatalogueRow {
  ref: string;
  networkId: number;
  accession: string;
  version: number;
  position: number;
  name: string;
  title: string;
  licence: string;
  interactionType: string | null;
  kind: string;
  directed: boolean;
  weighted: boolean;
  habitat: string | null;
  country: string | null;
  placeName: string | null;
  startYear: number | null;
  endYear: number | null;
  S: number;
  rows: number | null;
  cols: number | null;
  L: number;
  C: number | null;
  Q: number | null;
  modules: number | null;
  z: number | null;
  qRel: number | null;
  p: number | null;
  nodf: number | null;
  metricsStatus: "succeeded" | "none";
}

export function toRow(e: CatalogueEntry): CatalogueRow {
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
    z: e.z,
    qRel: e.qRel,
    p: e.p,
    nodf: e.nodf,
    metricsStatus: e.runId ? "succeeded" : "none",
  };
}

const CATEGORICAL = ["interactionType", "kind", "weighted", "habitat", "country", "licence"] as const;
type Categorical = (typeof CATEGORICAL)[number];
const RANGES = ["year", "nodes", "connectance", "Q", "z"] as const;
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
  }
}

function inRange(v: number | null, r: Range): boolean {
  if (r.min === undefined && r.max === undefined) return true;
  if (v === null) return false;
  return (r.min === undefined || v >= r.min) && (r.max === undefined || v <= r.max);
}

function rangeValue(e: CatalogueEntry, f: RangeName): number | null {
  switch (f) {
    case "nodes":
      return e.nNodes;
    case "connectance":
      return e.connectance;
    case "Q":
      return e.q;
    case "z":
      return e.z;
    case "year":
      return e.startYear;
  }
}

/** Whether a network's sampling years overlap the requested year range. */
function yearMatches(e: CatalogueEntry, r: Range): boolean {
  if (r.min === undefined && r.max === undefined) return true;
  if (e.startYear === null) return false;
  const end = e.endYear ?? e.startYear;
  return (r.max === undefined || e.startYear <= r.max) && (r.min === undefined || end >= r.min);
}

/** Bit i set = the entry fails filter i (categorical filters first, then ranges, then search). */
function failMask(e: CatalogueEntry, q: CatalogueQuery, sets: Array<Set<string> | null>, hits: Map<number, number> | null): number {
  let mask = 0;
  for (let i = 0; i < CATEGORICAL.length; i++) {
    const s = sets[i];
    if (s && !s.has(categoryValue(e, CATEGORICAL[i]) ?? "")) mask |= 1 << i;
  }
  for (let j = 0; j < RANGES.length; j++) {
    const name = RANGES[j];
    const ok = name === "year" ? yearMatches(e, q.year) : inRange(rangeValue(e, name), q[name]);
    if (!ok) mask |= 1 << (CATEGORICAL.length + j);
  }
  if (hits && !hits.has(e.networkId)) mask |= 1 << (CATEGORICAL.length + RANGES.length);
  return mask;
}

function sortValue(e: CatalogueEntry, key: SortKey, hits: Map<number, number> | null): string | number | null {
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
      return e.z;
    case "year":
      return e.startYear;
    case "relevance":
      return hits?.get(e.networkId) ?? 0;
  }
}

export interface MatchResult {
  matches: CatalogueEntry[];
  facets: CatalogueFacets;
}

/** Every entry matching the query, in the requested order, with facet counts. */
export async function matchCatalogue(q: CatalogueQuery): Promise<MatchResult> {
  const all = await catalogueStore.entries();
  const hits = q.q ? await searchIndex.search(q.q) : null;
  const sets: Array<Set<string> | null> = CATEGORICAL.map((f) => {
    const v = q[f];
    return v ? new Set(v.map(String)) : null;
  });
  const counts = CATEGORICAL.map(() => new Map<string, number>());
  const ranges = RANGES.map(() => ({ min: Infinity, max: -Infinity }));
  const matches: CatalogueEntry[] = [];
  for (const e of all) {
    const mask = failMask(e, q, sets, hits);
    if (mask === 0) {
      matches.push(e);
      for (let j = 0; j < RANGES.length; j++) {
        const v = RANGES[j] === "year" ? e.startYear : rangeValue(e, RANGES[j]);
        if (v !== null) {
          if (v < ranges[j].min) ranges[j].min = v;
          const hi = RANGES[j] === "year" ? (e.endYear ?? v) : v;
          if (hi > ranges[j].max) ranges[j].max = hi;
        }
      }
    }
    for (let i = 0; i < CATEGORICAL.length; i++) {
      if ((mask & ~(1 << i)) !== 0) continue;
      const v = categoryValue(e, CATEGORICAL[i]);
      if (v === null) continue;
      counts[i].set(v, (counts[i].get(v) ?? 0) + 1);
    }
  }
  // Values chosen by the reader stay listed even when the other filters leave none of them.
  const facetList = (i: number): FacetValue[] => {
    for (const v of sets[i] ?? []) if (!counts[i].has(v)) counts[i].set(v, 0);
    return [...counts[i].entries()]
      .map(([value, count]) => ({ value, count }))
      .sort((a, b) => b.count - a.count || (a.value < b.value ? -1 : 1));
  };
  const rf = (j: number): RangeFacet => (ranges[j].min === Infinity ? { min: null, max: null } : { min: ranges[j].min, max: ranges[j].max });
  const facets: CatalogueFacets = {
    interactionType: facetList(0),
    kind: facetList(1),
    weighted: facetList(2),
    habitat: facetList(3),
    country: facetList(4),
    licence: facetList(5),
    year: rf(0),
    nodes: rf(1),
    connectance: rf(2),
    Q: rf(3),
    z: rf(4),
  };

  if (q.sort !== "accession" || q.order === "desc") {
    const dir = q.order === "desc" ? -1 : 1;
    const base = new Map(matches.map((e, i) => [e.networkId, i]));
    const keyed = matches.map((e) => ({ e, k: sortValue(e, q.sort, hits) }));
    keyed.sort((a, b) => {
      // Missing values always last, whatever the direction; ties keep accession order.
      if (a.k === null && b.k !== null) return 1;
      if (b.k === null && a.k !== null) return -1;
      if (a.k !== null && b.k !== null && a.k !== b.k) return (a.k < b.k ? -1 : 1) * dir;
      const d = base.get(a.e.networkId)! - base.get(b.e.networkId)!;
      return q.sort === "accession" ? d * dir : d;
    });
    return { matches: keyed.map((x) => x.e), facets };
  }
  return { matches, facets };
}

export async function searchCatalogue(q: CatalogueQuery) {
  const { matches, facets } = await matchCatalogue(q);
  const start = (q.page - 1) * q.pageSize;
  return {
    data: matches.slice(start, start + q.pageSize).map(toRow),
    meta: { total: matches.length, page: q.page, pageSize: q.pageSize, facets },
  };
}
