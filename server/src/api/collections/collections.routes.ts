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
 * one gets 401 or 403. Requests are checked by collections.schemas.ts after the sign-in check.
 */
import { Router } from "express";
import { apiRateLimit } from "../../middlewares/api-rate-limit";
import { requireSignedIn } from "../../middlewares/require-role";
import { validate } from "../../middlewares/validate";
import { networkRefOf } from "../common.schemas";
import { addMembers, createCollection, deleteCollection, getCollection, listMyCollections, removeMembers, updateCollection, type CollectionBody } from "./collections.service";
import { addMembersSchema, collectionSchema, createCollectionSchema, deleteCollectionSchema, removeMemberSchema, updateCollectionSchema } from "./collections.schemas";

export const collectionsRouter = Router();

collectionsRouter.get("/", requireSignedIn, async (req, res) => {
  res.json({ data: await listMyCollections(req.user!) });
});

collectionsRouter.post("/", requireSignedIn, validate(createCollectionSchema), async (req, res) => {
  res.status(201).json(await createCollection(req.user!, req.body as CollectionBody));
});

collectionsRouter.get("/:code", apiRateLimit, validate(collectionSchema), async (req, res) => {
  res.json(await getCollection(req.params.code as string, req.user, req.query.revision as number | undefined));
});

collectionsRouter.patch("/:code", requireSignedIn, validate(updateCollectionSchema), async (req, res) => {
  res.json(await updateCollection(req.params.code as string, req.user!, req.body as CollectionBody));
});

collectionsRouter.delete("/:code", requireSignedIn, validate(deleteCollectionSchema), async (req, res) => {
  await deleteCollection(req.params.code as string, req.user!);
  res.status(204).end();
});

collectionsRouter.post("/:code/members", requireSignedIn, validate(addMembersSchema), async (req, res) => {
  res.json(await addMembers(req.params.code as string, req.user!, (req.body as { refs: string[] }).refs));
});

collectionsRouter.delete("/:code/members/:accession/:version/:position", requireSignedIn, validate(removeMemberSchema), async (req, res) => {
  const { accession, version, position } = networkRefOf(req.params);
  res.json(await removeMembers(req.params.code as string, req.user!, [`${accession}/v${version}/${position}`]));
});
