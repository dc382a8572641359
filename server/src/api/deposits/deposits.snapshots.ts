/**
 * Records what a submission held (migration 20261202-1410): the study metadata and every network's file
 * hash, reading, counts, metadata and canonical hash, with the canonical forms stored once per hash. Called
 * in the submitting transaction, so a snapshot exists exactly when the submission does. The hashing of the
 * canonical JSON happens in PostgreSQL (`sha256` of its text form), so large networks never travel.
 */
import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "../../db/sequelize";

/** Stores the snapshot of a version's current content as its next round; returns the round. */
export async function recordSubmission(versionId: number, submittedBy: number, t: Transaction): Promise<number> {
  await sequelize().query(
    `INSERT INTO canonical_snapshots (sha256, canonical)
     SELECT DISTINCT ON (h) h, canonical
       FROM (SELECT encode(sha256(convert_to(canonical::text, 'UTF8')), 'hex') AS h, canonical FROM networks WHERE version_id = :v) x
     ON CONFLICT (sha256) DO NOTHING`,
    { replacements: { v: versionId }, transaction: t },
  );
  const [row] = (await sequelize().query(
    `INSERT INTO submission_snapshots (version_id, round, submitted_at, submitted_by, metadata, networks)
     SELECT v.id,
            coalesce((SELECT max(s.round) FROM submission_snapshots s WHERE s.version_id = v.id), 0) + 1,
            coalesce(v.submitted_at, now()), :by, v.metadata,
            coalesce((SELECT jsonb_agg(jsonb_build_object(
                        'networkId', n.id, 'position', n.position, 'originalName', n.original_name, 'sha256', f.sha256,
                        'format', n.format, 'kind', n.kind, 'directed', n.directed, 'weighted', n.weighted,
                        'nRows', n.n_rows, 'nCols', n.n_cols, 'nNodes', n.n_nodes, 'nLinks', n.n_links,
                        'totalWeight', n.total_weight, 'metadata', n.metadata, 'readOptions', n.read_options,
                        'canonicalSha256', encode(sha256(convert_to(n.canonical::text, 'UTF8')), 'hex')) ORDER BY n.position)
                        FROM networks n JOIN stored_files f ON f.id = n.file_id WHERE n.version_id = v.id), '[]'::jsonb)
       FROM dataset_versions v WHERE v.id = :v
     RETURNING round`,
    { replacements: { v: versionId, by: submittedBy }, type: QueryTypes.SELECT, transaction: t },
  )) as Array<{ round: number }>;
  return row.round;
}
