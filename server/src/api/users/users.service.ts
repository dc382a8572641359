import { Op, fn, col, where, type WhereOptions } from "sequelize";
import { sequelize } from "../../db/sequelize";
import { User } from "../../models";
import type { Role } from "../../models/user.model";
import { ApiError } from "../../lib/api-error";
import { audit } from "../../lib/audit";
import type { UserSummary } from "@shared/types/auth";
import type { ListResponse } from "@shared/types/api";

export interface UserListQuery {
  role?: Role;
  email?: string;
  page: number;
  pageSize: number;
}

export function toSummary(u: User): UserSummary {
  return {
    id: u.id,
    email: u.email,
    displayName: u.displayName,
    affiliation: u.affiliation ?? null,
    role: u.role,
    emailVerified: u.emailVerifiedAt !== null,
    createdAt: u.createdAt.toISOString(),
  };
}

export async function listUsers(q: UserListQuery): Promise<ListResponse<UserSummary, { total: number; page: number; pageSize: number }>> {
  const conditions: WhereOptions[] = [];
  if (q.role) conditions.push({ role: q.role });
  if (q.email) {
    const pattern = `%${q.email.toLowerCase().replace(/[\\%_]/g, (c) => "\\" + c)}%`;
    conditions.push(where(fn("lower", col("email")), { [Op.like]: pattern }));
  }
  const { rows, count } = await User.findAndCountAll({
    where: conditions.length ? { [Op.and]: conditions } : undefined,
    order: [["createdAt", "DESC"], ["id", "DESC"]],
    limit: q.pageSize,
    offset: (q.page - 1) * q.pageSize,
  });
  return { data: rows.map(toSummary), meta: { total: count, page: q.page, pageSize: q.pageSize } };
}

/**
 * Changes a role and writes `role.changed` to the audit log. The admins are locked first so that two
 * concurrent demotions cannot leave the product without an admin: demoting the last admin is a 409.
 */
export async function changeRole(actorId: number, userId: number, role: Role): Promise<UserSummary> {
  return sequelize().transaction(async (t) => {
    const admins = await User.findAll({ where: { role: "admin" }, transaction: t, lock: t.LOCK.UPDATE, order: [["id", "ASC"]] });
    const user = await User.findByPk(userId, { transaction: t, lock: t.LOCK.UPDATE });
    if (!user) throw ApiError.notFound("No such user.");
    const oldRole = user.role;
    if (oldRole === role) return toSummary(user);
    if (oldRole === "admin" && admins.length <= 1) {
      throw ApiError.conflict(
        user.id === actorId
          ? "You are the last admin: appoint another admin before giving up the role."
          : "This is the last admin: appoint another admin first.",
        [{ path: "role", message: "At least one admin must remain." }],
      );
    }
    user.role = role;
    await user.save({ transaction: t });
    await audit({ actorId, action: "role.changed", entityType: "user", entityId: user.id, details: { from: oldRole, to: role, email: user.email } }, t);
    return toSummary(user);
  });
}
