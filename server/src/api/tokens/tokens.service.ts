/**
 * Personal API tokens: a secret shown once (`tb_` + 32 random base64url characters), stored only as its
 * SHA-256 (`hashApiToken`), listed by prefix, revocable. Scripts send it as `Authorization: Bearer …`.
 */
import { randomBytes } from "node:crypto";
import { ApiError } from "../../lib/api-error";
import { audit } from "../../lib/audit";
import { hashApiToken } from "../../middlewares/authenticate";
import { ApiToken } from "../../models";
import type { ApiTokenView } from "@shared/types/auth";

export const MAX_ACTIVE_TOKENS = 20;


export function toView(t: ApiToken): ApiTokenView {
  return {
    id: t.id,
    name: t.name,
    prefix: t.tokenPrefix,
    createdAt: t.createdAt.toISOString(),
    lastUsedAt: t.lastUsedAt ? t.lastUsedAt.toISOString() : null,
    revokedAt: t.revokedAt ? t.revokedAt.toISOString() : null,
  };
}

export function newSecret(): string {
  // 24 random bytes = 32 base64url characters
  return `tb_${randomBytes(24).toString("base64url")}`;
}

export async function listTokens(userId: number): Promise<ApiTokenView[]> {
  const rows = await ApiToken.findAll({ where: { userId }, order: [["createdAt", "DESC"], ["id", "DESC"]] });
  return rows.map(toView);
}

export async function createToken(userId: number, name: string): Promise<{ token: ApiTokenView; secret: string }> {
  const active = await ApiToken.count({ where: { userId, revokedAt: null } });
  if (active >= MAX_ACTIVE_TOKENS) {
    throw ApiError.conflict(`You already have ${active} active tokens; revoke one before creating another.`);
  }
  const secret = newSecret();
  const token = await ApiToken.sequelize!.transaction(async (transaction) => {
    const t = await ApiToken.create({ userId, name, tokenHash: hashApiToken(secret), tokenPrefix: secret.slice(0, 7) }, { transaction });
    await audit({ actorId: userId, action: "api_token.create", entityType: "api_token", entityId: String(t.id), details: { name } }, transaction);
    return t;
  });
  return { token: toView(token), secret };
}

export async function revokeToken(userId: number, id: number): Promise<ApiTokenView> {
  const t = await ApiToken.findOne({ where: { id, userId } });
  if (!t) throw ApiError.notFound("No such token.");
  if (!t.revokedAt) {
    await ApiToken.sequelize!.transaction(async (transaction) => {
      t.revokedAt = new Date();
      await t.save({ transaction });
      await audit({ actorId: userId, action: "api_token.revoke", entityType: "api_token", entityId: String(t.id), details: { name: t.name } }, transaction);
    });
  }
  return toView(t);
}
