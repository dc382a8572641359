/**
 * The roles, lowest first: each holds every power of the ones before it (admin ⊃ curator ⊃ depositor).
 * The one ranking of the product: the server's requireRole, the client's navigation and page guards.
 */
export const ROLES = ["depositor", "curator", "admin"] as const;
export type Role = (typeof ROLES)[number];

/** Whether `user` holds at least the role `min`. */
export function hasRole(user: { role: Role } | null | undefined, min: Role): boolean {
  return !!user && ROLES.indexOf(user.role) >= ROLES.indexOf(min);
}

/** A personal API token as listed to its owner (GET/POST/DELETE /api/v1/tokens); the secret is never in it. */
export interface ApiTokenView {
  id: number;
  name: string;
  /** The secret's first characters, to tell tokens apart. */
  prefix: string;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

export interface SessionUser {
  id: number;
  email: string;
  displayName: string;
  role: Role;
  emailVerified: boolean;
}

export interface SessionInfo {
  user: SessionUser | null;
  csrfToken: string;
  /** Whether "Sign in with ORCID" is offered. */
  orcidSignIn?: boolean;
}

/** An ORCID iD verified at sign-in that has no account yet (GET /auth/orcid/pending). */
export interface OrcidPending {
  orcid: string;
  givenName: string;
  familyName: string;
}

/** The signed-in person's own profile (GET/PATCH /api/v1/account). */
export interface AccountProfile extends SessionUser {
  affiliation: string | null;
  orcid: string | null;
  /** The iD was linked through ORCID's sign-in (not typed by hand). */
  orcidVerified: boolean;
  createdAt: string;
}

/** One row of the admin's user list (GET /api/v1/users). */
export interface UserSummary {
  id: number;
  email: string;
  displayName: string;
  affiliation: string | null;
  role: Role;
  emailVerified: boolean;
  createdAt: string;
}

/** Error codes of one-time links (verification, password reset), turned into messages by the pages. */
export type OneTimeLinkErrorCode = "link_invalid" | "link_expired" | "link_used";
