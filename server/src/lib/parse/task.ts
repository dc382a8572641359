/**
 * What a parse process does with one uploaded file: read it (from its temporary file or from the bytes
 * sent), parse it with the engine's parser, hash it, and build the canonical form and the basic counts,
 * so the web server's thread does none of this work. A parse problem comes back as data (structured
 * cloning would drop the fields of a NetworkParseError); anything else is thrown.
 */
import { createHash } from "node:crypto";
import { readFile } from "node:fs/promises";
import { basicMetrics, parseNetworkFile, serializeNetwork, NetworkParseError, type ParseOptions, type ParseResult } from "@shared/network";
import type { BasicMetrics } from "@shared/network/metrics/basic";
import type { CanonicalNetworkJson } from "@shared/network/parse/serialize";

export interface ParseTask {
  /** A temporary file of the upload… */
  path?: string;
  /** …or the bytes themselves (a file from a zip, a stored original read again). */
  bytes?: Uint8Array;
  options: ParseOptions;
}

/** The parse without the network's arrays (the canonical form carries them). */
export type ParsedFile = Omit<ParseResult, "network"> & { network: { kind: ParseResult["network"]["kind"]; directed: boolean; weighted: boolean } };

export interface ParseTaskProblem {
  code: string;
  file: string;
  row: number | null;
  column: number | null;
  message: string;
  extra?: Record<string, unknown>;
}

export type ParseTaskResult =
  | { ok: true; parsed: ParsedFile; sha256: string; size: number; canonical: CanonicalNetworkJson; metrics: BasicMetrics }
  | { ok: false; problem: ParseTaskProblem };

export async function runParseTask(task: ParseTask): Promise<ParseTaskResult> {
  const bytes = task.bytes ?? (task.path ? new Uint8Array(await readFile(task.path)) : new Uint8Array());
  try {
    const res = await parseNetworkFile(bytes, task.options);
    const { network, ...rest } = res;
    return {
      ok: true,
      parsed: { ...rest, network: { kind: network.kind, directed: network.directed, weighted: network.weighted } },
      sha256: createHash("sha256").update(bytes).digest("hex"),
      size: bytes.byteLength,
      canonical: serializeNetwork(network),
      metrics: basicMetrics(network),
    };
  } catch (err) {
    if (err instanceof NetworkParseError) {
      return { ok: false, problem: { code: err.code, file: err.file, row: err.row, column: err.column, message: err.message, ...(err.extra ? { extra: err.extra } : {}) } };
    }
    throw err;
  }
}
