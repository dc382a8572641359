/**
 * Network metadata of a whole deposit at once: the metadata sheet (one row per network, deposits.sheet.ts
 * reads and writes its CSV) and copying blocks of one network's metadata (locality, habitat, dates,
 * sampling) to every other network. Values are saved as drafts are; their problems are answered per cell.
 */
import { Op } from "sequelize";
import type { SheetCellProblem } from "@shared/types/deposit";
import { audit } from "../../lib/audit";
import { Network } from "../../models";
import type { Viewer } from "../datasets/datasets.service";
import { cellOf, readSheet, writeSheet } from "./deposits.sheet";
import { bump, loadNetworkOf, loadOwnEditable, loadVisibleVersion, tx } from "./deposits.access";
import { depositDetail, type DepositDetail } from "./deposits.detail";
import { withMissingValuesOf } from "./deposits.files";

/** The metadata sheet of a deposit (owner or curator): CSV text and a file name. */
export async function getMetadataSheet(versionId: number, viewer: Viewer): Promise<{ name: string; csv: string }> {
  const { dataset, version } = await loadVisibleVersion(versionId, viewer);
  const networks = await Network.findAll({ where: { versionId: version.id }, order: [["position", "ASC"]] });
  const stem = dataset.accession ? `${dataset.accession}-v${version.number}` : `deposit-${version.id}`;
  return { name: `${stem}-network-metadata.csv`, csv: writeSheet(networks.map((n) => ({ position: n.position, originalName: n.originalName, metadata: n.metadata ?? {} }))) };
}

/**
 * Fills every network's metadata from an uploaded sheet in one transaction. Structural problems (unknown
 * column or network) refuse it whole; value problems are saved, as drafts are, and returned per cell.
 */
export async function applyMetadataSheet(versionId: number, viewer: Viewer, text: string): Promise<{ deposit: DepositDetail; cells: SheetCellProblem[]; rows: number }> {
  const { dataset, version, rows } = await tx(async (t) => {
    const r = await loadOwnEditable(versionId, viewer, t);
    const nets = await Network.findAll({ where: { versionId: r.version.id }, order: [["position", "ASC"]], transaction: t });
    const rows = readSheet(text, nets.map((n) => n.position));
    for (const row of rows) {
      const net = nets.find((n) => n.position === row.position)!;
      await net.update({ metadata: withMissingValuesOf(row.metadata, net.metadata ?? {}) }, { transaction: t });
    }
    await bump(r.version, t);
    await audit({ actorId: viewer.id, action: "deposit.metadata.sheet", entityType: "dataset_version", entityId: r.version.id, datasetId: r.dataset.id, details: { networks: rows.map((x) => x.position) } }, t);
    return { ...r, rows };
  });
  const deposit = await depositDetail(dataset, version, viewer);
  const cells: SheetCellProblem[] = [];
  for (const row of rows) {
    const f = deposit.findings.networks.find((n) => n.position === row.position);
    for (const e of f?.findings ?? []) {
      const c = cellOf(row, e.path);
      cells.push({ row: row.row, column: c.column, columnName: c.name, field: e.path, network: row.position, message: e.message });
    }
  }
  return { deposit, cells, rows: rows.length };
}

/** What "apply this block to all networks" copies. */
export const BLOCKS = {
  locality: { fields: ["locality"], notRecorded: ["coordinates", "elevation"] },
  habitat: { fields: ["habitat"], notRecorded: ["habitat"] },
  dates: { fields: ["startDate", "endDate"], notRecorded: ["dates"] },
  sampling: { fields: ["samplingProtocol", "samplingEffort", "taxonomicResolution"], notRecorded: ["samplingEffort"] },
} as const;
export type BlockName = keyof typeof BLOCKS;

/** Copies blocks of one network's metadata (locality, habitat, dates, sampling) to every other network. */
export async function applyBlocks(versionId: number, viewer: Viewer, fromNetworkId: number, blocks: BlockName[]): Promise<DepositDetail> {
  const { dataset, version } = await tx(async (t) => {
    const r = await loadOwnEditable(versionId, viewer, t);
    const from = await loadNetworkOf(r.version, fromNetworkId, t);
    const src = from.metadata ?? {};
    const srcNr = (src.notRecorded ?? {}) as Record<string, unknown>;
    const others = await Network.findAll({ where: { versionId: r.version.id, id: { [Op.ne]: from.id } }, transaction: t });
    for (const n of others) {
      const meta: Record<string, unknown> = { ...(n.metadata ?? {}) };
      const nr: Record<string, unknown> = { ...((meta.notRecorded ?? {}) as Record<string, unknown>) };
      for (const b of blocks) {
        for (const f of BLOCKS[b].fields) {
          if (src[f] === undefined) delete meta[f];
          else meta[f] = structuredClone(src[f]);
        }
        for (const f of BLOCKS[b].notRecorded) {
          if (srcNr[f] === undefined) delete nr[f];
          else nr[f] = srcNr[f];
        }
      }
      if (Object.keys(nr).length) meta.notRecorded = nr;
      else delete meta.notRecorded;
      await n.update({ metadata: meta }, { transaction: t });
    }
    await bump(r.version, t);
    await audit({ actorId: viewer.id, action: "deposit.metadata.apply", entityType: "dataset_version", entityId: r.version.id, datasetId: r.dataset.id, details: { from: from.position, blocks, to: others.map((n) => n.position) } }, t);
    return r;
  });
  return depositDetail(dataset, version, viewer);
}
