/**
 * Collections: saved, citable sets of networks of exact dataset versions.
 *
 * Rules:
 * - Anyone signed in may save one, from explicit references or from every network matching a catalogue
 *   filter (the matches are frozen to their versions at that moment: the set never drifts).
 * - Only published networks can be added; a member that is withdrawn later stays a member, listed with
 *   its version's tombstone.
 * - Every change of the members raises the revision (one per request); removed members keep their rows,
 *   so the members of any revision are listed again with `revision`. Name, description and visibility
 *   are not part of a revision.
 * - A private collection is visible to its owner only (404 for everyone else, as drafts are); only the
 *   owner may change or delete one.
 */
import { QueryTypes, type Transaction } from "sequelize";
import type { CollectionDetail, CollectionInput, CollectionMemberView, CollectionSummary, CollectionVisibility } from "@shared/types/collection";
import { sequelize } from "../../db/sequelize";
import { ApiError } from "../../lib/api-error";
import { audit } from "../../lib/audit";
import { Collection, CollectionMember, User } from "../../models";
import type { AuthUser } from "../../types";
import { BUNDLE_LIMIT, parseSelection, resolveSelection, type UnavailableRef } from "../bundles/bundles.selection";

/** At most this many networks in a collection (as in one bundle). */
export const COLLECTION_LIMIT = BUNDLE_LIMIT;

function notFound(code: string): ApiError {
  return ApiError.notFound(`No collection ${code}.`);
}

/** The collection, if the user may see it (public, or their own); else 404. */
async function visible(code: string, user: AuthUser | undefined): Promise<Collection> {
  const c = await Collection.findOne({ where: { code } });
  if (!c || (c.visibility === "private" && c.ownerId !== user?.id)) throw notFound(code);
  return c;
}

/** The collection, if the user owns it: 404 when they may not see it, 403 when they may see but not change it. */
async function owned(code: string, user: AuthUser, transaction?: Transaction): Promise<Collection> {
  const c = await visible(code, user);
  if (c.ownerId !== user.id) throw ApiError.forbidden("Only the owner of a collection can change it.");
  if (transaction) await c.reload({ transaction, lock: transaction.LOCK.UPDATE });
  return c;
}

/**
 * The published networks of references or a filter, or 422 naming every reference that is not one
 * (withdrawn, or not a published network), in the order given.
 */
async function resolveMembers(input: { refs?: string[]; filter?: Record<string, unknown> }): Promise<Array<{ networkId: number; ref: string }>> {
  const sel = input.refs !== undefined ? parseSelection({ refs: input.refs }) : parseSelection({ filter: input.filter ?? {} });
  const unavailable: UnavailableRef[] = [];
  const nets = await resolveSelection(sel, { unavailable, enforceLimit: false });
  if (unavailable.length) {
    throw ApiError.unprocessable(
      `${unavailable.length} of the references cannot be added: only published networks can.`,
      unavailable.slice(0, 50).map((u) => ({ path: "refs", message: u.message })),
    );
  }
  return nets.map((n) => ({ networkId: n.networkId, ref: n.ref }));
}

/** A collection's text as stored: the name on one line, the description trimmed (the schema checked both). */
function textOf(input: CollectionBody): { name?: string; description?: string; visibility?: CollectionVisibility } {
  return {
    ...(input.name !== undefined ? { name: input.name.replace(/\s+/g, " ").trim() } : {}),
    ...(input.description !== undefined ? { description: input.description.trim() } : {}),
    ...(input.visibility !== undefined ? { visibility: input.visibility } : {}),
  };
}

/** A create or update body as collections.schemas.ts let it through. */
export type CollectionBody = Partial<CollectionInput>;

export async function createCollection(user: AuthUser, input: CollectionBody): Promise<CollectionDetail> {
  const text = textOf(input);
  if ((input.refs === undefined) === (input.filter === undefined)) {
    const message = "Save either refs (the selected networks) or filter (everything matching a catalogue filter).";
    throw ApiError.badRequest(message, [{ path: "/refs", message }]);
  }
  const members = await resolveMembers({ refs: input.refs, filter: input.filter as Record<string, unknown> | undefined });
  if (!members.length) throw ApiError.unprocessable("There are no networks to save: select some, or change the filter.", [{ path: input.refs ? "refs" : "filter", message: "no networks" }]);
  if (members.length > COLLECTION_LIMIT) {
    throw ApiError.unprocessable(`A collection holds at most ${COLLECTION_LIMIT.toLocaleString("en")} networks; this one would hold ${members.length.toLocaleString("en")}.`, [{ path: "refs", message: "too many" }]);
  }
  const code = await sequelize().transaction(async (transaction) => {
    const [{ n }] = await sequelize().query<{ n: string }>(`SELECT nextval('collection_seq') AS n`, { type: QueryTypes.SELECT, transaction });
    const c = await Collection.create(
      {
        code: `TBC-${String(n).padStart(6, "0")}`,
        ownerId: user.id,
        name: text.name!,
        description: text.description ?? "",
        visibility: text.visibility ?? "private",
        savedFrom: input.filter !== undefined ? { kind: "filter", filter: input.filter } : { kind: "selection" },
      },
      { transaction },
    );
    await CollectionMember.bulkCreate(
      members.map((m, i) => ({ collectionId: c.id, networkId: m.networkId, position: i + 1, addedRevision: 1 })),
      { transaction },
    );
    await audit({ actorId: user.id, action: "collection.create", entityType: "collection", entityId: c.code, details: { networks: members.length, visibility: c.visibility } }, transaction);
    return c.code;
  });
  return getCollection(code, user);
}

