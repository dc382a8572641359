/** A dataset's audit history as the dataset page shows it to curators. */
import type { AuditEntry } from "@shared/types/network-view";
import { ApiError } from "../../lib/api-error";
import { AuditLog, Dataset, User } from "../../models";

/** The audit history of a dataset, newest first (curators only: checked by the route). */
export async function getHistory(accession: string): Promise<AuditEntry[]> {
  const dataset = await Dataset.findOne({ where: { accession } });
  if (!dataset) throw ApiError.notFound(`No dataset ${accession}.`);
  const rows = await AuditLog.findAll({
    where: { datasetId: dataset.id },
    include: [{ model: User, as: "actor", attributes: ["id", "displayName"] }],
    order: [["createdAt", "DESC"], ["id", "DESC"]],
    limit: 500,
  });
  return rows.map((r) => {
    const actor = (r as AuditLog & { actor?: User | null }).actor;
    return {
      id: Number(r.id),
      at: r.createdAt.toISOString(),
      action: r.action,
      entityType: r.entityType,
      entityId: r.entityId,
      actor: actor ? { id: actor.id, displayName: actor.displayName } : null,
      details: r.details,
    };
  });
}
