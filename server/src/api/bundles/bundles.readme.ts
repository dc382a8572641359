/**
 * README.txt of a bundle: what is in it and how every metric was computed (formulas with sources, the
 * objective, optimizer, restarts, null model, replicates, seed, engine version) and the cautions a reader
 * needs before comparing networks. Formulas follow shared/network/README.md.
 */
import type { PipelineSettings } from "@shared/types/pipeline";
import { nullModelGlossary, nullModelsText } from "../../pipeline/settings";
import { BUNDLE_PARTS, DEFAULT_PARTS, type BundlePart } from "./bundles.parts";
import { FIGURE_CAUTIONS, NODF_CAUTION, RESOLUTION_LIMIT_CAUTION } from "@shared/figures/cautions";

const wrap = (text: string, indent: string, width = 100): string => {
  const words = text.split(/\s+/);
  const lines: string[] = [];
  let line = "";
  for (const w of words) {
    if (line && (indent + line + " " + w).length > width) {
      lines.push(indent + line);
      line = w;
    } else line = line ? `${line} ${w}` : w;
  }
  if (line) lines.push(indent + line);
  return lines.join("\n");
};

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
  /** The optional parts this bundle holds (default DEFAULT_PARTS). */
  parts?: ReadonlySet<BundlePart>;
}

const PART_TEXT: Record<BundlePart, string> = {
  partitions: `  partitions.csv     The best partition of every network with current metrics: network_ref, objective,
                     node, side (row, column, or node for one-mode networks), module (0, 1, …; network
                     pages show module + 1). Q recomputed from it with the formula below is the Q of
                     metrics.csv.`,
  roles: `  roles.csv          Node roles in that partition: network_ref, node, side, module, degree, within-module
                     degree z, participation coefficient P, role (peripheral, connector, module-hub,
                     network-hub; thresholds z = 2.5, P = 0.62, Olesen et al. 2007, PNAS 104:19891).`,
  nulls: `  null_distribution.csv
                     Every null replicate behind null_mean, null_sd, z, Q_rel and p: network_ref,
                     null_model, replicate r, seed (the run's), replicate_seed (the seed of the replicate's
                     generator, derived from seed and r) and its optimised Q; every null model the
                     pipeline computed, the primary one first. The primary model's mean and sd (n − 1) are
                     metrics.csv's null_mean and null_sd.`,
  edges: `  edges.csv          Every link of every network as an edge list: network_ref, source (row node), target
                     (column node), weight (1 in binary networks). An undirected one-mode link appears once.`,
  originals: `  originals/         The files as their depositors uploaded them, byte for byte, in originals/ACCESSION_vVERSION_NETWORK/
                     (datapackage.json gives each one's SHA-256).`,
};

function partsText(parts: ReadonlySet<BundlePart>): string {
  const chosen = BUNDLE_PARTS.filter((p) => parts.has(p));
  const left = BUNDLE_PARTS.filter((p) => !parts.has(p));
  return [
    ...chosen.map((p) => PART_TEXT[p]),
    `  (Optional parts ${chosen.length ? `in this bundle: ${chosen.join(", ")}` : "in this bundle: none"}${left.length ? `; left out: ${left.join(", ")}` : ""}. Choose them with
   include=${BUNDLE_PARTS.join(",")} — without include a bundle holds ${DEFAULT_PARTS.join(", ")}.)`,
  ].join("\n");
}