export async function updateCollection(code: string, user: AuthUser, input: CollectionBody): Promise<CollectionDetail> {
  const text = textOf(input);
  const c = await owned(code, user);
  await c.update(text);
  await audit({ actorId: user.id, action: "collection.update", entityType: "collection", entityId: code, details: text });
  return getCollection(code, user);
}

export async function deleteCollection(code: string, user: AuthUser): Promise<void> {
  const c = await owned(code, user);
  await sequelize().transaction(async (transaction) => {
    await c.destroy({ transaction });
    await audit({ actorId: user.id, action: "collection.delete", entityType: "collection", entityId: code, details: { name: c.name } }, transaction);
  });
}

/** Adds published networks (those already members are passed over); a new revision when any is added. */
export async function addMembers(code: string, user: AuthUser, refs: string[]): Promise<CollectionDetail> {
  await owned(code, user);
  const members = await resolveMembers({ refs });
  await sequelize().transaction(async (transaction) => {
    const c = await owned(code, user, transaction);
    const current = await CollectionMember.findAll({ where: { collectionId: c.id, removedRevision: null }, transaction });
    const have = new Set(current.map((m) => m.networkId));
    const fresh = members.filter((m) => !have.has(m.networkId));
    if (!fresh.length) return;
    if (current.length + fresh.length > COLLECTION_LIMIT) {
      throw ApiError.unprocessable(`A collection holds at most ${COLLECTION_LIMIT.toLocaleString("en")} networks.`, [{ path: "refs", message: "too many" }]);
    }
    const [{ max }] = await sequelize().query<{ max: number | null }>(`SELECT max(position) AS max FROM collection_members WHERE collection_id = :id`, {
      replacements: { id: c.id },
      type: QueryTypes.SELECT,
      transaction,
    });
    const revision = c.revision + 1;
    await CollectionMember.bulkCreate(
      fresh.map((m, i) => ({ collectionId: c.id, networkId: m.networkId, position: (max ?? 0) + i + 1, addedRevision: revision })),
      { transaction },
    );
    await c.update({ revision }, { transaction });
    await audit({ actorId: user.id, action: "collection.add", entityType: "collection", entityId: code, details: { revision, added: fresh.map((m) => m.ref) } }, transaction);
  });
  return getCollection(code, user);
}

/** Removes members by reference (withdrawn ones too); a new revision when any is removed. */
export async function removeMembers(code: string, user: AuthUser, refs: string[]): Promise<CollectionDetail> {
  await owned(code, user);
  await sequelize().transaction(async (transaction) => {
    const c = await owned(code, user, transaction);
    const rows = await sequelize().query<{ id: number; ref: string }>(
      `SELECT m.id, d.accession || '/v' || v.number || '/' || n.position AS ref
         FROM collection_members m JOIN networks n ON n.id = m.network_id
         JOIN dataset_versions v ON v.id = n.version_id JOIN datasets d ON d.id = v.dataset_id
        WHERE m.collection_id = :id AND m.removed_revision IS NULL`,
      { replacements: { id: c.id }, type: QueryTypes.SELECT, transaction },
    );
    const byRef = new Map(rows.map((r) => [r.ref, r.id]));
    const missing = refs.filter((r) => !byRef.has(r));
    if (missing.length) throw ApiError.notFound(`${missing.join(", ")} ${missing.length === 1 ? "is" : "are"} not in ${code}.`);
    const revision = c.revision + 1;
    await CollectionMember.update({ removedRevision: revision, removedAt: new Date() }, { where: { id: refs.map((r) => byRef.get(r)!) }, transaction });
    await c.update({ revision }, { transaction });
    await audit({ actorId: user.id, action: "collection.remove", entityType: "collection", entityId: code, details: { revision, removed: refs } }, transaction);
  });
  return getCollection(code, user);
}

