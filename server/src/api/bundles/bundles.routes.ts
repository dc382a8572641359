/**
 * /api/v1/bundles — zips of many networks from a selection (`refs`) or a catalogue filter.
 *
 * | route            | who    | answer                                                                 |
 * |------------------|--------|------------------------------------------------------------------------|
 * | POST /estimate   | anyone | `{ count, estimatedBytes, limit, unavailable }` (size estimate; refs that cannot be bundled listed) |
 * | GET /            | anyone | application/zip, streamed (query: `refs=…` or catalogue filters)       |
 * | POST /           | anyone | application/zip, streamed (body: `{ refs: [...] }` or `{ filter }`)   |
 * At most 5,000 networks (413 beyond); refs that are not published → 422; withdrawn never included.
 * Both take `compression=fast|small` (query or body; default fast = files stored uncompressed, small =
 * deflated, about a seventh of the size at about three times the server's time) and `include` (the
 * optional parts, bundles.parts.ts; default partitions,roles,nulls; `include=` for none). Requests are
 * checked by bundles.schemas.ts (400 naming every refused parameter or field).
 */
import { Router, type Request, type Response } from "express";
import { logger } from "../../lib/logger";
import { apiRateLimit } from "../../middlewares/api-rate-limit";
import { validate } from "../../middlewares/validate";
import { BUNDLE_LIMIT, estimateBytes, parseSelection, resolveSelection, type Selection, type UnavailableRef } from "./bundles.selection";
import { writeBundle, type BundleCompression } from "./bundles.stream";
import { ApiError } from "../../lib/api-error";
import { takeParts } from "./bundles.parts";
import { collectionRefs } from "../collections/collections.service";
import { bundleBodySchema, bundleQuerySchema } from "./bundles.schemas";

export const bundlesRouter = Router();
bundlesRouter.use(apiRateLimit);

/**
 * `collection=TBC-000012` (and `revision=N`) selects a collection's members of that revision: its published
 * networks (withdrawn members are left out, and the bundle's title says how many).
 */
async function expandCollection(req: Request, input: Record<string, unknown>): Promise<{ input: Record<string, unknown>; title?: string }> {
  const { collection, revision, ...rest } = input;
  if (collection === undefined) return { input };
  const c = await collectionRefs(String(collection), req.user, revision as number | undefined);
  if (!c.refs.length) {
    throw ApiError.unprocessable(`${String(collection)} has no published network to bundle${c.withdrawn.length ? ` (its ${c.withdrawn.length} members were withdrawn)` : ""}.`, [{ path: "collection", message: "no published members" }]);
  }
  const left = c.withdrawn.length ? `; ${c.withdrawn.length} withdrawn member${c.withdrawn.length === 1 ? "" : "s"} left out (${c.withdrawn.join(", ")})` : "";
  return { input: { ...rest, refs: c.refs }, title: `collection ${String(collection)} revision ${c.revision}, "${c.name}" (${c.refs.length} networks${left})` };
}

bundlesRouter.post("/estimate", validate(bundleBodySchema), async (req, res) => {
  const { parts, rest } = takeParts(takeCompression((await expandCollection(req, req.body as Record<string, unknown>)).input).rest);
  const sel = parseSelection(rest);
  // references that cannot be bundled are listed (the page offers to drop them), not an error here
  const unavailable: UnavailableRef[] = [];
  const nets = await resolveSelection(sel, { enforceLimit: false, unavailable });
  res.json({ count: nets.length, estimatedBytes: estimateBytes(nets, parts), limit: BUNDLE_LIMIT, overLimit: nets.length > BUNDLE_LIMIT, include: [...parts], unavailable });
});

/** Takes `compression` out of the input (the rest is the selection); fast unless asked. */
function takeCompression(input: Record<string, unknown>): { compression: BundleCompression; rest: Record<string, unknown> } {
  const { compression, ...rest } = input;
  return { compression: (compression as BundleCompression | undefined) ?? "fast", rest };
}

async function stream(req: Request, res: Response, raw: Record<string, unknown>) {
  const { input, title: collectionTitle } = await expandCollection(req, raw);
  const { compression, rest: afterCompression } = takeCompression(input);
  const { parts, rest } = takeParts(afterCompression);
  const sel: Selection = parseSelection(rest);
  const nets = await resolveSelection(sel);
  const title = collectionTitle ?? (sel.kind === "refs" ? `selection of ${nets.length} network${nets.length === 1 ? "" : "s"}` : `${nets.length} networks matching a catalogue filter`);
  const controller = new AbortController();
  const onClose = () => {
    if (!res.writableFinished) controller.abort();
  };
  req.on("close", onClose);
  res.on("close", onClose);
  const stamp = new Date().toISOString().slice(0, 19).replace(/[-:]/g, "").replace("T", "-");
  res.status(200);
  res.setHeader("Content-Type", "application/zip");
  res.setHeader("Content-Disposition", `attachment; filename="tanglebank-bundle-${stamp}.zip"`);
  res.setHeader("X-Bundle-Networks", String(nets.length));
  res.setHeader("Cache-Control", "no-store");
  try {
    const { aborted } = await writeBundle(res, { networks: nets, title, signal: controller.signal, compression, parts });
    if (aborted) res.destroy();
  } catch (err) {
    logger.error({ err }, "bundle failed while streaming");
    res.destroy(err as Error);
  }
}

bundlesRouter.get("/", validate(bundleQuerySchema), async (req, res) => {
  await stream(req, res, req.query as Record<string, unknown>);
});

bundlesRouter.post("/", validate(bundleBodySchema), async (req, res) => {
  await stream(req, res, req.body as Record<string, unknown>);
});
