import { sequelize } from "../../db/sequelize";
import { User } from "../../models";
import { ApiError } from "../../lib/api-error";
import { hashPassword, verifyPassword } from "../../lib/passwords";
import { audit } from "../../lib/audit";
import { endSessions } from "../auth/auth.service";
import type { AccountProfile } from "@shared/types/auth";

export function toProfile(u: User): AccountProfile {
  return {
    id: u.id,
    email: u.email,
    displayName: u.displayName,
    role: u.role,
    emailVerified: u.emailVerifiedAt !== null,
    affiliation: u.affiliation ?? null,
    orcid: u.orcid ?? null,
    orcidVerified: !!u.orcid && u.orcidVerifiedAt !== null,
    createdAt: u.createdAt.toISOString(),
  };
}

async function load(userId: number): Promise<User> {
  const u = await User.findByPk(userId);
  if (!u) throw ApiError.unauthorized();
  return u;
}

export async function getProfile(userId: number): Promise<AccountProfile> {
  return toProfile(await load(userId));
}

export async function updateProfile(userId: number, patch: { displayName?: string; affiliation?: string | null; orcid?: string | null }): Promise<AccountProfile> {
  const u = await load(userId);
  if (patch.orcid !== undefined && u.orcidVerifiedAt && (patch.orcid ?? "").toUpperCase() !== (u.orcid ?? "").toUpperCase()) {
    throw ApiError.conflict("Your ORCID iD was verified through ORCID: unlink it first to type another one.", [{ path: "/orcid", message: "Unlink the verified iD first." }]);
  }
  await u.update(patch);
  return toProfile(u);
}

/** Checks the current password, sets the new one and ends the account's other sessions. */
export async function changePassword(userId: number, currentPassword: string, newPassword: string, keepSid: string | undefined): Promise<void> {
  const u = await load(userId);
  if (!(await verifyPassword(currentPassword, u.passwordHash))) {
    throw ApiError.unprocessable("Your current password is not correct.", [{ path: "/currentPassword", message: "This is not your current password." }]);
  }
  const passwordHash = await hashPassword(newPassword);
  await sequelize().transaction(async (t) => {
    await u.update({ passwordHash }, { transaction: t });
    await audit({ actorId: u.id, action: "user.password_changed", entityType: "user", entityId: u.id }, t);
    await endSessions(u.id, keepSid, t);
  });
}

/** Removes the verified ORCID iD from the account (it can be linked again). */
export async function unlinkOrcid(userId: number): Promise<AccountProfile> {
  const u = await load(userId);
  await sequelize().transaction(async (t) => {
    const before = u.orcid;
    await u.update({ orcid: null, orcidVerifiedAt: null }, { transaction: t });
    await audit({ actorId: u.id, action: "user.orcid_unlinked", entityType: "user", entityId: u.id, details: { orcid: before } }, t);
  });
  return toProfile(u);
}
