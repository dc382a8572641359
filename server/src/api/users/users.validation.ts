import { ApiError, type ErrorDetail } from "../../lib/api-error";
import { ROLES, type Role } from "../../models/user.model";
import { asBody } from "../auth/auth.validation";

export interface UserListQuery {
  role?: Role;
  email?: string;
  page: number;
  pageSize: number;
}

function intParam(raw: unknown, name: string, fallback: number, min: number, max: number, d: ErrorDetail[]): number {
  if (raw === undefined || raw === "") return fallback;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < min || n > max) {
    d.push({ path: name, message: `${name} must be a whole number from ${min} to ${max}.` });
    return fallback;
  }
  return n;
}

export function validateUserListQuery(q: Record<string, unknown>): UserListQuery {
  const d: ErrorDetail[] = [];
  const out: UserListQuery = { page: intParam(q.page, "page", 1, 1, 100000, d), pageSize: intParam(q.pageSize, "pageSize", 25, 1, 100, d) };
  if (q.role !== undefined && q.role !== "") {
    if (typeof q.role !== "string" || !ROLES.includes(q.role as Role)) d.push({ path: "role", message: `role must be one of ${ROLES.join(", ")}.` });
    else out.role = q.role as Role;
  }
  if (typeof q.email === "string" && q.email.trim()) out.email = q.email.trim().slice(0, 254);
  if (d.length) throw ApiError.badRequest("Some query parameters are not valid.", d);
  return out;
}

export function validateUserId(raw: unknown): number {
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 1) throw ApiError.notFound("No such user.");
  return n;
}

export function validateRoleChange(raw: unknown): { role: Role } {
  const b = asBody(raw);
  if (typeof b.role !== "string" || !ROLES.includes(b.role as Role)) {
    throw ApiError.unprocessable(`role must be one of ${ROLES.join(", ")}.`, [{ path: "role", message: `Choose one of ${ROLES.join(", ")}.` }]);
  }
  return { role: b.role as Role };
}
