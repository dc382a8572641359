/**
 * The matrix CSV a bundle holds for each network, written once when the network's version is published
 * and kept in `networks.matrix_csv` (migration 20261202-0100). A bundle then copies stored bytes: no JSON
 * to parse and no matrix to write per network, which is most of a bundle's work (npm run bench:catalogue).
 * PostgreSQL compresses the column (runs of ",0" compress well): it takes less room than the canonical form.
 *
 * - `MATRIX_CSV_FORMAT` names the writer: a row written by another one is not used (the bundle writes the
 *   CSV from the canonical form, as for a NULL) and is written again by `fillStoredMatrixCsvs`.
 * - Networks over `MATRIX_CSV_MAX_CELLS` are never stored (their CSV can be several MB and is mostly the
 *   copied zero row; writing it at bundle time costs little more than reading it).
 * - Published versions are frozen, so a stored CSV never goes stale; drafts have none. A trigger clears it
 *   if anything changes a network's canonical form all the same (migration 20261202-0200).
 */
import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "../../db/sequelize";
import { logger } from "../../lib/logger";
import { matrixCsvFromCanonical, MatrixCsvError } from "../../lib/matrix-csv";
import { MATRIX_CORNER } from "@shared/network/parse/write";

/** Version of the writer below (raise it when the bundle's matrix CSV changes). */
export const MATRIX_CSV_FORMAT = 1;
/** Networks with more matrix cells than this have no stored CSV (1,000,000 cells ≈ 2 MB of CSV). */
export const MATRIX_CSV_MAX_CELLS = 1_000_000;
/** Text of the header's first cell: the Table Schema names the label column "node" (every matrix CSV does). */
export const MATRIX_CSV_CORNER = MATRIX_CORNER;
/** Bytes of CSV written by one statement (so a dataset of large networks is not held in memory at once). */
const STATEMENT_BYTES = 8 * 1024 * 1024;

/** A network's matrix CSV as a bundle holds it, from its stored canonical JSON (object or text). */
export function bundleMatrixCsv(canonical: unknown): Buffer {
  return matrixCsvFromCanonical(typeof canonical === "string" ? JSON.parse(canonical) : canonical, MATRIX_CSV_CORNER);
}

/** Matrix cells of a network row (aliased n): rows × columns, or nodes² for one-mode networks. */
export const MATRIX_CELLS_SQL = "COALESCE(n.n_rows::bigint * n.n_cols, n.n_nodes::bigint * n.n_nodes)";

/**
 * Writes the stored CSV of those of `networkIds` within the size limit that have none in the current
 * format. Called by publishing, inside its transaction. Returns how many were written.
 */
export async function storeMatrixCsvs(networkIds: number[], transaction?: Transaction, opts: { maxCells?: number } = {}): Promise<number> {
  if (!networkIds.length) return 0;
  const todo = await sequelize().query<{ id: number; cells: string }>(
    `SELECT n.id, ${MATRIX_CELLS_SQL} AS cells FROM networks n
      WHERE n.id IN (:ids) AND ${MATRIX_CELLS_SQL} <= :max AND n.matrix_csv_format IS DISTINCT FROM :format
      ORDER BY n.id`,
    { replacements: { ids: networkIds, max: opts.maxCells ?? MATRIX_CSV_MAX_CELLS, format: MATRIX_CSV_FORMAT }, type: QueryTypes.SELECT, transaction },
  );
  let written = 0;
  for (let i = 0; i < todo.length; ) {
    // as many networks as fit in one statement's budget (at least one)
    const group: number[] = [];
    let bytes = 0;
    while (i < todo.length && (group.length === 0 || bytes + 2 * Number(todo[i].cells) <= STATEMENT_BYTES)) {
      bytes += 2 * Number(todo[i].cells);
      group.push(todo[i++].id);
    }
    const rows = await sequelize().query<{ id: number; canonical: string }>(`SELECT id, canonical::text AS canonical FROM networks WHERE id IN (:ids)`, {
      replacements: { ids: group },
      type: QueryTypes.SELECT,
      transaction,
    });
    const ids = rows.map((r) => r.id);
    const csvs = rows.map((r) => bundleMatrixCsv(r.canonical).toString("utf8"));
    await sequelize().query(
      `UPDATE networks n SET matrix_csv = x.csv, matrix_csv_format = $3
         FROM unnest($1::int[], $2::text[]) AS x(id, csv) WHERE n.id = x.id`,
      { bind: [ids, csvs, MATRIX_CSV_FORMAT], transaction },
    );
    written += ids.length;
  }
  return written;
}

/**
 * Writes the stored CSV of every published network that lacks one in the current format (networks
 * published before this column existed, or by an older writer), a few hundred at a time in id order. A
 * network whose CSV cannot be written (a damaged stored form) is logged and passed over, so the others
 * are still filled. Run at server start (catalogue.startup.ts) and by the catalogue benchmark after
 * seeding. Returns how many were written.
 */
export async function fillStoredMatrixCsvs(opts: { chunk?: number; maxCells?: number } = {}): Promise<number> {
  const chunk = opts.chunk ?? 200;
  const max = opts.maxCells ?? MATRIX_CSV_MAX_CELLS;
  let total = 0;
  let after = 0;
  for (;;) {
    const rows = await sequelize().query<{ id: number }>(
      `SELECT n.id FROM networks n JOIN dataset_versions v ON v.id = n.version_id
        WHERE v.state = 'published' AND ${MATRIX_CELLS_SQL} <= :max AND n.matrix_csv_format IS DISTINCT FROM :format AND n.id > :after
        ORDER BY n.id LIMIT :chunk`,
      { replacements: { max, format: MATRIX_CSV_FORMAT, chunk, after }, type: QueryTypes.SELECT },
    );
    if (!rows.length) return total;
    const ids = rows.map((r) => r.id);
    after = ids[ids.length - 1];
    try {
      total += await storeMatrixCsvs(ids, undefined, { maxCells: max });
    } catch (err) {
      // a damaged network: the others one by one (any other failure, e.g. the database, ends the fill)
      if (!(err instanceof MatrixCsvError)) throw err;
      for (const id of ids) {
        try {
          total += await storeMatrixCsvs([id], undefined, { maxCells: max });
        } catch (e) {
          if (!(e instanceof MatrixCsvError)) throw e;
          logger.warn({ err: e, networkId: id }, "the matrix CSV of a published network could not be written; bundles will try again");
        }
      }
    }
  }
}
