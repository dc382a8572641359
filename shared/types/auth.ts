export type Role = "depositor" | "curator" | "admin";

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