interface MemberRow {
  accession: string;
  number: number;
  position: number;
  name: string | null;
  title: string | null;
  interaction_type: string | null;
  kind: "bipartite" | "unipartite";
  n_nodes: number;
  n_links: number;
  connectance: number | null;
  state: string;
  withdrawn_at: Date | null;
  withdrawal_reason: string | null;
  latest: number | null;
  added_at: Date;
  added_revision: number;
}

/** The members of a collection at a revision, in the order they were added. */
async function membersAt(collectionId: number, revision: number): Promise<CollectionMemberView[]> {
  const rows = await sequelize().query<MemberRow>(
    `SELECT d.accession, v.number, n.position, n.metadata->>'name' AS name, v.metadata->>'title' AS title,
            n.metadata->>'interactionType' AS interaction_type, n.kind, n.n_nodes, n.n_links, n.connectance,
            v.state, v.withdrawn_at, v.withdrawal_reason, m.added_at, m.added_revision,
            (SELECT max(lv.number) FROM dataset_versions lv WHERE lv.dataset_id = d.id AND lv.state = 'published') AS latest
       FROM collection_members m JOIN networks n ON n.id = m.network_id
       JOIN dataset_versions v ON v.id = n.version_id JOIN datasets d ON d.id = v.dataset_id
      WHERE m.collection_id = :id AND m.added_revision <= :revision AND (m.removed_revision IS NULL OR m.removed_revision > :revision)
      ORDER BY m.position`,
    { replacements: { id: collectionId, revision }, type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({
    ref: `${r.accession}/v${r.number}/${r.position}`,
    accession: r.accession,
    version: r.number,
    position: r.position,
    name: r.name ?? `Network ${r.position}`,
    datasetTitle: r.title ?? r.accession,
    interactionType: r.interaction_type,
    kind: r.kind,
    nNodes: r.n_nodes,
    nLinks: r.n_links,
    connectance: r.connectance,
    state: r.state === "withdrawn" ? "withdrawn" : "published",
    withdrawal: r.state === "withdrawn" ? { at: (r.withdrawn_at ?? new Date(0)).toISOString(), reason: r.withdrawal_reason ?? "" } : null,
    newerVersion: r.latest !== null && r.latest > r.number ? r.latest : null,
    addedAt: new Date(r.added_at).toISOString(),
    addedRevision: r.added_revision,
  }));
}

async function summaryOf(c: Collection, members: CollectionMemberView[] | null): Promise<CollectionSummary> {
  const owner = await User.findByPk(c.ownerId, { attributes: ["id", "displayName", "affiliation"] });
  const list = members ?? (await membersAt(c.id, c.revision));
  return {
    code: c.code,
    name: c.name,
    description: c.description,
    visibility: c.visibility,
    owner: { id: c.ownerId, displayName: owner?.displayName ?? "", affiliation: owner?.affiliation ?? null },
    revision: c.revision,
    createdAt: c.createdAt.toISOString(),
    updatedAt: c.updatedAt.toISOString(),
    memberCount: list.length,
    withdrawnCount: list.filter((m) => m.state === "withdrawn").length,
  };
}

/** A collection with its members (of `revision`, default the current one). */
export async function getCollection(code: string, user: AuthUser | undefined, revision?: number): Promise<CollectionDetail> {
  const c = await visible(code, user);
  if (revision !== undefined && revision > c.revision) throw ApiError.notFound(`${code} has no revision ${revision} yet (it is at revision ${c.revision}).`);
  const shown = revision ?? c.revision;
  const members = await membersAt(c.id, shown);
  const current = shown === c.revision ? members : await membersAt(c.id, c.revision);
  const saved = c.savedFrom as CollectionDetail["savedFrom"];
  return { ...(await summaryOf(c, current)), shownRevision: shown, members, savedFrom: saved ?? null, isOwner: user?.id === c.ownerId };
}

/** The signed-in user's collections, newest first. */
export async function listMyCollections(user: AuthUser): Promise<CollectionSummary[]> {
  const rows = await Collection.findAll({ where: { ownerId: user.id }, order: [["createdAt", "DESC"], ["id", "DESC"]] });
  return Promise.all(rows.map((c) => summaryOf(c, null)));
}

/** The references of a collection's members at a revision (for bundles and the compare view). */
export async function collectionRefs(code: string, user: AuthUser | undefined, revision?: number): Promise<{ refs: string[]; withdrawn: string[]; name: string; revision: number }> {
  const d = await getCollection(code, user, revision);
  return {
    refs: d.members.filter((m) => m.state === "published").map((m) => m.ref),
    withdrawn: d.members.filter((m) => m.state === "withdrawn").map((m) => m.ref),
    name: d.name,
    revision: d.shownRevision,
  };
}
