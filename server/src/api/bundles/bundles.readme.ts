/**
 * README.txt of a bundle: what is in it and how every metric was computed (formulas with sources, the
 * objective, optimizer, restarts, null model, replicates, seed, engine version) and the cautions a reader
 * needs before comparing networks. Formulas follow shared/network/README.md.
 */
import type { PipelineSettings } from "../../../../shared/types/pipeline";
import { nullModelsText } from "../../jobs/settings";

export interface ReadmeInput {
  settings: PipelineSettings;
  settingsHash: string;
  engineVersion: string;
  count: number;
  generated: Date;
  publicUrl: string;
  title: string;
  /** How the zip was packed (compression=fast|small); omitted: not said. */
  compression?: "fast" | "small";
}

export function bundleReadme(r: ReadmeInput): string {
  const s = r.settings;
  const objective =
    s.objective === "auto"
      ? "auto: Barber's bipartite modularity Q_B for bipartite networks, Leicht–Newman directed modularity for directed one-mode networks, Newman–Girvan Q otherwise"
      : s.objective;
  const nullModel = nullModelsText(s);
  return `Tanglebank bundle — ${r.title}
Generated ${r.generated.toISOString()} from ${r.publicUrl}
${r.count} network${r.count === 1 ? "" : "s"}.

FILES
  datapackage.json   Frictionless Data Package: one resource per file, with licences, sources and a
                     Table Schema (column names and types) for every CSV.
  networks/*.csv     One matrix per network, named ACCESSION_vVERSION_NETWORK.csv. Bipartite: rows are
                     the lower level (e.g. plants), columns the higher level (e.g. pollinators); one-mode:
                     a square matrix, a link from row to column. First column "node" holds the row
                     labels; cells are weights (0 = no link).
  metrics.csv        One row per network: accession, version, network, kind, S, I, J, L, C, Q, modules,
                     objective, null model, replicates, null mean, sd, z, Q_rel, p, NODF, algorithm, seed.
                     Empty cells: not computed (e.g. a network without links, or metrics still pending).
  networks.csv       Network metadata (interaction type, habitat, locality, dates, sampling). Coordinates
                     are the public ones: sensitive sites are rounded to the grid their curator chose
                     (column coordinate_generalisation).
  CITATIONS.bib      One BibTeX entry per dataset version. Please cite every dataset you use.
${
  r.compression === "fast"
    ? `
  The files are stored uncompressed (compression=fast, the default): the zip is about seven times larger
  than a deflated one, but the server sends it about three times as fast. On a slow connection ask for
  compression=small (deflated) instead.
`
    : r.compression === "small"
      ? `
  The files are deflated (compression=small): about a seventh of the size of compression=fast (the
  default), which sends stored files about three times as fast.
`
      : ""
}
HOW THE METRICS WERE COMPUTED
  Engine: ${r.engineVersion}. Pipeline settings hash: ${r.settingsHash}
  (the hash of the settings below plus the engine version; every metric row names the hash of its run).

  S  number of nodes (bipartite S = I + J, I rows, J columns); L number of links (non-zero cells; an
     undirected one-mode link counted once).
  C  connectance. Bipartite C = L/(I·J); directed one-mode C = L/S² (cannibal links counted);
     undirected one-mode C = 2L'/(S(S−1)), L' the links that are not self-loops (Martinez 1992, Am Nat
     139:1208).
  Q  modularity of the best partition found, with the objective
       ${objective}.
     Newman–Girvan: Q = (1/2m) Σ_ij [A_ij − k_i k_j / 2m] δ(c_i, c_j) (Newman & Girvan 2004, Phys Rev E
     69:026113; weighted: Newman 2004, Phys Rev E 70:056131).
     Leicht–Newman: Q_d = (1/m) Σ_ij [A_ij − k_i^out k_j^in / m] δ(c_i, c_j) (Phys Rev Lett 100:118703).
     Barber: Q_B = (1/m) Σ_ij [A_ij − k_i d_j / m] δ(c_i, c_j) over rows i and columns j (Barber 2007,
     Phys Rev E 76:066102). Weighted networks use the weights (m = total weight).
  Optimizer: Leiden-style local moving, refinement and aggregation (Traag, Waltman & van Eck 2019, Sci Rep
     9:5233), ${s.restarts} seeded restarts keeping the best, then simulated annealing (Guimerà & Amaral
     2005, Nature 433:895) when annealing is "${s.annealing}" (auto: networks of at most 200 linked
     nodes), kept only when it raises Q. Seed ${s.seed}; restart r and null replicate r use seeds derived
     from it, so the same data, settings and engine version give the same partition on any machine.
  Significance: ${s.nulls} null replicates from the null model
       ${nullModel},
     each optimized with the same settings. null mean and sd (n − 1) of their Q;
     z = (Q − mean)/sd; Q_rel = (Q − mean)/mean; p = (1 + #{Q_null ≥ Q})/(n + 1).
  NODF: nestedness by overlap and decreasing fill, 0–100 (Almeida-Neto et al. 2008, Oikos 117:1227).

CAUTIONS
  - Raw Q is not comparable across networks of different size, connectance and sampling effort: compare
    z or Q_rel, and read them together with S, C and the sampling effort in networks.csv.
  - The optimizer is heuristic: near-equal partitions can differ between settings or engine versions
    while Q barely changes. Module membership of single nodes is the least stable part.
  - z is unstable when the null sd is near zero (very small or very dense networks).
  - Different objectives (Barber vs Newman–Girvan) give different numbers for the same network; compare
    only rows with the same objective.
  - Metrics are those of the current pipeline settings at the time of download; older runs remain on
    each network's page for provenance.
`;
}
