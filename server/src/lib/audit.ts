import type { Transaction } from "sequelize";
import { AuditLog } from "../models";

/** Writes one audit-log row (inside the caller's transaction when given). */
export async function audit(
  entry: { actorId: number | null; action: string; entityType: string; entityId: string | number; datasetId?: number | null; details?: Record<string, unknown> },
  transaction?: Transaction,
): Promise<void> {
  await AuditLog.create(
    {
      actorId: entry.actorId,
      action: entry.action,
      entityType: entry.entityType,
      entityId: String(entry.entityId),
      datasetId: entry.datasetId ?? null,
      details: entry.details ?? {},
    },
    { transaction },
  );
}
