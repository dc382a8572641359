/**
 * Published networks for metrics pipeline tests, created through the one fixture builder
 * (server/src/db/seeders/published-network.ts; the publishing service is exercised by its own tests). Networks are parsed by the engine from small matrices.
 */
import { User } from "../../../server/src/models";
import { insertNetwork, insertVersion } from "../../../server/src/db/seeders/published-network";
import { csvText } from "@shared/csv";
import { networkMeta, studyMeta } from "./deposit-helpers";
import { createRng } from "@shared/network/random";

let counter = 0;

export async function makeOwner(): Promise<User> {
  counter++;
  return User.create({
    email: `owner${counter}-${Date.now()}@example.test`,
    passwordHash: "x",
    displayName: `Owner ${counter}`,
    role: "depositor",
  });
}

/** A bipartite binary matrix as CSV text (first row: column labels; first column: row labels). */
export function matrixCsv(m: number[][]): string {
  return csvText([["", ...m[0].map((_, j) => `c${j + 1}`)], ...m.map((row, i) => [`r${i + 1}`, ...row])]);
}

/**
 * Creates a published dataset version (or, with state "submitted", one awaiting a curator's decision and
 * without accession) holding one network per matrix; returns the ids.
 */
export async function publishMatrices(
  matrices: number[][][],
  opts: { owner?: User; state?: "published" | "submitted" } = {},
): Promise<{ datasetId: number; versionId: number; accession: string | null; networkIds: number[] }> {
  const user = opts.owner ?? (await makeOwner());
  const state = opts.state ?? "published";
  counter++;
  const { dataset, version } = await insertVersion({
    ownerId: user.id,
    accession: state === "published" ? `TB-${String(900000 + counter).slice(-6)}` : null,
    state,
    submittedAt: new Date(),
    // Complete, schema-valid metadata: publishing re-validates a submission before it publishes it.
    metadata: studyMeta({ title: `Pipeline test ${counter}` }),
  });
  const networkIds: number[] = [];
  for (let i = 0; i < matrices.length; i++) {
    networkIds.push(await createNetwork(version.id, i + 1, matrixCsv(matrices[i])));
  }
  return { datasetId: dataset.id, versionId: version.id, accession: dataset.accession, networkIds };
}

export async function createNetwork(versionId: number, position: number, csv: string, canonicalOverride?: unknown): Promise<number> {
  const n = await insertNetwork({ versionId, position, text: csv, metadata: networkMeta({ name: `Network ${position}` }), ownFile: true, canonical: canonicalOverride });
  return n.id;
}

/** A seeded random 0/1 matrix with every row and column linked. */
export function randomMatrix(seed: number, rows: number, cols: number, p: number): number[][] {
  const rng = createRng(seed);
  const m = Array.from({ length: rows }, () => Array.from({ length: cols }, () => (rng.next() < p ? 1 : 0)));
  for (let i = 0; i < rows; i++) m[i][i % cols] = 1;
  for (let j = 0; j < cols; j++) m[j % rows][j] = 1;
  return m;
}

/** Removes every metrics job from the queue schema (between test files; resetDatabase keeps other schemas). */
export async function clearQueue(query: (sql: string) => Promise<unknown>): Promise<void> {
  await query(`DO $$ BEGIN IF to_regclass('pgboss.job') IS NOT NULL THEN DELETE FROM pgboss.job; END IF; END $$`);
}
