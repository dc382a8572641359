/**
 * Writing and reading the significance figures of each null model of a run (table metric_run_nulls,
 * migration 20261202-1100): one row per run and model, the primary flagged. Shared by the worker (when a
 * run succeeds), the test fixtures and every read path (pages, catalogue, bundles, compare view).
 */
import { QueryTypes, type Transaction } from "sequelize";
import type { AnalysisResult } from "@shared/network/analyze";
import { NULL_MODELS } from "@shared/network/null-models/index";
import type { NullFigureSummary } from "@shared/types/dataset";
import { sequelize } from "../db/sequelize";

/** Stores the figures of every null model of `analysis` for run `runId` (replacing any stored ones). */
export async function writeNullFigures(runId: number, analysis: AnalysisResult, transaction?: Transaction): Promise<void> {
  await sequelize().query(`DELETE FROM metric_run_nulls WHERE run_id = :runId`, { replacements: { runId }, transaction });
  const figures = analysis.nulls ?? [];
  if (!figures.length) return;
  await sequelize().query(
    `INSERT INTO metric_run_nulls (run_id, model, is_primary, n, mean, sd, z, z_se, q_rel, delta_q, p, p_se, p_at_floor,
                                   unstable, unstable_reason, nodf_mean, nodf_z, nodf_p)
     SELECT :runId, f->>'model', (f->>'primary')::boolean, (f->>'n')::int, (f->>'mean')::float8, (f->>'sd')::float8,
            (f->>'z')::float8, (f->>'zSe')::float8, (f->>'qRel')::float8, (f->>'deltaQ')::float8, (f->>'p')::float8,
            (f->>'pSe')::float8, (f->>'pAtFloor')::boolean, (f->>'unstable')::boolean, f->>'unstableReason',
            (f #>> '{nodf,mean}')::float8, (f #>> '{nodf,z}')::float8, (f #>> '{nodf,p}')::float8
       FROM jsonb_array_elements(CAST(:figures AS jsonb)) AS f`,
    { replacements: { runId, figures: JSON.stringify(figures) }, transaction },
  );
}

interface NullRow {
  run_id: number;
  model: string;
  is_primary: boolean;
  n: number;
  mean: number | null;
  sd: number | null;
  z: number | null;
  z_se: number | null;
  q_rel: number | null;
  delta_q: number | null;
  p: number | null;
  p_se: number | null;
  p_at_floor: boolean;
  unstable: boolean;
  unstable_reason: string | null;
  nodf_mean: number | null;
  nodf_z: number | null;
  nodf_p: number | null;
}

export function toNullFigureSummary(r: NullRow): NullFigureSummary {
  const out: NullFigureSummary = {
    model: r.model,
    primary: r.is_primary,
    n: r.n,
    mean: r.mean,
    sd: r.sd,
    z: r.z,
    zSe: r.z_se,
    qRel: r.q_rel,
    deltaQ: r.delta_q,
    p: r.p,
    pSe: r.p_se,
    pAtFloor: r.p_at_floor,
    unstable: r.unstable,
    nodfMean: r.nodf_mean,
    nodfZ: r.nodf_z,
    nodfP: r.nodf_p,
  };
  if (r.unstable_reason) out.unstableReason = r.unstable_reason;
  return out;
}

/** The figures of each null model of each run, primary first (then in the engine's order of models). */
export async function readNullFigures(runIds: number[], transaction?: Transaction): Promise<Map<number, NullFigureSummary[]>> {
  const out = new Map<number, NullFigureSummary[]>();
  const ids = [...new Set(runIds)].filter((id) => Number.isInteger(id));
  if (!ids.length) return out;
  const rows = await sequelize().query<NullRow>(
    `SELECT * FROM metric_run_nulls WHERE run_id IN (:ids)
      ORDER BY run_id, is_primary DESC, array_position(ARRAY[:order]::text[], model), model`,
    { replacements: { ids, order: [...NULL_MODELS] }, type: QueryTypes.SELECT, transaction },
  );
  for (const r of rows) {
    const list = out.get(r.run_id) ?? [];
    list.push(toNullFigureSummary(r));
    out.set(r.run_id, list);
  }
  return out;
}
