/**
 * Settings that cannot work are refused when they are saved, never discovered by a failing job: a null
 * model asked for every network that does not fit some published network (Patefield or fixed totals and
 * connectance on binary, undirected or non-integer data; shuffled weights on binary data), or an objective
 * that does not apply (Barber's bipartite Q on a one-mode network, Leicht–Newman on a bipartite one is
 * fine). The answer is a 422 whose details name each network and why.
 */
import { QueryTypes } from "sequelize";
import type { PipelineSettings } from "@shared/types/pipeline";
import { sequelize } from "../db/sequelize";
import { ApiError, type ErrorDetail } from "../lib/api-error";

interface NetRow {
  ref: string;
  name: string;
  kind: "bipartite" | "unipartite";
  directed: boolean;
  weighted: boolean;
  non_integer: boolean;
}

/** Why `model` does not fit a network with these properties (the engine's nullModelProblem, from columns). */
function problem(model: string, n: NetRow): string | null {
  const undirected = n.kind === "unipartite" && !n.directed;
  if (model === "weight-shuffle") return n.weighted ? null : "it is binary: there are no weights to shuffle";
  if (model === "patefield" || model === "totals-connectance") {
    if (undirected) return "it is one-mode and undirected: a table with fixed totals would not stay symmetric";
    if (!n.weighted) return model === "patefield" ? "it is binary: Patefield's tables hold counts, and binary Q needs binary nulls" : "it is binary: with every count 1 this is the fixed-degree null (curveball)";
    if (n.non_integer) return "its weights are not integers (interaction counts)";
  }
  return null;
}

/** Throws a 422 naming every published network (up to 50) that the settings cannot be computed for. */
export async function assertSettingsFitPublished(s: PipelineSettings): Promise<void> {
  const models = s.nullModels === "standard" || s.nulls === 0 ? [] : s.nullModels;
  const needsWeights = models.some((m) => m === "patefield" || m === "totals-connectance");
  if (!models.length && s.objective !== "barber") return;
  const rows = await sequelize().query<NetRow>(
    `SELECT d.accession || '/v' || v.number || '/' || n.position AS ref, COALESCE(n.metadata->>'name', n.original_name) AS name,
            n.kind, n.directed, n.weighted,
            ${needsWeights ? `(n.weighted AND EXISTS (SELECT 1 FROM jsonb_array_elements_text(n.canonical->'w') w WHERE w::numeric % 1 <> 0))` : "false"} AS non_integer
       FROM networks n JOIN dataset_versions v ON v.id = n.version_id JOIN datasets d ON d.id = v.dataset_id
      WHERE v.state = 'published' ORDER BY d.accession, v.number, n.position`,
    { type: QueryTypes.SELECT },
  );
  const details: ErrorDetail[] = [];
  let total = 0;
  for (const n of rows) {
    const reasons: string[] = [];
    if (s.objective === "barber" && n.kind === "unipartite") reasons.push("objective barber: Barber's bipartite modularity needs a bipartite network, this one is one-mode");
    for (const m of models) {
      const why = problem(m, n);
      if (why) reasons.push(`null model ${m}: ${why}`);
    }
    if (reasons.length) {
      total++;
      if (details.length < 50) details.push({ path: `/networks/${n.ref}`, message: `${n.ref} (${n.name}): ${reasons.join("; ")}` });
    }
  }
  if (total) {
    throw ApiError.unprocessable(
      `These settings do not fit ${total} published network${total === 1 ? "" : "s"}${total > details.length ? ` (the first ${details.length} are listed)` : ""}; choose null models that fit every network, or the standard set, which fits each kind of data.`,
      details,
    );
  }
}