export function bundleReadme(r: ReadmeInput): string {
  const s = r.settings;
  const objective =
    s.objective === "auto"
      ? "auto: Barber's bipartite modularity Q_B for bipartite networks, Leicht–Newman directed modularity for directed one-mode networks, Newman–Girvan Q otherwise"
      : s.objective;
  return `Tanglebank bundle — ${r.title}
Generated ${r.generated.toISOString()} from ${r.publicUrl}
${r.count} network${r.count === 1 ? "" : "s"}.

FILES
  datapackage.json   Frictionless Data Package: one resource per file, with licences, sources and a
                     Table Schema (column names and types) for every CSV.
  networks/*.csv     One matrix per network, named ACCESSION_vVERSION_NETWORK.csv (see MATRIX CSV below).
  metrics.csv        One row per network: network_ref, accession, version, network, kind, S, I, J, L, C,
                     Q, modules, objective, primary_null_model, then one explicit column set per null
                     model, named with the model: MODEL_n, MODEL_mean, MODEL_sd, MODEL_z, MODEL_z_se,
                     MODEL_Q_rel, MODEL_delta_Q, MODEL_p, MODEL_p_at_floor (e.g. curveball_z, er_p) — a
                     column never mixes null models; then NODF, algorithm, seed, settings hash,
                     settings_current. Empty cells: not computed (a model outside the network's standard
                     set, a network without links, or metrics still pending).
  networks.csv       Network metadata (interaction type, what the row and column nodes are, habitat,
                     locality, dates, sampling). Coordinates are the public ones: sensitive sites are
                     rounded to the grid their curator chose (column coordinate_generalisation), and
                     their elevation with it (to 50, 100 or 500 m for the 0.01, 0.1 and 1 degree grids).
                     Fields a depositor did not know (coordinates, elevation, dates, habitat, sampling
                     effort) are empty, never invented, and the column not_recorded says which and why
                     (habitat then reads "not recorded").
${partsText(r.parts ?? new Set(DEFAULT_PARTS))}
  CITATIONS.bib      A BibTeX @dataset entry for every dataset version, and an entry for the publication
                     its data come from when the depositor named one (linked by the field "related").
                     Please cite every dataset you use, and its source publication.

  Every table about networks starts with network_ref (e.g. TB-000042/v2/3: accession, version, network
  number), the key that joins metrics.csv, networks.csv and the other tables.

MATRIX CSV (the same in this bundle and in the API's data.csv)
  The header's first cell is "node"; the rest of the header names the column nodes. Each further line is
  one row node: its label, then one cell per column node holding the link's weight (0 = no link; 1 for a
  link of a binary network). Labels holding a comma, a quote, a line break or outer spaces are quoted
  (RFC 4180); lines end with a line feed; the text is UTF-8.
  Bipartite networks: the row nodes are one side of the network and the column nodes the other; what they
  are in each network (e.g. plants and pollinators, hosts and parasitoids) is in networks.csv, columns
  row_nodes and column_nodes. One-mode networks (food webs): a square matrix with the same nodes as rows
  and columns, a link going from the row node to the column node; an undirected network is symmetric.
  Labels are exactly as deposited. A label that begins like a spreadsheet formula (=, +, -, @) may be run
  as one if a CSV file is opened in a spreadsheet program: import the files as text (or read them with a
  script), or download a network's CSV with spreadsheetSafe=true, which writes such labels with a leading
  apostrophe and leaves everything else unchanged.
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
  Significance: ${s.nulls} null replicates from each null model of
${wrap(nullModelsText(s), "       ")},
     each optimized with the same settings. Replicate r draws its null network from a generator seeded
     with replicate_seed = derive(seed, "null", r) (shared/network/random.ts of the engine; the same r for
     every null model). MODEL_mean and MODEL_sd (n − 1) of their Q;
     z = (Q − mean)/sd with Monte Carlo error z_se = sqrt(1/n + z²/(2(n − 1))); Q_rel = (Q − mean)/mean;
     ΔQ = Q − mean; p = (1 + #{Q_null ≥ Q})/(n + 1); when no null reaches Q (p_at_floor), p is the floor
     1/(n + 1) of n nulls: read it as p ≤ that value. Null networks are the same kind of object as the
     observed one (weighted data: the observed weights shuffled over the null's links).
  Null models (what each keeps and does not):
${nullModelGlossary().map((g) => wrap(g, "     ")).join("\n")}
  NODF: nestedness by overlap and decreasing fill, 0–100 (Almeida-Neto et al. 2008, Oikos 117:1227).

CAUTIONS
${FIGURE_CAUTIONS.map((c) => wrap(c, "    ").replace(/^ {4}/, "  - ")).join("\n")}
${wrap(RESOLUTION_LIMIT_CAUTION, "    ").replace(/^ {4}/, "  - ")}
${wrap(NODF_CAUTION, "    ").replace(/^ {4}/, "  - ")}
  - The optimizer is heuristic: near-equal partitions can differ between settings or engine versions
    while Q barely changes. Module membership of single nodes is the least stable part.
  - z is unstable when the null sd is near zero (very small or very dense networks).
  - Different objectives (Barber vs Newman–Girvan) give different numbers for the same network; compare
    only rows with the same objective.
  - Metrics are those of the current pipeline settings at the time of download; a network whose newer
    run failed or is pending keeps its last successful figures (settings_current = false names them).
    Every run stays in each network's run history on its page.
`;
}
