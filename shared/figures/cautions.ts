/**
 * What each significance figure controls for and what it does not, and the resolution-limit caution: the
 * one wording shown by the pages, the catalogue, the compare view, the API documentation, the bundle
 * README and the command-line tool, so the advice is the same everywhere (pure text, no imports).
 */

/** One sentence per figure: what it controls for, what it does not. */
export const FIGURE_CAUTIONS: readonly string[] = [
  "Raw Q depends on network size, connectance, sampling effort and the objective (Barber's Q_B and Newman–Girvan Q are different numbers).",
  "z, Q_rel, ΔQ and p compare Q with one null model, named beside them: they control for what that model keeps (fixed degrees: size, connectance and every degree) and for nothing else.",
  "None of them is free of size: for the same generating process z and Q_rel grow with the number of nodes (in Tanglebank's significance benchmark, planted modules drawn the same way gave a mean z of 26 at 30 × 40 nodes and 51 at 100 × 150 against fixed degrees); they also depend on connectance, sampling effort and the null model, and carry a Monte Carlo error from the number of nulls (shown as ±).",
  "Compare networks of similar size and connectance, with the same objective and the same null model; across a wider selection, adjust for size and connectance (the compare view does, and states its method).",
];

export const FIGURE_CAUTION_SHORT =
  "No figure is size-free: z, Q_rel, ΔQ and p control for what their named null model keeps and nothing else, and grow with network size for the same process; raw Q also depends on connectance and sampling effort. Compare networks of similar size and connectance, the same objective and the same null model, or adjust for size and connectance.";

export const RESOLUTION_LIMIT_CAUTION =
  "Resolution limit: modularity maximisation can merge small modules in large networks (Fortunato & Barthélemy 2007, PNAS 104:36), so module counts and roles of large networks can miss small modules.";

export const NODF_CAUTION =
  "NODF removes empty rows and columns before comparing pairs, and ties in marginal totals count 0 (Almeida-Neto et al. 2008); compare it with the same null networks as Q (shown), since raw NODF also depends on size and connectance.";
