/**
 * /api/v1/collections — saved, citable sets of networks (exact versions).
 *
 * | route                                          | who                       | answer                          |
 * |------------------------------------------------|---------------------------|---------------------------------|
 * | GET /                                          | signed in                 | `{ data: CollectionSummary[] }` (own) |
 * | POST /                                         | signed in                 | 201 CollectionDetail (`{ name, description?, visibility?, refs \| filter }`) |
 * | GET /:code                                     | anyone (private: owner)   | CollectionDetail (`?revision=N`: members of an earlier revision) |
 * | PATCH /:code                                   | owner                     | CollectionDetail (`{ name?, description?, visibility? }`) |
 * | DELETE /:code                                  | owner                     | 204                             |
 * | POST /:code/members                            | owner                     | CollectionDetail (`{ refs }`; a new revision) |
 * | DELETE /:code/members/:accession/:version/:pos | owner                     | CollectionDetail (a new revision) |
 * Private collections answer 404 to everyone but their owner; a visitor or another user changing a public
 * one gets 401 or 403.
 */
import { Router } from "express";
import { apiRateLimit } from "../../middlewares/api-rate-limit";
import { requireSignedIn } from "../../middlewares/require-role";
import {
  addMembers,
  createCollection,
  deleteCollection,
  getCollection,
  listMyCollections,
  parseRevision,
  removeMembers,
  updateCollection,
} from "./collections.service";

export const collectionsRouter = Router();

collectionsRouter.get("/", requireSignedIn, async (req, res) => {
  res.json({ data: await listMyCollections(req.user!) });
});

collectionsRouter.post("/", requireSignedIn, async (req, res) => {
  res.status(201).json(await createCollection(req.user!, req.body));
});

collectionsRouter.get("/:code", apiRateLimit, async (req, res) => {
  res.json(await getCollection(req.params.code as string, req.user, parseRevision(req.query.revision)));
});

collectionsRouter.patch("/:code", requireSignedIn, async (req, res) => {
  res.json(await updateCollection(req.params.code as string, req.user!, req.body));
});

collectionsRouter.delete("/:code", requireSignedIn, async (req, res) => {
  await deleteCollection(req.params.code as string, req.user!);
  res.status(204).end();
});

collectionsRouter.post("/:code/members", requireSignedIn, async (req, res) => {
  res.json(await addMembers(req.params.code as string, req.user!, req.body));
});

collectionsRouter.delete("/:code/members/:accession/:version/:position", requireSignedIn, async (req, res) => {
  const { accession, version, position } = req.params as Record<string, string>;
  res.json(await removeMembers(req.params.code as string, req.user!, [`${accession}/${version}/${position}`]));
});
