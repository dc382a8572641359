/**
 * Tells a depositor once when every network of their published version has finished its metrics run of
 * the current pipeline settings (succeeded or failed). Called after each run ends; the conditional UPDATE
 * of `figures_notified_at` makes sure only one caller sends the message.
 */
import { QueryTypes } from "sequelize";
import { sequelize } from "../db/sequelize";
import { config } from "../config/env";
import { logger } from "../lib/logger";
import { sendMail } from "../emails/mailer";
import { figuresReadyEmail } from "../emails/templates/figures-ready";
import { getPipelineSettings, settingsHash } from "./settings";

export async function notifyFiguresIfDone(runId: number): Promise<void> {
  try {
    const hash = settingsHash(await getPipelineSettings());
    const rows = await sequelize().query<{ version_id: number; accession: string; number: number; title: string | null; email: string; display_name: string; succeeded: string; failed: string }>(
      `WITH v AS (
         SELECT dv.id, dv.number, dv.metadata->>'title' AS title, d.accession, u.email, u.display_name
           FROM metric_runs r JOIN networks n ON n.id = r.network_id JOIN dataset_versions dv ON dv.id = n.version_id
           JOIN datasets d ON d.id = dv.dataset_id JOIN users u ON u.id = d.owner_id
          WHERE r.id = :runId AND dv.state = 'published' AND dv.figures_notified_at IS NULL),
       s AS (
         SELECT n.id,
                bool_or(r.status IN ('succeeded', 'superseded')) AS ok,
                bool_or(r.status = 'failed') AS failed,
                bool_or(r.status IN ('queued', 'running')) AS waiting
           FROM networks n JOIN v ON n.version_id = v.id
           LEFT JOIN metric_runs r ON r.network_id = n.id AND r.settings_hash = :hash
          GROUP BY n.id)
       SELECT v.id AS version_id, v.accession, v.number, v.title, v.email, v.display_name,
              (SELECT count(*) FROM s WHERE s.ok) AS succeeded,
              (SELECT count(*) FROM s WHERE NOT s.ok AND s.failed) AS failed
         FROM v
        WHERE NOT EXISTS (SELECT 1 FROM s WHERE s.waiting OR (NOT s.ok AND NOT s.failed))`,
      { replacements: { runId, hash }, type: QueryTypes.SELECT },
    );
    const r = rows[0];
    if (!r) return;
    const [claimed] = (await sequelize().query(`UPDATE dataset_versions SET figures_notified_at = now() WHERE id = :id AND figures_notified_at IS NULL RETURNING id`, { replacements: { id: r.version_id } })) as [unknown[], unknown];
    if (!claimed.length) return;
    await sendMail(
      r.email,
      figuresReadyEmail({
        title: r.title ?? "(untitled)",
        depositor: r.display_name,
        accession: r.accession,
        versionNumber: r.number,
        succeeded: Number(r.succeeded),
        failed: Number(r.failed),
        url: `${config().publicUrl}/datasets/${r.accession}/v/${r.number}`,
      }),
    );
  } catch (err) {
    logger.warn({ err, runId }, "could not tell the depositor that the figures are ready");
  }
}
