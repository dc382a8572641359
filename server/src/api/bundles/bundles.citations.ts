/**
 * CITATIONS.bib of a bundle: one @dataset entry per dataset version of its networks (with the version's
 * registered DOI), followed by its source publication's entry (@shared/citation). Read from the database
 * 500 versions at a time while the entry is written; an aborted bundle stops reading.
 */
import { QueryTypes } from "sequelize";
import { datasetBibTeX } from "@shared/citation";
import type { StudyMetadata } from "@shared/types/dataset";
import { sequelize } from "../../db/sequelize";
import type { SelectedNetwork } from "./bundles.selection";

export async function* citations(networks: SelectedNetwork[], signal: AbortSignal, generated: Date, publicUrl: string): AsyncGenerator<string> {
  const versions = [...new Set(networks.map((n) => `${n.accession}/${n.version}`))];
  for (let i = 0; i < versions.length && !signal.aborted; i += 500) {
    const rows = await sequelize().query<{ accession: string; number: number; metadata: StudyMetadata; published_at: Date | null; doi: string | null }>(
      `SELECT d.accession, v.number, v.metadata, v.published_at, x.doi FROM dataset_versions v JOIN datasets d ON d.id = v.dataset_id
         LEFT JOIN dataset_dois x ON x.version_id = v.id AND x.state = 'registered'
       WHERE (d.accession || '/' || v.number) IN (:keys) ORDER BY d.accession, v.number`,
      { replacements: { keys: versions.slice(i, i + 500) }, type: QueryTypes.SELECT },
    );
    yield rows
      .map((r) =>
        datasetBibTeX({
          metadata: { ...r.metadata, title: r.metadata.title ?? r.accession, creators: Array.isArray(r.metadata.creators) ? r.metadata.creators : [] },
          accession: r.accession,
          version: r.number,
          year: (r.published_at ? new Date(r.published_at) : generated).getUTCFullYear(),
          url: `${publicUrl}/datasets/${r.accession}/v/${r.number}`,
          doi: r.doi,
        }),
      )
      .join("\n");
  }
}
