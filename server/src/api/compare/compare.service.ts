/**
 * The compare view's rows: a light summary of each network asked for, with its current metrics.
 */
import type { NetworkMetadata, StudyMetadata } from "@shared/types/dataset";
import { type CompareRowsResponse, type CompareUnavailable, type NetworkCompareRow } from "@shared/types/network-view";
import { getCurrentMetrics } from "../../pipeline/metrics-read";
import { ApiError } from "../../lib/api-error";
import { hasRole } from "../../middlewares/require-role";
import { Network, networkShape } from "../../models";
import type { AuthUser } from "../../types";
import { GoneError, resolveVersion } from "../datasets/datasets.access";

const REF_RE = /^(TB-\d{6})\/v(\d{1,6})\/(\d{1,6})$/;

/**
 * Light rows for the compare view, in the order asked. A reference that cannot be plotted (malformed,
 * unknown, a draft the reader may not see, withdrawn) does not fail the others: it is listed in
 * `unavailable` with the reason (a withdrawn one with its tombstone), so a shared link keeps working.
 * How many may be asked for at once is the route's schema (compare.schemas.ts).
 */
export async function getCompareRows(refs: string[], user: AuthUser | undefined): Promise<CompareRowsResponse> {
  const found: Array<{ ref: string; net: Network; title: string }> = [];
  const unavailable: CompareUnavailable[] = [];
  for (const ref of refs) {
    const m = REF_RE.exec(ref);
    if (!m) {
      unavailable.push({ ref, reason: "malformed", message: `"${ref}" is not a network reference (they look like TB-000042/v2/3).` });
      continue;
    }
    const [, acc, v, pos] = m;
    try {
      const { version } = await resolveVersion(acc, Number(v), user);
      const net = await Network.findOne({ where: { versionId: version.id, position: Number(pos) } });
      if (!net) {
        unavailable.push({ ref, reason: "unknown", message: `${acc} v${v} has no network ${pos}.` });
        continue;
      }
      found.push({ ref, net, title: (version.metadata as unknown as StudyMetadata).title });
    } catch (e) {
      if (e instanceof GoneError) unavailable.push({ ref, reason: "withdrawn", message: e.message, tombstone: e.tombstone });
      else if (e instanceof ApiError && e.status === 404) unavailable.push({ ref, reason: "unknown", message: e.message });
      else throw e;
    }
  }
  const metrics = await getCurrentMetrics(found.map((f) => f.net.id), { showErrors: hasRole(user, "curator") });
  const data = found.map(({ ref, net, title }): NetworkCompareRow => {
    const md = net.metadata as unknown as NetworkMetadata;
    return {
      ref,
      datasetTitle: title,
      name: md.name ?? `Network ${net.position}`,
      interactionType: md.interactionType ?? "other",
      ...networkShape(net),
      metrics: metrics.get(net.id) ?? { status: "none" },
    };
  });
  return { data, meta: { requested: refs.length, unavailable } };
}
